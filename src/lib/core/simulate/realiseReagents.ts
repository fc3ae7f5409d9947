import type { Reagent, ReagentKind } from '../plan/types';
import { STREAM } from './keys';
import { rngFor, type Rng } from './rng';

/** One reagent as it acts in one replicate. */
export interface RealisedReagent {
	kind: ReagentKind;
	/** True target factor indices (drawn for reagents with unknown targets). */
	targets: number[];
	/** Realised effect per factor (length d; 0 off target): shift amount, clamp value or relative spread change. */
	effect: Float64Array;
	efficacy: number;
}

/**
 * Draws the realised targets and effects of `reagent` (catalogue index `catalogue`) for replicate
 * `rep`, from its own stream so other reagents' draws do not depend on the design.
 * Unknown targets: `expectedTargets` distinct factors, uniformly without replacement.
 * Effect uncertainty: each target's stated effect times an independent log-normal factor with
 * mean 1 and coefficient of variation effectCv, exp(σξ − σ²/2) with σ² = ln(1 + cv²)
 * (sign kept; common practice choice).
 */
export function realiseReagent(reagent: Reagent, catalogue: number, factorIds: readonly string[], seed: number, rep: number): RealisedReagent {
	const rng = rngFor(seed, rep, STREAM.REAGENT, catalogue);
	const d = factorIds.length;
	const known = reagent.targets;
	let targets: number[];
	if (known) {
		targets = [];
		for (let i = 0; i < known.length; i++) {
			const j = factorIds.indexOf(known[i]);
			if (j >= 0) targets.push(j);
		}
	} else targets = drawTargets(Math.min(reagent.expectedTargets ?? 1, d), d, rng);
	const effect = new Float64Array(d);
	const cv = reagent.effectCv ?? 0;
	const sigma = Math.sqrt(Math.log(1 + cv * cv));
	for (let t = 0; t < targets.length; t++) {
		const j = targets[t];
		const stated = statedEffect(reagent, factorIds[j]);
		const xi = rng.normal();
		effect[j] = cv > 0 ? stated * Math.exp(sigma * xi - (sigma * sigma) / 2) : stated;
	}
	return { kind: reagent.kind, targets, effect, efficacy: reagent.efficacy };
}

function drawTargets(count: number, d: number, rng: Rng): number[] {
	const pool = Array.from({ length: d }, (_, j) => j);
	for (let i = 0; i < count; i++) {
		const j = i + rng.int(d - i);
		const t = pool[i];
		pool[i] = pool[j];
		pool[j] = t;
	}
	return pool.slice(0, count).sort((a, b) => a - b);
}

/** Stated effect on one factor; for unknown targets with a per-factor map, the map's mean. */
function statedEffect(reagent: Reagent, factorId: string): number {
	if (typeof reagent.effect === 'number') return reagent.effect;
	if (reagent.targets) return reagent.effect[factorId] ?? 0;
	const vals = Object.values(reagent.effect);
	return vals.length ? vals.reduce((s, v) => s + v, 0) / vals.length : 0;
}
