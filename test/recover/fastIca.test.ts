import { describe, expect, it } from 'vitest';
import { fastIca } from '../../src/lib/core/recover';
import { jointCovariance, mcc, populationJointCovariance, scoreRecovery } from '../../src/lib/core/score';
import { drawFactor, drawMixing, rngFor } from '../../src/lib/core/simulate';
import type { FactorShape } from '../../src/lib/core/plan';
import { icaReplicate } from '../../bench/workloads/ica';
import { whiten } from '../../src/lib/core/recover/whiten';
import { symmetricDecorrelate } from '../../src/lib/core/linalg';

/**
 * Plain step-by-step version of the symmetric FastICA iteration (Hyvärinen & Oja 2000, eqs. 44–45;
 * logcosh contrast g = tanh, g′ = 1 − tanh²), one sample at a time with Math.tanh, on the
 * row-major whitened data: the reference for the optimised kernel.
 */
function naiveFastIca(x: Float64Array, n: number, p: number, k: number, seed: number, tol = 1e-4, maxIter = 200) {
	const wh = whiten(x, n, p, k);
	const xw = wh.whitened;
	const r = rngFor(seed, 3);
	let w: Float64Array = new Float64Array(k * k).map(() => r.normal());
	w = symmetricDecorrelate(w, k, k);
	let iterations = 0;
	for (let it = 1; it <= maxIter; it++) {
		iterations = it;
		const w1 = new Float64Array(k * k);
		for (let a = 0; a < k; a++) {
			let gp = 0;
			const eg = new Float64Array(k);
			for (let s = 0; s < n; s++) {
				let y = 0;
				for (let b = 0; b < k; b++) y += w[a * k + b] * xw[s * k + b];
				const t = Math.tanh(y);
				gp += 1 - t * t;
				for (let b = 0; b < k; b++) eg[b] += t * xw[s * k + b];
			}
			for (let b = 0; b < k; b++) w1[a * k + b] = eg[b] / n - (gp / n) * w[a * k + b];
		}
		const wNew = symmetricDecorrelate(w1, k, k);
		let lim = 0;
		for (let a = 0; a < k; a++) {
			let dot = 0;
			for (let b = 0; b < k; b++) dot += wNew[a * k + b] * w[a * k + b];
			lim = Math.max(lim, Math.abs(Math.abs(dot) - 1));
		}
		w = wNew;
		if (lim < tol) break;
	}
	const out = new Float64Array(k * p);
	for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) for (let i = 0; i < p; i++) out[a * p + i] += w[a * k + b] * wh.whitener[b * p + i];
	return { w: out, iterations };
}

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

	it.each([
		[1, 400, 3],
		[3, 1500, 7],
		[6, 5000, 30]
	])('k = %i, n = %i, p = %i: the optimised kernel gives the plain step-by-step update (same iterations, W·K to 1e-10)', (k, n, p) => {
		const { x } = mixed('laplace', k, n, p, 40 + k);
		const fast = fastIca(x, n, p, { components: k, rng: rngFor(40 + k, 3) });
		const ref = naiveFastIca(x, n, p, k, 40 + k);
		expect(fast.iterations).toBe(ref.iterations);
		let diff = 0;
		for (let i = 0; i < k * p; i++) diff = Math.max(diff, Math.abs(fast.w[i] - ref.w[i]));
		expect(diff).toBeLessThan(1e-10);
	});

	it('reports non-convergence as data and rejects bad options', () => {
		const { x } = mixed('laplace', 3, 500, 5, 4);
		const u = fastIca(x, 500, 5, { components: 3, rng: rngFor(1), maxIter: 1, tol: 1e-12 });
		expect(u.converged).toBe(false);
		expect(u.warnings.join(' ')).toMatch(/did not converge/);
		expect(() => fastIca(x, 500, 5, { components: 6, rng: rngFor(1) })).toThrow(/components must be an integer in \[1, 5\]/);
	});
});
