import { checkPlan } from '../identify';
import type { Design, Plan, PlateFormat, Route } from '../plan/types';
import { quantileSorted } from '../score/quantile';
import { wilson, Z_95 } from '../score/wilson';
import { prepareSimulation } from '../simulate/prepareSimulation';
import type { SimulationOptions } from '../simulate/types';
import { designCost, usableWellsPerPlate, type DesignCost } from './costModel';
import { reagentTTests } from './reagentTTests';
import { selectContexts } from './selectContexts';
import { selectReagents } from './selectReagents';
import type { AssuranceEstimate, CurvePoint, EvalRequest, FrontierPoint, ReplicateOutcome, SizedDesign, SizeOptions, SizeProgress, SizeResult } from './types';

/**
 * The sizing search as a generator: it yields batches of Monte Carlo requests and receives the
 * outcomes, so the same logic runs single-threaded (`sizePlanSync`), on a worker pool
 * (`sizePlan` with an evaluator) or inside a Web Worker, and can be cancelled between batches.
 *
 * 1. Route: goal.route, or for `auto` the route the verdict engine recovers most factors with.
 * 2. Candidate sets: targeted → reagents by the per-factor rank condition (selectReagents);
 *    contexts → contexts by the contexts-route verdicts (selectContexts), keeping the plan's
 *    reagents (or those of its fixed design) as sources of wells; observational → the plan's
 *    reagents and contexts (or its fixed design). If the plan fixes a design, its reagents and
 *    contexts are kept and only replicates, controls and cells are sized.
 *    A factor that no choice recovers individually makes the goal unreachable (budgetNeeded null).
 * 3. Configurations = candidate set × controls per plate (plan value first) × cells per well
 *    (only when the plan simulates cells: plan value and ×2), in that order.
 * 4. Per configuration, a monotone search on replicates (2, 4, 8, … up to the cap from stock and
 *    `maxReplicates`, then bisection) for the fewest replicates whose design meets the goal;
 *    after the first configuration only designs cheaper than the best found so far are tried
 *    (assurance is taken to grow with replicates, so a failing design at the most replicates
 *    below that cost rules the configuration out).
 * 5. Each design is judged by sequential Monte Carlo with common random numbers (replicate
 *    indices 0, 1, 2, … for every design): batches of `batch` replicates until the Wilson 95 %
 *    interval of the assurance lies entirely above the goal (meets) or entirely below (fails),
 *    or `maxReps` replicates are done (then: meets iff the point estimate p ≥ goal).
 *    A design "meets the goal" by this rule; `feasible` = the cheapest such design costs ≤ budget.
 * 6. When the budget is short: every configuration at the most replicates the budget buys (at
 *    least 4 batches of replicates each); the recommended design is the one of these with the
 *    highest assurance.
 * 7. Curve (MCC median and 10th percentile, assurance) over replicates for the chosen
 *    configuration; Pareto frontier of cost against assurance over every design evaluated.
 */

export type SearchYield = { requests: EvalRequest[]; progress: SizeProgress };
export type SizeSearch = Generator<SearchYield, SizeResult, ReplicateOutcome[][]>;

export const SIZE_DEFAULTS = {
	seed: 1,
	batch: 25,
	maxReps: 400,
	maxReplicates: 32,
	maxSets: 3,
	exactLimit: 20,
	curve: true,
	power: 0.8,
	alpha: 0.05
} as const;

/** Standard controls per plate tried besides the plan's value (common practice: 8–16 per plate on 384). */
export const STANDARD_CONTROLS: Record<PlateFormat, number[]> = { 96: [4, 8], 384: [8, 16, 24], 1536: [16, 32, 48] };

/** Replicate counts shown on the curve (those within the search range). */
const CURVE_REPLICATES = [2, 3, 4, 6, 8, 12, 16, 24, 32, 48, 64];

export const SIZE_CAUTIONS = [
	'Results hold only under the stated model (noise, effect sizes and their uncertainty, plate effect, mixing); a pilot is the test of these assumptions — re-size with its estimates before ordering.',
	'Assurance is a Monte Carlo estimate; its Wilson 95 % interval is shown, and designs near the goal are judged on at most a few hundred replicates.',
	'The recommended design is the cheapest found by a monotone search over a few candidate reagent sets and control counts; it is not proven optimal over every possible design.',
	'This planner does not replace a statistician’s review, the lab’s biosafety rules or institutional approvals for the reagents and organisms used.'
];

