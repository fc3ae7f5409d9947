import type { Design, Plan, Route } from '../plan/types';
import { checkPlan } from '../identify/checkPlan';
import { designCost } from '../size/costModel';
import { ESTIMATORS, type EstimatorName, type LinearStep, type PreparedSimulation, type SimulationOptions } from './types';

const ROUTE_NAMES: readonly string[] = ['targeted', 'contexts', 'observational'];
export const DEFAULT_SCORE_DRAWS = 2000;
export const DEFAULT_MAX_CELLS = 4000;

/**
 * Resolves route, estimator, index maps and the simulation's well placement for `design`
 * (see PreparedSimulation for the placement rule). Throws on caller mistakes: unknown
 * estimator or route, a design naming reagents or contexts the plan does not have.
 */
export function prepareSimulation(plan: Plan, design: Design, opts: SimulationOptions): PreparedSimulation {
	if (!Number.isFinite(opts.seed)) throw new RangeError(`seed must be a finite number, got ${opts.seed}`);
	const warnings: string[] = [];
	const factorIds = plan.factors.map((f) => f.id);
	const d = factorIds.length;
	if (d === 0) throw new RangeError('plan.factors must name at least one factor');
	const reagentCatalogue = design.reagents.map((id, k) => {
		const i = plan.reagents.findIndex((r) => r.id === id);
		if (i < 0) throw new RangeError(`design.reagents[${k}]: unknown reagent "${id}"`);
		return i;
	});
	const contextCatalogue = design.contexts.map((id, c) => {
		const i = plan.contexts.findIndex((x) => x.id === id);
		if (i < 0) throw new RangeError(`design.contexts[${c}]: unknown context "${id}"`);
		return i;
	});
	if (!Number.isInteger(design.replicates) || design.replicates < 1) throw new RangeError(`design.replicates must be an integer ≥ 1, got ${design.replicates}`);
	const knownTargets = reagentCatalogue.map((i) => {
		const t = plan.reagents[i].targets;
		return t ? t.map((id) => factorIds.indexOf(id)).filter((j) => j >= 0) : null;
	});

	// Route.
	const requestedRoute = opts.route ?? plan.goal.route;
	if (requestedRoute !== 'auto' && !ROUTE_NAMES.includes(requestedRoute)) throw new RangeError(`route must be one of auto, ${ROUTE_NAMES.join(', ')}; got ${JSON.stringify(requestedRoute)}`);
	const route: Route = requestedRoute === 'auto' ? (design.reagents.length > 0 ? 'targeted' : design.contexts.length >= 2 ? 'contexts' : 'observational') : requestedRoute;

	// Estimator.
	const lambda = plan.observation.mixing === 'nonlinear' ? plan.observation.nonlinearity : 0;
	const linear = lambda === 0;
	const coversAll = factorIds.every((_, j) => knownTargets.some((t) => t !== null && t.includes(j)));
	const routeStep: LinearStep = route === 'targeted' ? (coversAll ? 'support' : 'sparse') : route === 'contexts' ? 'jointdiag' : 'fastica';
	const requested = opts.estimator ?? 'auto';
	if (requested !== 'auto' && !ESTIMATORS.includes(requested)) throw new RangeError(`estimator must be one of auto, ${ESTIMATORS.join(', ')}; got ${JSON.stringify(requested)}`);
	const estimator: EstimatorName = requested === 'auto' ? (linear ? routeStep : 'contrastive') : requested;
	const linearStep: LinearStep = estimator === 'contrastive' ? routeStep : estimator;
	if (estimator === 'support' && !coversAll) {
		const missing = factorIds.filter((_, j) => !knownTargets.some((t) => t !== null && t.includes(j)));
		warnings.push(`support-pattern unmixing needs a reagent with known targets on every factor; none targets ${missing.join(', ')}, so those factors are estimated from the remaining directions only`);
	}
	if ((linearStep === 'support' || linearStep === 'sparse') && design.reagents.length === 0) throw new RangeError(`estimator ${linearStep} needs reagents in the design`);
	if (linearStep === 'jointdiag' && Math.max(design.contexts.length, 1) < 2) warnings.push('joint diagonalisation needs at least 2 contexts; with one environment the factors stay mixed');

	const cells = design.cellsPerWell ?? plan.observation.cellsPerWell;
	if ((linearStep === 'fastica' || linearStep === 'jointdiag') && cells === 0)
		warnings.push(
			`the ${route} route learns from the spread of cells within wells, but cellsPerWell is 0 (well means only): between wells only replicate noise and reagent effects vary, so expect poor recovery — set cells per well`
		);
	if (!linear && route === 'observational')
		warnings.push('nonlinear mixing without reagents or contexts is not identifiable in general (Hyvärinen & Pajunen 1999); any score here reflects the mildness of the nonlinearity, not a guarantee');

	// Placement.
	const cost = designCost(plan, design);
	const groups = cost.groups.map((g) => ({ ...g }));
	if (cost.problem) warnings.push(cost.problem);
	for (const g of groups) if (!Number.isFinite(g.plates)) g.plates = 1;
	const plateLevel = new Set(plan.contexts.filter((c) => c.level === 'plate').map((c) => c.id));
	const sharedCtx = design.contexts.map((id, c) => ({ id, c })).filter((x) => !plateLevel.has(x.id)).map((x) => x.c);
	const wellReagent: number[] = [];
	const wellContext: number[] = [];
	const wellReplicate: number[] = [];
	const wellPlate: number[] = [];
	const controlPlate: number[] = [];
	const controlContext: number[] = [];
	const controlIndex: number[] = [];
	let start = 0;
	for (const g of groups) {
		const ctxs = g.context === null ? (design.contexts.length === 0 ? [-1] : sharedCtx) : [design.contexts.indexOf(g.context)];
		const P = g.plates;
		ctxs.forEach((c, ci) => {
			for (let k = 0; k < design.reagents.length; k++)
				for (let i = 0; i < design.replicates; i++) {
					wellReagent.push(k);
					wellContext.push(c);
					wellReplicate.push(i);
					wellPlate.push(start + ((k + i + ci) % P));
				}
		});
		for (let q = 0; q < P; q++)
			for (let t = 0; t < design.controlsPerPlate; t++) {
				controlPlate.push(start + q);
				controlContext.push(ctxs.length ? ctxs[t % ctxs.length] : -1);
				controlIndex.push(t);
			}
		start += P;
	}
	const reagentGroups = design.reagents.map((_, k) => countPairs(wellReagent, wellContext, k));
	const reagentPlates = design.reagents.map((_, k) => {
		const pairs = countPairs(wellReagent, wellPlate, k);
		const total = pairs.reduce((t, v, i) => (i % 2 ? t + v : t), 0);
		return pairs.map((v, i) => (i % 2 ? v / total : v));
	});
	const plateControls = Array.from({ length: start }, (_, q) => countPairs(controlPlate, controlContext, q));
	if (design.controlsPerPlate === 0 && (linearStep === 'support' || linearStep === 'sparse'))
		warnings.push('no controls per plate: reagent effects are measured against the mean of all treatment wells on each plate, which biases them towards each other');
	if (design.replicates < 2) warnings.push('fewer than 2 replicate wells per reagent and context: replicate noise cannot be checked in the experiment');

	// Blocks.
	let blocks: number[][] | null = null;
	let blockIds = opts.blocks;
	if (blockIds === undefined) {
		// The identify module's verdicts for this route and design name the blocks.
		try {
			const verdicts = checkPlan({ ...plan, goal: { ...plan.goal, route } }, design).routes.find((r) => r.route === route);
			const seen = new Set<string>();
			blockIds = [];
			for (const f of verdicts?.factors ?? [])
				if (f.verdict === 'block' && f.block.length > 1 && !seen.has(f.block.join('\u0000'))) {
					seen.add(f.block.join('\u0000'));
					blockIds.push(f.block);
				}
			if (blockIds.length === 0) blockIds = null;
		} catch (err) {
			warnings.push(`identifiability verdicts unavailable, block R² not computed: ${(err as Error).message}`);
			blockIds = null;
		}
	}
	if (blockIds) {
		blocks = blockIds.map((b, bi) =>
			b.map((id, t) => {
				const j = factorIds.indexOf(id);
				if (j < 0) throw new RangeError(`blocks[${bi}][${t}]: unknown factor "${id}"`);
				return j;
			})
		);
	}

	const allGaussian = plan.factors.every((f) => f.shape === 'gaussian');
	const fastPossible = linear && (linearStep === 'support' || linearStep === 'sparse') && estimator !== 'contrastive' && design.controlsPerPlate > 0 && (cells === 0 || allGaussian);
	const fastOpt = opts.fastPath ?? 'auto';
	if (fastOpt === true && !fastPossible) throw new RangeError('fastPath: true needs linear mixing, the support or sparse estimator, controls on every plate and well-level simulation (or Gaussian factors)');
	const scoreDraws = opts.scoreDraws ?? 0;
	if (!Number.isInteger(scoreDraws) || scoreDraws < 0) throw new RangeError(`scoreDraws must be an integer ≥ 0, got ${scoreDraws}`);
	const analyticPossible = linear && estimator !== 'contrastive';
	const maxCells = opts.maxCells ?? DEFAULT_MAX_CELLS;
	if (!Number.isInteger(maxCells) || maxCells < 1) throw new RangeError(`maxCells must be an integer ≥ 1, got ${maxCells}`);

	const prepared: PreparedSimulation = {
		plan,
		design,
		seed: opts.seed,
		estimator,
		linearStep,
		route,
		goalMcc: plan.goal.mcc,
		factorIds,
		reagentCatalogue,
		contextCatalogue,
		knownTargets,
		cellsPerWell: cells,
		plates: start,
		wellReagent,
		wellContext,
		wellReplicate,
		wellPlate,
		controlPlate,
		controlContext,
		controlIndex,
		reagentGroups,
		reagentPlates,
		plateControls,
		blocks,
		linear,
		fastPath: fastOpt === 'auto' ? fastPossible : fastOpt,
		scoreDraws: scoreDraws === 0 && !analyticPossible ? DEFAULT_SCORE_DRAWS : scoreDraws,
		scoreMethod: linear ? 'pearson' : 'spearman',
		maxCells,
		mixingCondition: opts.mixingCondition ?? null,
		warnings
	};
	PREPARED_WITH.set(prepared, { ...opts });
	return prepared;
}

