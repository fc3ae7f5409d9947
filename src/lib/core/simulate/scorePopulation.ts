import { jointCovariance, populationJointCovariance } from '../score/jointCovariance';
import { drawFactor } from './factorShape';
import { STREAM } from './keys';
import { applyMixing, type Mixing } from './mixing';
import { rngFor } from './rng';
import type { PreparedSimulation } from './types';

/**
 * A recovered representation: maps a profile x (length p, at offset) to k components.
 * Linear unmixings are `{ kind: 'linear', w }`; lifted ones carry a function.
 */
export type Representation = { kind: 'linear'; k: number; w: Float64Array } | { kind: 'lifted'; k: number; apply(x: Float64Array, out: Float64Array): void };

/**
 * Joint covariance of recovered components and true factors over the scoring population of the
 * baseline environment: z with each factor's standardised shape, x = g(z) + ε, ε ~ N(0, σ²I)
 * (σ = measurementNoise; plate offsets are constant within a population and do not change
 * correlations). With prep.scoreDraws = 0 and a linear representation under linear mixing the
 * exact population covariance is used (Cov(Wx, z) = WA, Cov(Wx) = WAAᵀWᵀ + σ²WWᵀ); otherwise
 * scoreDraws samples, with ranks (Spearman) for nonlinear mixing.
 */
export function scoreCovariance(prep: PreparedSimulation, mixing: Mixing, rep: number, rep_: Representation): Float64Array {
	const { plan } = prep;
	const d = prep.factorIds.length;
	const p = plan.observation.features;
	const sigma = plan.observation.measurementNoise;
	if (prep.scoreDraws === 0 && rep_.kind === 'linear' && mixing.lambda === 0) return populationJointCovariance(rep_.w, mixing.a, rep_.k, p, d, sigma * sigma);
	const n = prep.scoreDraws;
	const rng = rngFor(prep.seed, rep, STREAM.SCORE);
	const shapes = plan.factors.map((f) => f.shape);
	const k = rep_.k;
	const z = new Float64Array(n * d);
	const y = new Float64Array(n * k);
	const x = new Float64Array(p);
	const eps = new Float64Array(p);
	const out = new Float64Array(k);
	const scratch = new Float64Array(2 * d);
	for (let s = 0; s < n; s++) {
		for (let j = 0; j < d; j++) z[s * d + j] = drawFactor(shapes[j], rng);
		applyMixing(mixing, z, s * d, x, 0, scratch);
		rng.fillNormal(eps, 0, p, sigma);
		for (let i = 0; i < p; i++) x[i] += eps[i];
		if (rep_.kind === 'linear') {
			for (let t = 0; t < k; t++) {
				let v = 0;
				for (let i = 0; i < p; i++) v += rep_.w[t * p + i] * x[i];
				y[s * k + t] = v;
			}
		} else {
			rep_.apply(x, out);
			y.set(out, s * k);
		}
	}
	return jointCovariance(y, z, n, k, d, { ranks: prep.scoreMethod === 'spearman' });
}