interface Config {
	reagents: string[];
	contexts: string[];
	controlsPerPlate: number;
	cellsPerWell: number | undefined;
	cap: number;
}

interface DesignRecord {
	key: string;
	design: Design;
	cost: DesignCost;
	mccs: number[];
	successes: number;
	/** true = meets the goal, false = fails, null = undecided. */
	decided: boolean | null;
}

function validateOptions(opts: SizeOptions) {
	const intIn = (name: keyof SizeOptions, v: unknown, lo: number, hi: number) => {
		if (v === undefined) return;
		if (typeof v !== 'number' || !Number.isInteger(v) || v < lo || v > hi) throw new RangeError(`size options: ${name} must be an integer in [${lo}, ${hi}], got ${JSON.stringify(v)}`);
	};
	if (opts.seed !== undefined && (typeof opts.seed !== 'number' || !Number.isFinite(opts.seed))) throw new RangeError(`size options: seed must be a finite number, got ${JSON.stringify(opts.seed)}`);
	intIn('batch', opts.batch, 1, 10000);
	intIn('maxReps', opts.maxReps, 1, 1_000_000);
	intIn('maxReplicates', opts.maxReplicates, 2, 10000);
	intIn('maxSets', opts.maxSets, 1, 4);
	intIn('exactLimit', opts.exactLimit, 0, 30);
	if (opts.controls != null) {
		if (!Array.isArray(opts.controls) || opts.controls.length === 0 || opts.controls.some((c) => !Number.isInteger(c) || c < 0))
			throw new RangeError(`size options: controls must be a non-empty list of integers ≥ 0, got ${JSON.stringify(opts.controls)}`);
	}
	for (const k of ['power', 'alpha'] as const) {
		const v = opts[k];
		if (v !== undefined && !(typeof v === 'number' && v > 0 && v < 1)) throw new RangeError(`size options: ${k} must be a number in (0, 1), got ${JSON.stringify(v)}`);
	}
}

