import { STREAM } from './keys';
import { drawMixing, type Mixing } from './mixing';
import { realiseReagent, type RealisedReagent } from './realiseReagents';
import { rngFor } from './rng';
import type { PreparedSimulation } from './types';

/** Spread (SD) of a clamped factor across cells around its clamp value (ours; common practice choice). */
export const CLAMP_SPREAD = 0.1;

/** The random state of one replicate shared by every path: mixing and realised reagents (design order). */
export interface World {
	mixing: Mixing;
	reagents: RealisedReagent[];
	/** Per design context (index c; the baseline is stored last when the design has none): factor means and SDs (length d). */
	contextMean: Float64Array[];
	contextSd: Float64Array[];
}

export function drawWorld(prep: PreparedSimulation, rep: number): World {
	const { plan, seed } = prep;
	const d = prep.factorIds.length;
	const mixing = drawMixing(plan.observation.features, d, rngFor(seed, rep, STREAM.MIXING), {
		nonlinearity: prep.linear ? 0 : plan.observation.nonlinearity,
		condition: prep.mixingCondition
	});
	const reagents = prep.reagentCatalogue.map((ci) => realiseReagent(plan.reagents[ci], ci, prep.factorIds, seed, rep));
	const contextMean: Float64Array[] = [];
	const contextSd: Float64Array[] = [];
	for (const ci of prep.contextCatalogue) {
		const ctx = plan.contexts[ci];
		contextMean.push(Float64Array.from(prep.factorIds, (id) => ctx.mean[id] ?? 0));
		contextSd.push(Float64Array.from(prep.factorIds, (id) => Math.sqrt(ctx.variance[id] ?? 1)));
	}
	return { mixing, reagents, contextMean, contextSd };
}

const ZERO = new Map<number, Float64Array>();
const ONE = new Map<number, Float64Array>();

/** Factor means of design context c (−1 = baseline: zeros). */
export function meanOf(world: World, c: number, d: number): Float64Array {
	if (c >= 0) return world.contextMean[c];
	let z = ZERO.get(d);
	if (!z) ZERO.set(d, (z = new Float64Array(d)));
	return z;
}

/** Factor SDs of design context c (−1 = baseline: ones). */
export function sdOf(world: World, c: number, d: number): Float64Array {
	if (c >= 0) return world.contextSd[c];
	let s = ONE.get(d);
	if (!s) ONE.set(d, (s = new Float64Array(d).fill(1)));
	return s;
}
