import { targetedRankVerdicts } from '../identify/targetedRankVerdicts';
import type { Plan, Reagent } from '../plan/types';
import { effectOn } from '../plan/planHelpers';

/**
 * Reagent choice for the targeted route: the minimum-cost subset of the catalogue that meets
 * the per-factor rank condition of support-pattern unmixing (DESIGN.md "Identifiability
 * checks"), then the same set augmented with the reagents of largest effect per cost.
 *
 * Condition: for every factor j, the structural rank of M_j (the effects of the chosen reagents
 * that do not target j) equals the rank the whole usable catalogue reaches — d − 1 when the
 * catalogue can recover every factor individually. When the stated effects of the whole
 * catalogue are also exactly of full rank, the exact rank is required too, so that no chosen
 * set is degenerate for the stated values (e.g. two reagents with identical effect vectors).
 * With nonlinear mixing (λ > 0) the condition is one single-target `clamp` per factor instead
 * (hard interventions; see the verdict engine), and the augmented set adds a second one.
 *
 * Weight of a reagent = cost per well + the plate cost per usable well (each replicate well also
 * occupies plate space); the weight of a set is the sum, i.e. its cost per replicate and context
 * up to plate rounding. Exact branch-and-bound search when at most `exactLimit` candidates
 * (default 20), otherwise greedy (largest rank gain per weight) followed by a repair pass that
 * drops redundant reagents, most expensive first.
 */

export interface ReagentSelectionOptions {
	/** Replicates × contexts each reagent must be able to fill from its stock (maxWells). Default 2. */
	wellsPerReagent?: number;
	/** Extra cost per well for the plate space it occupies. Default 0. */
	plateCostPerWell?: number;
	/** Exact search up to this many candidates (default 20). */
	exactLimit?: number;
	/** Number of candidate sets to return, 1–4 (default 3): the minimum-cost set and augmentations. */
	maxSets?: number;
	/** Node limit of the exact search before it falls back to the greedy answer (default 50 000). */
	maxNodes?: number;
}

export interface ReagentSet {
	/** Reagent ids in catalogue order. */
	reagents: string[];
	/** Σ weights: cost of one replicate well of every reagent, plate space included. */
	weight: number;
	/** `minimum` (the cheapest set meeting the condition) or `augmented`. */
	kind: 'minimum' | 'augmented';
}

export interface UnreachableFactor {
	id: string;
	/** Factor ids it stays mixed with (plan order; itself included), empty when nothing recovers it. */
	block: string[];
	reason: string;
}

export interface ReagentSelection {
	/** True when the usable catalogue recovers every factor individually. */
	allIndividual: boolean;
	/** Candidate sets, cheapest first; empty when no reagent is usable at all. */
	sets: ReagentSet[];
	/** Factors no set recovers individually, with the reason. */
	unreachable: UnreachableFactor[];
	/** How the minimum set was found. */
	method: 'exact' | 'greedy' | 'clamps';
	/** Condition evaluations spent. */
	evaluations: number;
	warnings: string[];
}

