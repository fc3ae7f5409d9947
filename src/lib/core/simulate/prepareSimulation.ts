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

	return {
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
}

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