/** The options each preparation was made with (prepareSimilar reuses one only for the same options). */
const PREPARED_WITH = new WeakMap<PreparedSimulation, SimulationOptions>();

/** [value, count, value, count, …] of `values` over the entries whose `keys` equal `key`, in first-seen order. */
function countPairs(keys: number[], values: number[], key: number): number[] {
	const out: number[] = [];
	for (let i = 0; i < keys.length; i++) {
		if (keys[i] !== key) continue;
		let j = 0;
		while (j < out.length && out[j] !== values[i]) j += 2;
		if (j < out.length) out[j + 1]++;
		else out.push(values[i], 1);
	}
	return out;
}

/**
 * The preparation for `plan` and `design` when `previous` was prepared for a plan that differs
 * only in its reagents' targets and effects (as when every Monte Carlo replicate draws its own
 * reagents): the placement, index maps and options of `previous` are kept and only the known
 * targets are resolved again, so the result equals prepareSimulation(plan, design, opts).
 * Anything else that differs — factors, reagent ids, contexts, observation, budget, goal, design,
 * options, blocks left to the identify module (`opts.blocks` undefined), or a factor that no
 * reagent with known targets covers — falls back to prepareSimulation.
 */
export function prepareSimilar(previous: PreparedSimulation | null, plan: Plan, design: Design, opts: SimulationOptions): PreparedSimulation {
	if (previous === null || !reusable(previous, plan, design, opts)) return prepareSimulation(plan, design, opts);
	const factorIds = previous.factorIds;
	const d = factorIds.length;
	const R = previous.reagentCatalogue.length;
	const knownTargets: (number[] | null)[] = new Array(R);
	const covered = new Uint8Array(d);
	for (let k = 0; k < R; k++) {
		const t = plan.reagents[previous.reagentCatalogue[k]].targets;
		if (!t) {
			knownTargets[k] = null;
			continue;
		}
		const idx: number[] = [];
		for (let i = 0; i < t.length; i++) {
			const j = factorIds.indexOf(t[i]);
			if (j >= 0) {
				idx.push(j);
				covered[j] = 1;
			}
		}
		knownTargets[k] = idx;
	}
	for (let j = 0; j < d; j++) if (covered[j] === 0) return prepareSimulation(plan, design, opts);
	const prepared: PreparedSimulation = { ...previous, plan, design, knownTargets, warnings: previous.warnings.slice() };
	PREPARED_WITH.set(prepared, { ...opts });
	return prepared;
}

