import { describe, expect, it } from 'vitest';
import pkg from 'jstat';
import { covarianceAbout, whiten } from '../../src/lib/core/recover/whiten';
import { rngFor } from '../../src/lib/core/simulate/rng';

const { jStat } = pkg;

function sample(n: number, p: number, seed: number) {
	const r = rngFor(seed);
	const x = new Float64Array(n * p);
	// Correlated features with non-zero means: x_i = 3 + i/2 + z_0 + 0.5·z_i.
	for (let s = 0; s < n; s++) {
		const common = r.normal();
		for (let i = 0; i < p; i++) x[s * p + i] = 3 + i / 2 + common + 0.5 * r.normal();
	}
	return x;
}

describe('covarianceAbout / whiten (blocked kernels)', () => {
	it.each([
		[1, 5],
		[7, 130],
		[30, 5000],
		[9, 63]
	])('p = %i, n = %i: covariance equals jStat.covariance scaled to divisor n', (p, n) => {
		const x = sample(n, p, p * 1000 + n);
		const cols = Array.from({ length: p }, (_, i) => Array.from({ length: n }, (_, s) => x[s * p + i]));
		const mean = new Float64Array(p).map((_, i) => jStat.mean(cols[i]));
		const cov = covarianceAbout(x, n, p, mean);
		for (let i = 0; i < p; i++)
			for (let j = 0; j < p; j++) {
				const ref = (jStat.covariance(cols[i], cols[j]) * (n - 1)) / n;
				expect(Math.abs(cov[i * p + j] - ref)).toBeLessThan(1e-12 * Math.max(1, Math.abs(ref)));
			}
	});

	it('whitened components have identity covariance, and both layouts hold the same values', () => {
		for (const [p, n, k] of [
			[11, 777, 4],
			[30, 5000, 6],
			[5, 100, 5]
		]) {
			const x = sample(n, p, n + p);
			const rows = whiten(x, n, p, k);
			const cols = whiten(x, n, p, k, 'columns');
			for (let s = 0; s < n; s++) for (let t = 0; t < k; t++) expect(cols.whitened[t * n + s]).toBe(rows.whitened[s * k + t]);
			for (let a = 0; a < k; a++)
				for (let b = 0; b < k; b++) {
					let c = 0;
					for (let s = 0; s < n; s++) c += rows.whitened[s * k + a] * rows.whitened[s * k + b];
					expect(c / n).toBeCloseTo(a === b ? 1 : 0, 9);
				}
		}
	});
});
