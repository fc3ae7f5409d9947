import type { EvalContext } from './evalContext';
import { listText } from './labels';
import { SOURCES } from './sources';
import type { Check, FactorVerdict, RouteOutcome } from './types';

/**
 * The observational route (always applicable): linear mixing is identifiable up to sign, scale
 * and order when at most one factor is Gaussian (the Gaussian ones form a block); nonlinear
 * mixing without auxiliary information never is.
 */
export function observationalRoute(ctx: EvalContext): RouteOutcome {
	const { label } = ctx;
	const ids = ctx.factors.map((f) => f.id);
	if (ctx.nonlinear) {
		const reason = 'Without reagents or contexts to compare, nonlinear mixing can never be undone, whatever the factor shapes.';
		const check: Check = {
			id: 'observational.nonlinear',
			route: 'observational',
			status: 'fail',
			message: 'Under nonlinear mixing no factor can be recovered from unperturbed wells alone: without auxiliary information (reagents or contexts) the mixing is never identifiable.',
			source: SOURCES.nonlinearObservational,
			factors: ids,
			fix: { text: 'Rely on the targeted route (single-target clamp reagents) or the contexts route (enough contexts that modulate the factors).' }
		};
		return { verdicts: { route: 'observational', applicable: true, factors: ids.map((id) => ({ id, verdict: 'none', block: [], route: null, reason })) }, checks: [check] };
	}
	const gaussian = ctx.factors.filter((f) => f.shape === 'gaussian').map((f) => f.id);
	const mixed = gaussian.length >= 2;
	const check: Check = {
		id: 'observational.gaussian',
		route: 'observational',
		status: mixed ? 'fail' : 'pass',
		message: mixed
			? `${listText(gaussian.map(label))} are Gaussian-shaped; two or more Gaussian factors can be rotated into each other without changing the data, so they form one block.`
			: gaussian.length === 1
				? `Only ${label(gaussian[0])} is Gaussian-shaped; with at most one Gaussian factor, linear unmixing recovers every factor up to sign, scale and order.`
				: 'No factor is Gaussian-shaped, so linear unmixing of unperturbed wells recovers every factor up to sign, scale and order.',
		source: SOURCES.gaussian,
		factors: mixed ? gaussian : [],
		fix: mixed ? { text: `Add reagents or contexts that act on ${listText(gaussian.map(label))} separately (targeted or contexts route).` } : null
	};
	const verdicts: FactorVerdict[] = ids.map((id) =>
		mixed && gaussian.includes(id)
			? {
					id,
					verdict: 'block',
					block: gaussian,
					route: 'observational',
					reason: `Gaussian-shaped like ${listText(gaussian.filter((g) => g !== id).map(label))}: without perturbations they can be rotated into each other, so they are recovered only jointly.`
				}
			: { id, verdict: 'individual', block: [id], route: 'observational', reason: 'Linear mixing with at most one Gaussian-shaped factor: independent component analysis recovers it up to sign and scale.' }
	);
	return { verdicts: { route: 'observational', applicable: true, factors: verdicts }, checks: [check] };
}
