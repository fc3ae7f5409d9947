import type { Design, GoalRoute, Route } from '../plan/types';

/** Outcome of one check. */
export type CheckStatus = 'pass' | 'warn' | 'fail';

/**
 * The cheapest change found that fixes (or improves) a check.
 * `reagentId` names a catalogue reagent to add (or, for the budget check, to drop);
 * `cost` is the change in design cost in the budget currency that the fix brings
 * (positive = the fix costs this much more; negative = it saves this much).
 */
export interface Fix {
	text: string;
	reagentId?: string;
	cost?: number;
}

/** One identifiability or practical check with its reason in plain words and its source. */
export interface Check {
	/** Stable identifier, e.g. `targeted.rank`, `contexts.variance`, `practical.budget`. */
	id: string;
	route: Route | 'practical';
	status: CheckStatus;
	/** One plain sentence (or two) saying what was found. */
	message: string;
	/** The published result or practice behind the check. */
	source: string;
	/** Factor ids the check is about, in plan order. */
	factors?: string[];
	fix?: Fix | null;
}

/** Per factor: recovered on its own (up to sign and scale), only as a block, or not at all. */
export type Verdict = 'individual' | 'block' | 'none';

export interface FactorVerdict {
	id: string;
	verdict: Verdict;
	/** [self] for individual; every member incl. self (plan order) for block; [] for none. */
	block: string[];
	/** The route that gives this verdict; null when the verdict is `none`. */
	route: Route | null;
	/** One plain sentence explaining the verdict. */
	reason: string;
}

export interface RouteVerdicts {
	route: Route;
	/** False when the design gives the route nothing to work with (then every factor is `none`). */
	applicable: boolean;
	factors: FactorVerdict[];
}

export interface CheckResult {
	/** The requested route, or for `auto` the route that recovers the most factors individually. */
	route: GoalRoute | Route;
	checks: Check[];
	/** Best verdict per factor over the evaluated routes, in plan factor order. */
	factors: FactorVerdict[];
	/** Every route's own verdicts (routes not evaluated are absent). */
	routes: RouteVerdicts[];
	/** The design that was evaluated. */
	design: Design;
	/** Standing cautions: what the verdicts assume and what they cannot replace. */
	cautions: string[];
}

/** What one route's evaluation produces (internal to the identify area). */
export interface RouteOutcome {
	verdicts: RouteVerdicts;
	checks: Check[];
}
