import type { Design, Plan, Route } from '../plan/types';

/** Recovery estimators (see recover/): the route picks one unless the caller overrides it. */
export type EstimatorName = 'support' | 'sparse' | 'fastica' | 'jointdiag' | 'contrastive';
export const ESTIMATORS: readonly EstimatorName[] = ['support', 'sparse', 'fastica', 'jointdiag', 'contrastive'];
/** The linear steps an estimator (or the contrastive lift) ends with. */
export type LinearStep = Exclude<EstimatorName, 'contrastive'>;

/**
 * Options of a simulation. Every field except `seed` is optional; defaults in brackets.
 * - estimator ['auto']: follow the route (targeted + all factors with known-target reagents →
 *   support; targeted otherwise → sparse; contexts → jointdiag; observational → fastica;
 *   nonlinear mixing with λ > 0 → contrastive lift followed by the route's linear step).
 * - route [plan.goal.route, 'auto' when that is 'auto']: 'auto' picks targeted when the design
 *   has reagents, contexts when it uses ≥ 2 contexts, else observational.
 * - blocks [from the identify module]: groups of factor ids that are only identifiable
 *   jointly; block R² is then reported for their members. Undefined = take them from
 *   checkPlan(plan, design) for the resolved route (its `block` verdicts); null = none (faster).
 * - fastPath ['auto']: draw the plate-corrected reagent means from their exact sampling
 *   distribution where that is exact (linear mixing, support/sparse estimators, controls on
 *   every plate, well level or Gaussian factors); `false` always simulates every well and cell.
 * - scoreDraws [0 = analytic where exact, else 2000]: population draws used to score a
 *   replicate; 0 uses the exact population correlation for linear mixing and linear estimators.
 * - maxCells [4000]: cells kept per replicate for the estimators that learn from cells
 *   (each well contributes its first ⌈maxCells / wells⌉ cells; well means use every cell).
 * - mixingCondition [null]: when set [lo, hi], the mixing matrix's singular values are reset to
 *   log-spaced values whose condition number is drawn log-uniformly from [lo, hi] (keeping the
 *   Frobenius norm); null keeps the standard normal entries.
 */
export interface SimulationOptions {
	seed: number;
	estimator?: EstimatorName | 'auto';
	route?: Route | 'auto';
	blocks?: string[][] | null;
	fastPath?: boolean | 'auto';
	scoreDraws?: number;
	maxCells?: number;
	mixingCondition?: [number, number] | null;
}

/**
 * Everything a replicate needs, resolved once; plain serialisable data (crosses to workers).
 * Well placement used by the simulation: plates are grouped as in the cost model (plate-level
 * contexts on plates of their own, baseline and well-level contexts sharing plates); within a
 * group of P plates, replicate i of design reagent k in the group's context c goes to plate
 * (k + i + c) mod P, so replicates of a reagent spread over plates. Every plate holds
 * `controlsPerPlate` negative controls (on shared plates they cycle over the well-level contexts).
 */
export interface PreparedSimulation {
	plan: Plan;
	design: Design;
	seed: number;
	estimator: EstimatorName;
	linearStep: LinearStep;
	route: Route;
	goalMcc: number;
	/** Factor ids in plan order; factor j of every array is plan.factors[j]. */
	factorIds: string[];
	/** Design reagent k → index in plan.reagents (the key of its random streams). */
	reagentCatalogue: number[];
	/** Design context c → index in plan.contexts; empty = one baseline environment. */
	contextCatalogue: number[];
	/** Known target factor indices per design reagent (null = unknown targets). */
	knownTargets: (number[] | null)[];
	cellsPerWell: number;
	plates: number;
	/** Treatment wells (parallel arrays): design reagent, design context (−1 = baseline), replicate, plate. */
	wellReagent: number[];
	wellContext: number[];
	wellReplicate: number[];
	wellPlate: number[];
	/** Control wells (parallel arrays): plate, design context (−1 = baseline), index on the plate. */
	controlPlate: number[];
	controlContext: number[];
	controlIndex: number[];
	/**
	 * Fast-path summaries of the placement (derived from the well arrays above):
	 * reagentGroups[k] = [context, wells, context, wells, …] of design reagent k;
	 * reagentPlates[k] = [plate, share of k's wells, …]; plateControls[q] = [context, controls, …].
	 */
	reagentGroups: number[][];
	reagentPlates: number[][];
	plateControls: number[][];
	/** Factor-index blocks for block R², or null. */
	blocks: number[][] | null;
	linear: boolean;
	fastPath: boolean;
	/** 0 = analytic population score. */
	scoreDraws: number;
	scoreMethod: 'pearson' | 'spearman';
	maxCells: number;
	mixingCondition: [number, number] | null;
	warnings: string[];
}

export interface ReplicateResult {
	rep: number;
	mcc: number;
	/** |correlation| of each factor (plan order) with its matched recovered component. */
	factorCorr: number[];
	/** Block R² per factor when blocks are known, else null. */
	blockR2: number[] | null;
	converged: boolean;
	warnings: string[];
}

export interface SimulationSummary {
	seed: number;
	reps: number;
	estimator: EstimatorName;
	route: Route;
	goalMcc: number;
	mcc: { mean: number; p10: number; median: number; p90: number };
	/** Share of replicates with MCC ≥ goal and its Wilson 95 % interval. */
	assurance: { p: number; lo: number; hi: number };
	factors: { id: string; meanCorr: number; blockR2?: number }[];
	mccs: number[];
	warnings: string[];
	design: Design;
}