export function* sizeSearch(plan: Plan, opts: SizeOptions = {}): SizeSearch {
	validateOptions(opts);
	const seed = opts.seed ?? SIZE_DEFAULTS.seed;
	const batch = opts.batch ?? SIZE_DEFAULTS.batch;
	const maxReps = Math.max(opts.maxReps ?? SIZE_DEFAULTS.maxReps, 1);
	const maxReplicates = opts.maxReplicates ?? SIZE_DEFAULTS.maxReplicates;
	const goal = { mcc: plan.goal.mcc, assurance: plan.goal.assurance };
	const budget = plan.budget.total;
	const currency = plan.budget.currency;
	const warnings: string[] = [];
	const cautions = [...SIZE_CAUTIONS];
	const fixed = plan.design;
	const planCells = plan.observation.cellsPerWell;

	// 1. Route.
	let route: Route;
	if (plan.goal.route === 'auto') {
		const res = checkPlan(plan, fixed ?? undefined);
		route = res.route === 'auto' ? 'targeted' : res.route;
	} else route = plan.goal.route;

	// 2. Candidate sets of reagents and contexts.
	const controlsList = controlOptions(plan, opts.controls ?? null, fixed?.controlsPerPlate);
	const planControls = controlsList[0];
	const usablePlan = usableWellsPerPlate(plan.budget.plateFormat, plan.budget.excludeEdgeWells, planControls);
	const plateCostPerWell = usablePlan > 0 ? plan.budget.plateCost / usablePlan : 0;
	let sets: { reagents: string[]; contexts: string[] }[] = [];
	let unreachable: SizeResult['unreachable'] = [];
	const progress = (phase: SizeProgress['phase'], message: string): SizeProgress => ({ phase, evaluations, designs: records.size, message });
	let evaluations = 0;
	const records = new Map<string, DesignRecord>();

	if (fixed) {
		warnings.push('The plan fixes a design: its reagents and contexts are kept; replicates, controls per plate and cells per well are sized.');
		const res = checkPlan(plan, fixed);
		const rv = res.routes.find((r) => r.route === route);
		unreachable = (rv ? rv.factors : res.factors).filter((f) => f.verdict !== 'individual').map((f) => ({ id: f.id, block: f.block, reason: f.reason }));
		sets = [{ reagents: fixed.reagents, contexts: fixed.contexts }];
	} else if (route === 'targeted') {
		const sel = selectReagents(plan, { wellsPerReagent: 2, plateCostPerWell, exactLimit: opts.exactLimit ?? SIZE_DEFAULTS.exactLimit, maxSets: opts.maxSets ?? SIZE_DEFAULTS.maxSets });
		warnings.push(...sel.warnings);
		const unknown = plan.reagents.filter((r) => r.targets === null && (r.maxWells === undefined || r.maxWells >= 2));
		if (sel.allIndividual) sets = sel.sets.map((s) => ({ reagents: s.reagents, contexts: [] }));
		else if (unknown.length > 0) {
			// Sparsity-seeking unmixing may still separate the factors: let the Monte Carlo decide.
			warnings.push(
				`Reagents with known targets cannot recover ${sel.unreachable.map((u) => u.id).join(', ')} individually; reagents with unknown targets are added and the Monte Carlo (sparsity-seeking unmixing) decides — the rank condition cannot be checked for them.`
			);
			const known = sel.sets[0]?.reagents ?? [];
			const rank = (r: (typeof unknown)[number]) => (r.efficacy * (typeof r.effect === 'number' ? Math.abs(r.effect) : 1)) / (r.costPerWell + plateCostPerWell);
			const ordered = [...unknown].sort((a, b) => rank(b) - rank(a));
			const inPlanOrder = (ids: Set<string>) => plan.reagents.filter((r) => ids.has(r.id)).map((r) => r.id);
			const d = plan.factors.length;
			const sizes = [...new Set([Math.min(ordered.length, 2 * d), ordered.length])];
			sets = sizes.map((k) => ({ reagents: inPlanOrder(new Set([...known, ...ordered.slice(0, k).map((r) => r.id)])), contexts: [] }));
		} else {
			unreachable = sel.unreachable;
			sets = sel.sets.slice(0, 1).map((s) => ({ reagents: s.reagents, contexts: [] }));
		}
		if (plan.contexts.length > 0) warnings.push('Contexts are not used on the targeted route (one baseline environment keeps the design cheapest).');
	} else if (route === 'contexts') {
		const reagents = plan.reagents.map((r) => r.id);
		const sel = selectContexts(plan, { reagents, replicates: 2, controlsPerPlate: planControls });
		unreachable = sel.unreachable;
		sets = (sel.allIndividual ? sel.sets : sel.sets.slice(-1)).map((contexts) => ({ reagents, contexts }));
		if (reagents.length) warnings.push('On the contexts route every plan reagent is kept as a source of wells; contexts, replicates, controls and cells are sized.');
	} else {
		const res = checkPlan(plan);
		const rv = res.routes.find((r) => r.route === 'observational');
		unreachable = (rv ? rv.factors : res.factors).filter((f) => f.verdict !== 'individual').map((f) => ({ id: f.id, block: f.block, reason: f.reason }));
		sets = [{ reagents: plan.reagents.map((r) => r.id), contexts: plan.contexts.map((c) => c.id) }];
	}
	const reachable = unreachable.length === 0 && sets.length > 0;

	// 3. Configurations.
	const cellsList = planCells > 0 ? [fixed?.cellsPerWell ?? planCells, 2 * (fixed?.cellsPerWell ?? planCells)] : [fixed?.cellsPerWell ?? 0];
	if (planCells > 0) cautions.push('Cells per well carry no cost in the cost model; the plan value and twice it are tried, and imaging more cells may cost time the model does not see.');
	const configs: Config[] = [];
	const reagentById = new Map(plan.reagents.map((r) => [r.id, r]));
	for (const s of sets)
		for (const controls of controlsList)
			for (const cells of cellsList) {
				const nContexts = Math.max(1, s.contexts.length);
				let cap = maxReplicates;
				for (const id of s.reagents) {
					const m = reagentById.get(id)?.maxWells;
					if (m !== undefined) cap = Math.min(cap, Math.floor(m / nContexts));
				}
				if (cap < 2) continue;
				const probe = designCost(plan, designOf({ ...s, controlsPerPlate: controls, cellsPerWell: cells === planCells ? undefined : cells, cap }, 2));
				if (probe.problem) continue;
				configs.push({ reagents: s.reagents, contexts: s.contexts, controlsPerPlate: controls, cellsPerWell: cells === planCells ? undefined : cells, cap });
			}
	if (sets.length > 0 && configs.length === 0) warnings.push('No candidate design fits: stock limits allow fewer than 2 replicates, or controls and excluded edge wells fill the plates.');

	const simOptions: SimulationOptions = { blocks: null, ...(opts.simulation ?? {}), seed, estimator: opts.estimator ?? 'auto', route };

	function record(design: Design): DesignRecord {
		const key = JSON.stringify([design.reagents, design.replicates, design.controlsPerPlate, design.contexts, design.cellsPerWell ?? null]);
		let rec = records.get(key);
		if (!rec) {
			rec = { key, design, cost: designCost(plan, design), mccs: [], successes: 0, decided: null };
			records.set(key, rec);
		}
		return rec;
	}

	/** Runs the sequential Monte Carlo of every listed design until each is decided (in shared batches). */
	function* decideAll(designs: Design[], phase: SizeProgress['phase'], message: string, minReps = 0): Generator<SearchYield, DesignRecord[], ReplicateOutcome[][]> {
		const recs = designs.map(record);
		for (;;) {
			const open = [...new Set(recs.filter((r) => r.decided === null || r.mccs.length < minReps))];
			if (open.length === 0) return recs;
			const requests = open.map((r) => {
				const from = r.mccs.length;
				const to = Math.min(maxReps, from + batch);
				return { design: r.design, reps: range(from, to), options: simOptions };
			});
			const outcomes: ReplicateOutcome[][] = yield { requests, progress: progress(phase, message) };
			if (!Array.isArray(outcomes) || outcomes.length !== requests.length) throw new Error(`size: the evaluator returned ${Array.isArray(outcomes) ? outcomes.length : 'no'} result lists for ${requests.length} requests`);
			open.forEach((r, i) => {
				const got = outcomes[i];
				const want = requests[i].reps;
				if (!Array.isArray(got) || got.length !== want.length) throw new Error(`size: the evaluator returned ${Array.isArray(got) ? got.length : 'no'} outcomes for ${want.length} replicates`);
				for (let k = 0; k < want.length; k++) {
					if (got[k].rep !== want[k]) throw new Error(`size: outcome ${k} is replicate ${got[k].rep}, expected ${want[k]}`);
					const m = got[k].mcc;
					r.mccs.push(Number.isFinite(m) ? m : 0);
					if (Number.isFinite(m) && m >= goal.mcc) r.successes++;
				}
				evaluations += want.length;
				const n = r.mccs.length;
				if (r.decided !== null) return;
				const w = wilson(r.successes, n, Z_95);
				if (w.lo > goal.assurance) r.decided = true;
				else if (w.hi < goal.assurance) r.decided = false;
				else if (n >= maxReps) r.decided = w.p >= goal.assurance;
			});
		}
	}

	function* decide(config: Config, replicates: number): Generator<SearchYield, DesignRecord, ReplicateOutcome[][]> {
		const [rec] = yield* decideAll([designOf(config, replicates)], 'search', `${config.reagents.length} reagents, ${replicates} replicates, ${config.controlsPerPlate} controls per plate`);
		return rec;
	}

	/**
	 * Fewest replicates in [2, cap] whose design meets the goal and costs less than `bound`:
	 * doubling, then bisection. A doubling step that would cost `bound` or more is replaced by
	 * the most replicates still below it; if that design fails, the configuration cannot beat
	 * the best found so far and the search stops.
	 */
	function* minimalReplicates(config: Config, bound: number): Generator<SearchYield, DesignRecord | null, ReplicateOutcome[][]> {
		const below = (r: number) => designCost(plan, designOf(config, r)).total < bound;
		let lastFail = 1;
		let pass: DesignRecord | null = null;
		for (let r = 2; ; r = Math.min(2 * r, config.cap)) {
			if (!below(r)) {
				let rb = r - 1;
				while (rb > lastFail && !below(rb)) rb--;
				if (rb <= lastFail) return null;
				const rec = yield* decide(config, rb);
				if (!rec.decided) return null;
				pass = rec;
				break;
			}
			const rec = yield* decide(config, r);
			if (rec.decided) {
				pass = rec;
				break;
			}
			lastFail = r;
			if (r >= config.cap) break;
		}
		if (!pass) return null;
		let hi = pass.design.replicates;
		while (hi - lastFail > 1) {
			const mid = Math.floor((lastFail + hi) / 2);
			const rec = yield* decide(config, mid);
			if (rec.decided) {
				pass = rec;
				hi = mid;
			} else lastFail = mid;
		}
		return pass;
	}

	// 4. Search for the cheapest design meeting the goal.
	let best: DesignRecord | null = null;
	let bestConfig: Config | null = null;
	if (reachable) {
		for (const config of configs) {
			const found: DesignRecord | null = yield* minimalReplicates(config, best ? best.cost.total : Infinity);
			if (found && (!best || found.cost.total < best.cost.total)) {
				best = found;
				bestConfig = config;
			}
		}
	}

	// 5./6. Budget.
	let recommended: DesignRecord | null = null;
	let recommendedConfig: Config | null = null;
	let feasible = false;
	if (best && best.cost.total <= budget) {
		feasible = true;
		recommended = best;
		recommendedConfig = bestConfig;
	} else if (configs.length > 0) {
		const probes: { config: Config; design: Design }[] = [];
		for (const config of configs) {
			const r = maxAffordable(plan, config, budget);
			if (r !== null) probes.push({ config, design: designOf(config, r) });
		}
		// Probes are compared with each other, so each gets at least 4 batches of replicates.
		const probeRecs = probes.length ? yield* decideAll(probes.map((p) => p.design), 'budget', 'the most replicates the budget buys', Math.min(maxReps, 4 * batch)) : [];
		const within = [...records.values()].filter((r) => r.cost.total <= budget && r.cost.overStock.length === 0);
		const meeting = reachable ? within.filter((r) => r.decided === true).sort((a, b) => a.cost.total - b.cost.total) : [];
		if (meeting.length) {
			// A design within budget met the goal outside the monotone path (Monte Carlo noise).
			feasible = true;
			recommended = meeting[0];
		} else if (probeRecs.length) {
			// Assurance is taken to grow with replicates: per configuration the most replicates the
			// budget buys; across configurations the highest assurance (ties: the cheaper).
			recommended = [...probeRecs].sort((a, b) => assuranceOf(b).p - assuranceOf(a).p || a.cost.total - b.cost.total)[0];
		}
		if (recommended) recommendedConfig = configs.find((c) => sameConfig(c, recommended!.design)) ?? null;
	}

	// 7. Curve for the chosen configuration.
	const curveConfig = recommendedConfig ?? bestConfig ?? configs[0] ?? null;
	if (curveConfig && (opts.curve ?? SIZE_DEFAULTS.curve)) {
		const top = Math.min(curveConfig.cap, Math.max(8, 2 * (recommended?.design.replicates ?? best?.design.replicates ?? 4)));
		const points = CURVE_REPLICATES.filter((r) => r <= top);
		yield* decideAll(points.map((r) => designOf(curveConfig, r)), 'curve', 'MCC against replicates');
	}
	const curve: CurvePoint[] = curveConfig
		? [...records.values()]
				.filter((r) => sameConfig(curveConfig, r.design))
				.sort((a, b) => a.design.replicates - b.design.replicates)
				.map((r) => {
					const sorted = Float64Array.from(r.mccs).sort();
					const a = assuranceOf(r);
					return { replicates: r.design.replicates, median: quantileSorted(sorted, 0.5), p10: quantileSorted(sorted, 0.1), assurance: a.p, lo: a.lo, hi: a.hi, cost: r.cost.total, reps: r.mccs.length };
				})
		: [];

	// Frontier: Pareto-optimal (cost ascending, assurance strictly increasing).
	const frontier: FrontierPoint[] = [];
	let top = -Infinity;
	for (const r of [...records.values()].filter((x) => x.cost.overStock.length === 0).sort((a, b) => a.cost.total - b.cost.total || assuranceOf(b).p - assuranceOf(a).p)) {
		const a = assuranceOf(r);
		if (a.p > top) {
			frontier.push({ cost: r.cost.total, assurance: a.p, lo: a.lo, hi: a.hi, design: sized(r) });
			top = a.p;
		}
	}

	// The simulation's own warnings about the design judged (e.g. a route that needs cells).
	const judged = recommended?.design ?? best?.design ?? (configs[0] ? designOf(configs[0], 2) : null);
	if (judged) for (const w of prepareSimulation(plan, judged, simOptions).warnings) if (!warnings.includes(w)) warnings.push(`Simulation: ${w}`);

	const tTest = reagentTTests(plan, recommended?.design, { power: opts.power ?? SIZE_DEFAULTS.power, alpha: opts.alpha ?? SIZE_DEFAULTS.alpha });
	const money = (x: number) => `${formatAmount(x)} ${currency}`;
	const goalText = `MCC ≥ ${goal.mcc} with assurance ≥ ${goal.assurance}`;
	let reason: string;
	let budgetNeeded: number | null = null;
	if (!reachable) {
		reason =
			sets.length === 0 || unreachable.length === 0
				? `No usable reagents or contexts for the ${route} route, so no design can reach ${goalText}.`
				: `No choice of reagents and contexts recovers ${unreachable.map((u) => u.id).join(', ')} individually on the ${route} route (${unreachable[0].reason}), so no number of replicates reaches ${goalText}; add reagents or contexts that separate ${unreachable.length > 1 ? 'these factors' : 'this factor'}.`;
	} else if (feasible && recommended) {
		reason = `The cheapest design found reaching ${goalText} costs ${money(recommended.cost.total)}, within the budget of ${money(budget)}.`;
	} else if (best) {
		budgetNeeded = best.cost.total;
		reason = `The cheapest design found reaching ${goalText} costs ${money(best.cost.total)}, above the budget of ${money(budget)}; ${recommended ? `the best the budget buys reaches assurance ${assuranceOf(recommended).p.toFixed(2)}` : 'no candidate design fits the budget'}.`;
	} else {
		reason = `No candidate design with up to ${maxReplicates} replicates per reagent (and stock permitting) reached ${goalText}; ${recommended ? `the best the budget buys reaches assurance ${assuranceOf(recommended).p.toFixed(2)}` : 'no candidate design fits the budget'}. Stronger or more reagents, less noise or a lower goal are needed.`;
	}

	return {
		feasible,
		reason,
		route,
		design: recommended ? sized(recommended) : null,
		cost: recommended ? recommended.cost : null,
		assurance: recommended ? assuranceOf(recommended) : null,
		cheapest: best ? sized(best) : null,
		budgetNeeded,
		unreachable,
		frontier,
		curve,
		tTest,
		goal,
		seed,
		evaluations,
		designsEvaluated: records.size,
		warnings,
		cautions
	};
}