export function selectReagents(plan: Plan, opts: ReagentSelectionOptions = {}): ReagentSelection {
	const wellsPerReagent = opts.wellsPerReagent ?? 2;
	const plateCostPerWell = opts.plateCostPerWell ?? 0;
	const exactLimit = opts.exactLimit ?? 20;
	const maxSets = opts.maxSets ?? 3;
	const maxNodes = opts.maxNodes ?? 50_000;
	if (!(wellsPerReagent >= 1)) throw new RangeError(`selectReagents: wellsPerReagent must be ≥ 1, got ${wellsPerReagent}`);
	if (!(plateCostPerWell >= 0)) throw new RangeError(`selectReagents: plateCostPerWell must be ≥ 0, got ${plateCostPerWell}`);
	if (!Number.isInteger(maxSets) || maxSets < 1 || maxSets > 4) throw new RangeError(`selectReagents: maxSets must be an integer in [1, 4], got ${maxSets}`);

	const warnings: string[] = [];
	const d = plan.factors.length;
	const factorIndex = new Map(plan.factors.map((f, i) => [f.id, i]));
	const stockOk = (r: Reagent) => r.maxWells === undefined || r.maxWells >= wellsPerReagent;
	const lowStock = plan.reagents.filter((r) => r.targets && !stockOk(r));
	if (lowStock.length)
		warnings.push(`Left out for lack of stock (fewer than ${wellsPerReagent} wells): ${lowStock.map((r) => `${r.id} (${r.maxWells})`).join(', ')}.`);
	const unknown = plan.reagents.filter((r) => !r.targets);
	if (unknown.length) warnings.push(`Reagents with unknown targets are not used on the targeted route with known targets: ${unknown.map((r) => r.id).join(', ')}.`);
	const weightOf = (r: Reagent) => r.costPerWell + plateCostPerWell;
	// Candidates: known targets and enough stock, cheapest first; ties → larger effect per cost.
	const candidates = plan.reagents
		.map((r, catalogueIndex) => ({ r, catalogueIndex, weight: weightOf(r), strength: strength(r) }))
		.filter(({ r }) => r.targets !== null && stockOk(r))
		.sort((a, b) => a.weight - b.weight || b.strength - a.strength || a.catalogueIndex - b.catalogueIndex);
	const toSet = (members: number[], kind: ReagentSet['kind']): ReagentSet => {
		const sorted = [...members].sort((a, b) => candidates[a].catalogueIndex - candidates[b].catalogueIndex);
		return { reagents: sorted.map((k) => candidates[k].r.id), weight: sum(sorted.map((k) => candidates[k].weight)), kind };
	};
	if (candidates.length === 0) {
		return {
			allIndividual: false,
			sets: [],
			unreachable: plan.factors.map((f) => ({ id: f.id, block: [], reason: 'no usable reagent with known targets (stock and targets considered)' })),
			method: 'greedy',
			evaluations: 0,
			warnings
		};
	}

	const nonlinear = plan.observation.mixing === 'nonlinear' && plan.observation.nonlinearity > 0;
	if (nonlinear) return selectClamps(plan, candidates, maxSets, warnings, toSet);

	// Columns of D for each candidate.
	const columns = candidates.map(({ r }) => {
		const rows = r.targets!.map((t) => factorIndex.get(t)!);
		return { rows, values: r.targets!.map((t) => effectOn(r, t)) };
	});
	let evaluations = 0;
	const verdicts = (members: Iterable<number>) => {
		evaluations++;
		return targetedRankVerdicts(d, [...members].map((k) => columns[k]));
	};
	const all = candidates.map((_, k) => k);
	const full = verdicts(all);
	const useExact = full.exactRank.every((r, j) => r === full.structuralRank[j]);
	if (!useExact) warnings.push('The stated effects of the catalogue are exactly degenerate for some factor; reagents were chosen on the generic (structural) rank only.');
	const meets = (members: Iterable<number>) => {
		const v = verdicts(members);
		for (let j = 0; j < d; j++) {
			if (v.structuralRank[j] < full.structuralRank[j]) return false;
			if (useExact && v.exactRank[j] < full.exactRank[j]) return false;
		}
		return true;
	};
	const allIndividual = full.individual.every(Boolean);
	const unreachable: UnreachableFactor[] = [];
	full.individual.forEach((ok, j) => {
		if (ok) return;
		const block = full.block[j].map((i) => plan.factors[i].id);
		unreachable.push({
			id: plan.factors[j].id,
			block,
			reason:
				block.length > 1
					? `even with every usable reagent, the reagents that do not target ${plan.factors[j].id} leave it mixed with ${block.filter((b) => b !== plan.factors[j].id).join(', ')} (their effects do not span the other factors)`
					: `the reagents that do not target ${plan.factors[j].id} do not span the other factors`
		});
	});

	// Minimum-weight set meeting the condition.
	let method: ReagentSelection['method'] = 'greedy';
	let best = greedy(all, candidates, verdicts, meets);
	if (candidates.length <= exactLimit) {
		const targetsOf = candidates.map((_, k) => new Set(columns[k].rows));
		const exact = branchAndBound(candidates, targetsOf, full.structuralRank, meets, sum(best.map((k) => candidates[k].weight)), maxNodes);
		if (exact.completed) {
			method = 'exact';
			if (exact.best) best = exact.best;
		} else warnings.push(`The exact reagent search stopped after ${maxNodes} steps; the greedy choice is used.`);
	}
	const sets: ReagentSet[] = [toSet(best, 'minimum')];

	// Augmented sets: add unused candidates by effect per weight, in steps of about d/3.
	const extra = candidates
		.map((c, k) => ({ k, score: c.weight > 0 ? c.strength / c.weight : Infinity }))
		.filter(({ k }) => !best.includes(k))
		.sort((a, b) => b.score - a.score || candidates[a.k].catalogueIndex - candidates[b.k].catalogueIndex)
		.map(({ k }) => k);
	const step = Math.max(1, Math.ceil(d / 3));
	for (let s = 1; sets.length < maxSets && (s - 1) * step < extra.length; s++) {
		const add = extra.slice(0, Math.min(extra.length, s * step));
		sets.push(toSet([...best, ...add], 'augmented'));
	}
	return { allIndividual, sets, unreachable, method, evaluations, warnings };
}

