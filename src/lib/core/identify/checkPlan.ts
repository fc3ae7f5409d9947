import { effectiveDesign } from '../plan/planHelpers';
import { ROUTES, type Design, type Plan, type Route } from '../plan/types';
import { contextsRoute } from './contextsRoute';
import { evalContext, type EvalContext } from './evalContext';
import { observationalRoute } from './observationalRoute';
import { practicalChecks } from './practicalChecks';
import { targetedRoute } from './targetedRoute';
import type { CheckResult, FactorVerdict, RouteOutcome, RouteVerdicts } from './types';
import { compareVerdicts } from './verdictOrder';

/**
 * Exact identifiability verdicts for a plan (DESIGN.md "Identifiability checks").
 *
 * Evaluates `design` (default: the plan's fixed design, else every reagent and context at 4
 * replicates). With goal.route `auto` every route is evaluated and each factor keeps its best
 * verdict (individual > block, smaller first > none); checks of routes the design cannot use are
 * left out. A named route is evaluated alone, with a failing check when it does not apply.
 * Practical checks (replicates, controls, stock, capacity, budget) are always added.
 * Throws a RangeError naming the field when the design refers to unknown reagents or contexts.
 */
export function checkPlan(plan: Plan, design?: Design): CheckResult {
	const ctx = evalContext(plan, design ?? effectiveDesign(plan));
	const requested = plan.goal.route;
	const routes: Route[] = requested === 'auto' ? [...ROUTES] : [requested];
	const outcomes = routes.map((r) => evaluateRoute(ctx, r));
	const checks = outcomes.flatMap((o) => (requested === 'auto' && !o.verdicts.applicable ? [] : o.checks));
	const routeVerdicts = outcomes.map((o) => o.verdicts);
	const factors = bestVerdicts(ctx, routeVerdicts);
	const route = requested === 'auto' ? topRoute(routeVerdicts) : requested;
	checks.push(...practicalChecks(ctx, () => redundantReagents(ctx, routeVerdicts, factors)));
	return { route, checks, factors, routes: routeVerdicts, design: ctx.design, cautions: cautions(ctx, route) };
}

function evaluateRoute(ctx: EvalContext, route: Route): RouteOutcome {
	if (route === 'targeted') return targetedRoute(ctx);
	if (route === 'contexts') return contextsRoute(ctx);
	return observationalRoute(ctx);
}

/** Best verdict per factor over the applicable routes; ties go to the earlier route (targeted, contexts, observational). */
function bestVerdicts(ctx: EvalContext, routes: RouteVerdicts[]): FactorVerdict[] {
	return ctx.factors.map((f, j) => {
		let best: FactorVerdict | null = null;
		for (const r of routes) {
			if (!r.applicable) continue;
			const v = r.factors[j];
			if (!best || compareVerdicts(v, best) > 0) best = v;
		}
		if (best && best.verdict !== 'none') return { ...best, block: [...best.block] };
		const reasons = routes.map((r) => `${r.route}: ${r.factors[j].reason}`);
		return { id: f.id, verdict: 'none', block: [], route: null, reason: routes.length === 1 ? routes[0].factors[j].reason : `No route recovers it — ${reasons.join(' ')}` };
	});
}

/** The applicable route with the most individual factors (ties: targeted, contexts, observational). */
function topRoute(routes: RouteVerdicts[]): Route {
	let best: RouteVerdicts | null = null;
	let bestCount = -1;
	for (const r of routes) {
		if (!r.applicable) continue;
		const n = r.factors.filter((f) => f.verdict === 'individual').length;
		if (n > bestCount) [best, bestCount] = [r, n];
	}
	return best?.route ?? routes[0].route;
}

/**
 * Design reagents, most expensive per well first, whose removal worsens no factor's best
 * verdict (structural ranks only). Only the targeted route depends on the reagents, so the
 * other routes' verdicts are reused. Stops at the first one found: the budget fix needs one.
 */
function redundantReagents(ctx: EvalContext, routes: RouteVerdicts[], factors: FactorVerdict[]): string[] {
	const order = new Map(ctx.design.reagents.map((id, i) => [id, i]));
	const candidates = [...ctx.used].sort((a, b) => b.costPerWell - a.costPerWell || order.get(a.id)! - order.get(b.id)!);
	const targetedAt = routes.findIndex((r) => r.route === 'targeted');
	for (const r of candidates) {
		if (targetedAt < 0) return [r.id];
		const smaller = evalContext(ctx.plan, { ...ctx.design, reagents: ctx.design.reagents.filter((id) => id !== r.id) }, true);
		const trial = routes.map((rv, k) => (k === targetedAt ? targetedRoute(smaller).verdicts : rv));
		const after = bestVerdicts(smaller, trial);
		if (after.every((v, j) => compareVerdicts(v, factors[j]) >= 0)) return [r.id];
	}
	return [];
}

function cautions(ctx: EvalContext, route: Route | 'auto'): string[] {
	const out = [
		'These verdicts hold only under the stated model (the mixing, the listed targets and the factor shapes); a pilot experiment is the test of those assumptions.',
		'A factor that can be identified may still be recovered poorly with too few wells or too much noise; the simulation and sizing steps estimate how well.'
	];
	if (route === 'observational') out.push('The observational route rests on the stated factor shapes: a factor closer to Gaussian than stated is recovered worse than the verdict suggests.');
	if (route === 'contexts') out.push('The contexts route assumes the contexts change only the factor distributions, not how the factors show up in the readout.');
	if (ctx.nonlinear) out.push('With nonlinear mixing, an individual verdict means recovery up to a monotone transform of the factor, and only with a flexible enough estimator and many wells.');
	out.push("This planner does not replace a statistician's review, the lab's biosafety rules, or the institutional approvals needed for the reagents and organisms used.");
	return out;
}