/** Whether `previous` was prepared from inputs that agree with these in everything but reagent targets and effects. */
function reusable(previous: PreparedSimulation, plan: Plan, design: Design, opts: SimulationOptions): boolean {
	const old = previous.plan;
	const od = previous.design;
	if (opts.blocks === undefined || !sameJson(opts, PREPARED_WITH.get(previous))) return false;
	if (!coversEvery(previous)) return false;
	if (plan.factors.length !== old.factors.length || plan.factors.some((f, j) => f.id !== old.factors[j].id || f.shape !== old.factors[j].shape)) return false;
	if (plan.reagents.length !== old.reagents.length || plan.reagents.some((r, i) => r.id !== old.reagents[i].id)) return false;
	if (plan.contexts !== old.contexts && (plan.contexts.length > 0 || old.contexts.length > 0)) return false;
	if (!sameJson(plan.observation, old.observation) || !sameJson(plan.budget, old.budget) || plan.goal.route !== old.goal.route || plan.goal.mcc !== old.goal.mcc) return false;
	return design === od || sameJson(design, od);
}

function coversEvery(prep: PreparedSimulation): boolean {
	for (let j = 0; j < prep.factorIds.length; j++) if (!prep.knownTargets.some((t) => t !== null && t.includes(j))) return false;
	return true;
}

function sameJson(a: unknown, b: unknown): boolean {
	return a === b || JSON.stringify(a) === JSON.stringify(b);
}