type Candidate = { r: Reagent; catalogueIndex: number; weight: number; strength: number };

/** Expected shift on the weakest target: efficacy × min |effect| (for `scale`: the spread change). */
function strength(r: Reagent): number {
	const values = typeof r.effect === 'number' ? [Math.abs(r.effect)] : Object.values(r.effect).map(Math.abs);
	return r.efficacy * (values.length ? Math.min(...values) : 0);
}

function sum(xs: number[]): number {
	let s = 0;
	for (const x of xs) s += x;
	return s;
}

/**
 * Greedy: add the candidate with the largest gain in Σ_j structural rank(M_j) per weight until
 * the condition holds, then drop redundant members, most expensive first.
 */
function greedy(
	all: number[],
	candidates: Candidate[],
	verdicts: (m: Iterable<number>) => { structuralRank: number[] },
	meets: (m: Iterable<number>) => boolean
): number[] {
	const chosen: number[] = [];
	const total = (m: number[]) => sum(verdicts(m).structuralRank);
	let current = 0;
	while (!meets(chosen)) {
		let pick = -1;
		let pickScore = -Infinity;
		let pickGain = 0;
		for (const k of all) {
			if (chosen.includes(k)) continue;
			const gain = total([...chosen, k]) - current;
			if (gain <= 0) continue;
			const w = candidates[k].weight;
			const score = w > 0 ? gain / w : Infinity;
			if (score > pickScore || (score === pickScore && candidates[k].strength > candidates[pick].strength)) {
				pick = k;
				pickScore = score;
				pickGain = gain;
			}
		}
		if (pick < 0) {
			// Structural ranks are complete but the exact condition is not: add the cheapest
			// remaining candidate that changes the exact ranks (all candidates as a last resort).
			const rest = all.filter((k) => !chosen.includes(k));
			if (rest.length === 0) break;
			chosen.push(rest[0]);
			continue;
		}
		chosen.push(pick);
		current += pickGain;
	}
	// Repair: drop members whose removal keeps the condition, most expensive first.
	const order = [...chosen].sort((a, b) => candidates[b].weight - candidates[a].weight);
	let kept = [...chosen];
	for (const k of order) {
		const without = kept.filter((x) => x !== k);
		if (meets(without)) kept = without;
	}
	return kept;
}