function designOf(config: Config, replicates: number): Design {
	const design: Design = { reagents: config.reagents, replicates, controlsPerPlate: config.controlsPerPlate, contexts: config.contexts };
	if (config.cellsPerWell !== undefined) design.cellsPerWell = config.cellsPerWell;
	return design;
}

function sameConfig(config: Config, design: Design): boolean {
	return (
		sameList(config.reagents, design.reagents) &&
		sameList(config.contexts, design.contexts) &&
		config.controlsPerPlate === design.controlsPerPlate &&
		config.cellsPerWell === design.cellsPerWell
	);
}

function sameList(a: string[], b: string[]): boolean {
	return a.length === b.length && a.every((x, i) => x === b[i]);
}

function assuranceOf(r: DesignRecord): AssuranceEstimate {
	const w = wilson(r.successes, r.mccs.length, Z_95);
	return { p: w.p, lo: w.lo, hi: w.hi, reps: r.mccs.length };
}

function sized(r: DesignRecord): SizedDesign {
	const out: SizedDesign = {
		reagents: [...r.design.reagents],
		replicates: r.design.replicates,
		controlsPerPlate: r.design.controlsPerPlate,
		contexts: [...r.design.contexts],
		plates: r.cost.plates,
		wells: r.cost.wells,
		cost: r.cost.total
	};
	if (r.design.cellsPerWell !== undefined) out.cellsPerWell = r.design.cellsPerWell;
	return out;
}

