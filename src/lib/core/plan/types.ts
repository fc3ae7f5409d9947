/**
 * Plan file types (format `identiplate-plan`, version 1). See DESIGN.md "Plan file".
 * These are plain, serialisable data: they cross to workers and into IndexedDB unchanged.
 */

export const PLAN_FORMAT = 'identiplate-plan';
export const PLAN_VERSION = 1;

export type FactorShape = 'gaussian' | 'laplace' | 'uniform' | 'bimodal';
export const FACTOR_SHAPES: readonly FactorShape[] = ['gaussian', 'laplace', 'uniform', 'bimodal'];

export type ReagentKind = 'shift' | 'clamp' | 'scale';
export const REAGENT_KINDS: readonly ReagentKind[] = ['shift', 'clamp', 'scale'];

export type Route = 'targeted' | 'contexts' | 'observational';
export type GoalRoute = Route | 'auto';
export const ROUTES: readonly Route[] = ['targeted', 'contexts', 'observational'];

export type PlateFormat = 96 | 384 | 1536;
export const PLATE_FORMATS: readonly PlateFormat[] = [96, 384, 1536];

export interface Factor {
	id: string;
	name: string;
	/** Standardised (unit-variance) distribution of the factor in the baseline context. */
	shape: FactorShape;
}

/**
 * A perturbation that can be bought.
 * - `shift`: adds `effect` (factor SD units) to each target.
 * - `clamp`: sets each target to the value `effect` with a small spread (a hard intervention).
 * - `scale`: multiplies each target's spread by (1 + effect).
 */
export interface Reagent {
	id: string;
	name: string;
	/** Known target factor ids, or null when only the expected number of targets is known. */
	targets: string[] | null;
	/** Expected number of targets; required when `targets` is null. */
	expectedTargets?: number;
	kind: ReagentKind;
	/** One value for every target, or one value per target factor id. */
	effect: number | Record<string, number>;
	/** Relative uncertainty of the effect drawn in the Monte Carlo (coefficient of variation); default 0. */
	effectCv?: number;
	/** Probability that a well responds at all, in (0, 1]. */
	efficacy: number;
	costPerWell: number;
	/** Stock limit: the most wells this reagent can fill; absent = unlimited. */
	maxWells?: number;
}

export interface Context {
	id: string;
	name: string;
	/** `plate`: the context is applied to whole plates; `well`: mixed within plates. */
	level: 'plate' | 'well';
	/** Mean of each factor in this context (absent factors: 0). */
	mean: Record<string, number>;
	/** Variance of each factor in this context (absent factors: 1). */
	variance: Record<string, number>;
}

export interface Observation {
	/** Number of measured features p. */
	features: number;
	mixing: 'linear' | 'nonlinear';
	/** λ of the residual branch A(z + λ V tanh(U z)), in [0, 1). */
	nonlinearity: number;
	/** Cells per well; 0 = simulate at well level only. */
	cellsPerWell: number;
	/** SD τ of well-to-well replicate noise in factor space. */
	replicateNoise: number;
	/** SD of per-cell (or per-well at well level) measurement noise in feature space. */
	measurementNoise: number;
	/** SD σ_q of the per-plate additive offset in feature space. */
	plateEffect: number;
}

export interface Budget {
	total: number;
	currency: string;
	plateFormat: PlateFormat;
	plateCost: number;
	fixedCost: number;
	excludeEdgeWells: boolean;
	controlsPerPlate: number;
}

export interface Goal {
	/** Recovery score (MCC) to reach, in (0, 1]. */
	mcc: number;
	/** Required probability of reaching it, in (0, 1). */
	assurance: number;
	route: GoalRoute;
}

/** A concrete design fixed in the plan instead of being sized. */
export interface Design {
	reagents: string[];
	/** Replicate wells per (reagent, context), integer ≥ 1 (≥ 2 recommended). */
	replicates: number;
	controlsPerPlate: number;
	/** Context ids used; empty = one baseline environment. */
	contexts: string[];
	/** Optional: cells imaged per well (overrides observation.cellsPerWell). */
	cellsPerWell?: number;
	/** Optional: number of plates (computed from the cost model when absent). */
	plates?: number;
}

export interface Plan {
	format: typeof PLAN_FORMAT;
	version: typeof PLAN_VERSION;
	title: string;
	notes: string;
	factors: Factor[];
	reagents: Reagent[];
	contexts: Context[];
	observation: Observation;
	budget: Budget;
	goal: Goal;
	design: Design | null;
	/** Optional per-section notes of the notebook (section id → text). */
	sectionNotes?: Record<string, string>;
}
