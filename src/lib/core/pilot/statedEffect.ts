import type { Reagent } from '../plan/types';

/**
 * Euclidean norm of a reagent's stated effect vector in factor SD units: √Σ effect² over its
 * known targets, or |effect|·√expectedTargets when only the number of targets is known.
 * For `clamp` reagents it is the norm of the clamped values (the mean shift from a baseline
 * mean of 0); for `scale` reagents the norm of the relative spread changes (no mean shift).
 */
export function statedEffectNorm(reagent: Reagent): number {
	if (reagent.targets === null) {
		const e = typeof reagent.effect === 'number' ? reagent.effect : 0;
		return Math.abs(e) * Math.sqrt(reagent.expectedTargets ?? 1);
	}
	let s = 0;
	for (const t of reagent.targets) {
		const e = typeof reagent.effect === 'number' ? reagent.effect : (reagent.effect[t] ?? 0);
		s += e * e;
	}
	return Math.sqrt(s);
}