/** Most replicates in [2, cap] whose cost fits `budget`, or null. */
function maxAffordable(plan: Plan, config: Config, budget: number): number | null {
	if (designCost(plan, designOf(config, 2)).total > budget) return null;
	let lo = 2;
	let hi = config.cap;
	if (designCost(plan, designOf(config, hi)).total <= budget) return hi;
	while (hi - lo > 1) {
		const mid = Math.floor((lo + hi) / 2);
		if (designCost(plan, designOf(config, mid)).total <= budget) lo = mid;
		else hi = mid;
	}
	return lo;
}

/** The plan's controls per plate (or the fixed design's) first, then the standard values for the format. */
export function controlOptions(plan: Plan, explicit: number[] | null, fixedControls?: number): number[] {
	if (explicit) return [...new Set(explicit)];
	const first = fixedControls ?? plan.budget.controlsPerPlate;
	const list = [first, ...STANDARD_CONTROLS[plan.budget.plateFormat]].filter((c) => c > 0 || c === first);
	return [...new Set(list)];
}

function range(from: number, to: number): number[] {
	const out: number[] = [];
	for (let i = from; i < to; i++) out.push(i);
	return out;
}

function formatAmount(x: number): string {
	return (Math.round(x * 100) / 100).toLocaleString('en-US', { maximumFractionDigits: 2 });
}
