import { describe, expect, it } from 'vitest';
import { fastIca } from '../../src/lib/core/recover';
import { jointCovariance, mcc, populationJointCovariance, scoreRecovery } from '../../src/lib/core/score';
import { drawFactor, drawMixing, rngFor } from '../../src/lib/core/simulate';
import type { FactorShape } from '../../src/lib/core/plan';
import { icaReplicate } from '../../bench/workloads/ica';

function mixed(shape: FactorShape, d: number, n: number, p: number, seed: number, noise = 0.1) {
	const mixing = drawMixing(p, d, rngFor(seed, 1));
	const r = rngFor(seed, 2);
	const z = new Float64Array(n * d);
	const x = new Float64Array(n * p);
	for (let s = 0; s < n; s++) {
		for (let j = 0; j < d; j++) z[s * d + j] = drawFactor(shape, r);
		for (let i = 0; i < p; i++) {
			let v = noise * r.normal();
			for (let j = 0; j < d; j++) v += mixing.a[i * d + j] * z[s * d + j];
			x[s * p + i] = v;
		}
	}
	return { mixing, z, x };
}

function recovered(x: Float64Array, w: Float64Array, n: number, p: number, k: number) {
	const y = new Float64Array(n * k);
	for (let s = 0; s < n; s++) for (let t = 0; t < k; t++) for (let i = 0; i < p; i++) y[s * k + t] += w[t * p + i] * x[s * p + i];
	return y;
}

describe('FastICA (logcosh, symmetric)', () => {
	it('recovers Laplace factors: MCC ≥ 0.98 (identifiable: at most one Gaussian source, Comon 1994)', () => {
		for (const seed of [1, 2, 3]) {
			const { x, z } = mixed('laplace', 4, 4000, 10, seed);
			const u = fastIca(x, 4000, 10, { components: 4, rng: rngFor(seed, 3) });
			expect(u.converged).toBe(true);
			expect(mcc(recovered(x, u.w, 4000, 10, 4), z, 4000, 4, 4).mcc).toBeGreaterThanOrEqual(0.98);
		}
	});

	it('does not recover two Gaussian factors (any rotation of them is equally independent, Comon 1994)', () => {
		const scores: number[] = [];
		for (let seed = 1; seed <= 12; seed++) {
			const { x, z } = mixed('gaussian', 2, 3000, 6, seed);
			const u = fastIca(x, 3000, 6, { components: 2, rng: rngFor(seed, 3) });
			scores.push(mcc(recovered(x, u.w, 3000, 6, 2), z, 3000, 2, 2).mcc);
		}
		// A uniformly random rotation gives MCC = max(|cos θ|, |sin θ|), mean 2√2/π ≈ 0.90 (computed).
		const mean = scores.reduce((s, v) => s + v, 0) / scores.length;
		expect(mean).toBeLessThan(0.95);
		expect(Math.min(...scores)).toBeLessThan(0.85);
	});

	it('the ica workload recovers its six Laplace factors (BENCHMARK.md: mcc_mean ≈ 0.999), and the exact population score matches 2,000 scoring draws', () => {
		const r = icaReplicate(1);
		expect(r.converged).toBe(true);
		expect(r.mcc).toBeGreaterThan(0.995);
		// exact score vs sampled score for one unmixing
		const { x, mixing } = mixed('laplace', 3, 3000, 8, 9);
		const u = fastIca(x, 3000, 8, { components: 3, rng: rngFor(9, 3) });
		const exact = scoreRecovery(populationJointCovariance(u.w, mixing.a, 3, 8, 3, 0.01), 3, 3).mcc;
		const pop = mixed('laplace', 3, 2000, 8, 9); // same mixing (same stream), new draws
		const sampled = scoreRecovery(jointCovariance(recovered(pop.x, u.w, 2000, 8, 3), pop.z, 2000, 3, 3), 3, 3).mcc;
		expect(Math.abs(exact - sampled)).toBeLessThan(0.01);
	});

	it('reports non-convergence as data and rejects bad options', () => {
		const { x } = mixed('laplace', 3, 500, 5, 4);
		const u = fastIca(x, 500, 5, { components: 3, rng: rngFor(1), maxIter: 1, tol: 1e-12 });
		expect(u.converged).toBe(false);
		expect(u.warnings.join(' ')).toMatch(/did not converge/);
		expect(() => fastIca(x, 500, 5, { components: 6, rng: rngFor(1) })).toThrow(/components must be an integer in \[1, 5\]/);
	});
});
