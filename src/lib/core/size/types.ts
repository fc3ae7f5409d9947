import type { Design, Route } from '../plan/types';
import type { EstimatorName, SimulationOptions } from '../simulate/types';
import type { DesignCost } from './costModel';
import type { ReagentTTest } from './reagentTTests';

/**
 * Options of the sizing search; every field is optional (defaults in brackets). Plain data.
 * - seed [1]: seed of every Monte Carlo replicate (common random numbers across candidates).
 * - batch [25]: replicates added per step of the sequential Monte Carlo of one design.
 * - maxReps [400]: replicates after which a design's verdict is taken from its point estimate.
 * - maxReplicates [32]: largest replicate wells per (reagent, context) tried (stock may lower it).
 * - controls [null]: controls per plate to try; null = the plan's value plus the standard values
 *   for the plate format (96: 4, 8; 384: 8, 16, 24; 1536: 16, 32, 48 — common practice).
 * - maxSets [3]: candidate reagent sets, 1–4 (the minimum-cost set, then augmented ones).
 * - exactLimit [20]: exact reagent search up to this many candidates (greedy beyond).
 * - estimator ['auto'], simulation [{}]: passed to the simulation (fastPath, scoreDraws, …).
 * - curve [true]: evaluate extra replicate counts of the chosen configuration for the curve.
 * - power [0.8], alpha [0.05]: the classic per-reagent t-test check.
 */
export interface SizeOptions {
	seed?: number;
	batch?: number;
	maxReps?: number;
	maxReplicates?: number;
	controls?: number[] | null;
	maxSets?: number;
	exactLimit?: number;
	estimator?: EstimatorName | 'auto';
	simulation?: Omit<SimulationOptions, 'seed' | 'estimator' | 'route'>;
	curve?: boolean;
	power?: number;
	alpha?: number;
}

/** One outcome of one Monte Carlo replicate, as the simulation returns it (extra fields are ignored). */
export interface ReplicateOutcome {
	rep: number;
	mcc: number;
}

/** A request to the evaluator: run replicates `reps` of `design` with simulation `options`. */
export interface EvalRequest {
	design: Design;
	reps: number[];
	options: SimulationOptions;
}

/**
 * Evaluates a batch of requests (possibly in parallel): one array of outcomes per request,
 * in the order of its `reps`. Must be deterministic in (options.seed, rep) for each design.
 */
export type Evaluator = (batch: EvalRequest[]) => Promise<ReplicateOutcome[][]>;

export interface SizeProgress {
	phase: 'select' | 'search' | 'budget' | 'curve';
	/** Replicates simulated so far. */
	evaluations: number;
	/** Designs evaluated so far. */
	designs: number;
	message: string;
}

/** Assurance estimate: share of replicates with MCC ≥ goal, Wilson 95 % interval, replicates used. */
export interface AssuranceEstimate {
	p: number;
	lo: number;
	hi: number;
	reps: number;
}

/** A design as sizing reports it: the plan design plus its plates, wells and total cost. */
export interface SizedDesign {
	reagents: string[];
	replicates: number;
	controlsPerPlate: number;
	contexts: string[];
	cellsPerWell?: number;
	plates: number;
	wells: number;
	cost: number;
}

export interface FrontierPoint {
	cost: number;
	assurance: number;
	lo: number;
	hi: number;
	design: SizedDesign;
}

export interface CurvePoint {
	replicates: number;
	/** Median and 10th percentile of the replicates' MCC. */
	median: number;
	p10: number;
	assurance: number;
	lo: number;
	hi: number;
	cost: number;
	reps: number;
}

export interface SizeResult {
	/** True when the cheapest design reaching the goal fits the budget. */
	feasible: boolean;
	/** One or two plain sentences: why feasible or not. */
	reason: string;
	route: Route;
	/** Recommended design: the cheapest reaching the goal when feasible, else the highest-assurance design the budget buys (null when nothing fits). */
	design: SizedDesign | null;
	/** Cost breakdown of `design`. */
	cost: DesignCost | null;
	/** Assurance of `design`. */
	assurance: AssuranceEstimate | null;
	/** Cheapest design reaching the goal regardless of budget, or null when none was found. */
	cheapest: SizedDesign | null;
	/** Cost of the cheapest design reaching the goal when the budget is short; null when feasible or when no design can reach it. */
	budgetNeeded: number | null;
	/** Factors no reagent/context choice recovers individually (then no design reaches the goal). */
	unreachable: { id: string; block: string[]; reason: string }[];
	/** Pareto frontier of cost against assurance over every design evaluated, cheapest first. */
	frontier: FrontierPoint[];
	/** MCC and assurance against replicates for the chosen reagent set and settings. */
	curve: CurvePoint[];
	/** Classic check: wells per group for a two-sided t-test on each reagent's effect. */
	tTest: ReagentTTest[];
	goal: { mcc: number; assurance: number };
	seed: number;
	/** Replicates simulated in total. */
	evaluations: number;
	/** Distinct designs evaluated. */
	designsEvaluated: number;
	warnings: string[];
	/** Standing cautions to show with the result. */
	cautions: string[];
}