/**
 * Exact minimum-weight subset by depth-first branch and bound over candidates sorted by weight:
 * include before exclude; prune when the weight plus a lower bound on the rest reaches the best
 * so far, or when even every remaining candidate cannot meet the condition (the condition is
 * monotone: adding reagents never lowers a rank).
 * Lower bound: rank(M_j) ≤ number of chosen reagents not targeting j, so at least
 * need = max_j (rank_j − #chosen not targeting j) more reagents are required, costing at least
 * the `need` cheapest remaining weights.
 */
function branchAndBound(
	candidates: Candidate[],
	targetsOf: Set<number>[],
	rankGoal: number[],
	meets: (m: Iterable<number>) => boolean,
	upper: number,
	maxNodes: number
): { best: number[] | null; completed: boolean } {
	const n = candidates.length;
	const d = rankGoal.length;
	// notTargeting[j] = chosen reagents not targeting factor j.
	const notTargeting = new Array<number>(d).fill(0);
	const boundAt = (i: number) => {
		let need = 0;
		for (let j = 0; j < d; j++) need = Math.max(need, rankGoal[j] - notTargeting[j]);
		if (need > n - i) return Infinity;
		let w = 0;
		for (let k = i; k < i + need; k++) w += candidates[k].weight;
		return w;
	};
	// Sets up to the greedy answer's weight are explored (it is itself a solution).
	let bestWeight = upper + 1e-9;
	let best: number[] | null = null;
	let nodes = 0;
	const chosen: number[] = [];
	let aborted = false;
	const visit = (i: number, weight: number): void => {
		if (aborted) return;
		if (++nodes > maxNodes) {
			aborted = true;
			return;
		}
		if (weight >= bestWeight) return;
		if (weight + boundAt(i) >= bestWeight) return;
		if (meets(chosen)) {
			best = [...chosen];
			bestWeight = weight;
			return;
		}
		if (i >= n) return;
		const rest: number[] = [];
		for (let k = i; k < n; k++) rest.push(k);
		if (!meets([...chosen, ...rest])) return;
		chosen.push(i);
		for (let j = 0; j < d; j++) if (!targetsOf[i].has(j)) notTargeting[j]++;
		visit(i + 1, weight + candidates[i].weight);
		for (let j = 0; j < d; j++) if (!targetsOf[i].has(j)) notTargeting[j]--;
		chosen.pop();
		visit(i + 1, weight);
	};
	visit(0, 0);
	return { best, completed: !aborted };
}

/** Nonlinear mixing: one single-target clamp per factor (cheapest), a second one in the augmented set. */
function selectClamps(
	plan: Plan,
	candidates: Candidate[],
	maxSets: number,
	warnings: string[],
	toSet: (members: number[], kind: ReagentSet['kind']) => ReagentSet
): ReagentSelection {
	const first: number[] = [];
	const second: number[] = [];
	const unreachable: UnreachableFactor[] = [];
	for (const f of plan.factors) {
		const clamps = candidates
			.map((c, k) => ({ c, k }))
			.filter(({ c }) => c.r.kind === 'clamp' && c.r.targets!.length === 1 && c.r.targets![0] === f.id);
		if (clamps.length === 0) {
			unreachable.push({ id: f.id, block: [], reason: `no usable single-target clamp reagent on ${f.id}; with nonlinear mixing each factor needs a hard intervention of its own` });
			continue;
		}
		first.push(clamps[0].k);
		if (clamps.length > 1) second.push(clamps[1].k);
	}
	warnings.push('Nonlinear mixing: reagents were chosen as one single-target clamp per factor (hard interventions).');
	const sets: ReagentSet[] = first.length ? [toSet(first, 'minimum')] : [];
	if (second.length && maxSets > 1) sets.push(toSet([...first, ...second], 'augmented'));
	return { allIndividual: unreachable.length === 0, sets, unreachable, method: 'clamps', evaluations: 0, warnings };
}
