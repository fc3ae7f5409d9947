import { describe, expect, it } from 'vitest';
import { jointCovariance, mcc, populationJointCovariance, scoreRecovery } from '../../src/lib/core/score';
import { rngFor } from '../../src/lib/core/simulate/rng';

function sample(n: number, d: number, seed: number) {
	const r = rngFor(seed);
	const z = new Float64Array(n * d);
	for (let i = 0; i < n * d; i++) z[i] = r.normal() + (r.next() < 0.5 ? -1 : 1);
	return z;
}

describe('mcc', () => {
	it('is 1 for a permuted, rescaled, sign-flipped truth ẑ = (−2z₃, 0.5z₁, 3z₂)', () => {
		// Source: REFERENCES.md "Recovery score (MCC)" — computed example, MCC = 1 (definition of Khemakhem et al. 2020, §5.1).
		const n = 500;
		const z = sample(n, 3, 1);
		const y = new Float64Array(n * 3);
		for (let i = 0; i < n; i++) {
			y[i * 3] = -2 * z[i * 3 + 2];
			y[i * 3 + 1] = 0.5 * z[i * 3];
			y[i * 3 + 2] = 3 * z[i * 3 + 1];
		}
		const s = mcc(y, z, n, 3, 3);
		expect(s.mcc).toBeCloseTo(1, 12);
		expect(s.matched).toEqual([1, 2, 0]);
		expect(mcc(y, z, n, 3, 3, { method: 'spearman' }).mcc).toBeCloseTo(1, 12);
	});

	it('Spearman is 1 under strictly monotone distortions where Pearson is not', () => {
		// Property of rank correlation (Spearman 1904): invariant to strictly increasing transforms.
		const n = 400;
		const z = sample(n, 2, 2);
		const y = new Float64Array(n * 2);
		for (let i = 0; i < n; i++) {
			y[i * 2] = Math.exp(2 * z[i * 2 + 1]);
			y[i * 2 + 1] = -(z[i * 2] ** 3);
		}
		expect(mcc(y, z, n, 2, 2, { method: 'spearman' }).mcc).toBeCloseTo(1, 12);
		expect(mcc(y, z, n, 2, 2).mcc).toBeLessThan(0.95);
	});

	it('counts unmatched factors as 0 when fewer components than factors are recovered', () => {
		const n = 300;
		const z = sample(n, 2, 3);
		const y = new Float64Array(n);
		for (let i = 0; i < n; i++) y[i] = z[i * 2];
		const s = mcc(y, z, n, 1, 2);
		expect(s.factorCorr[0]).toBeCloseTo(1, 12);
		expect(s.factorCorr[1]).toBe(0);
		expect(s.mcc).toBeCloseTo(0.5, 12);
	});

	it('a mixed block scores a low MCC but block R² = 1', () => {
		// Two components that are rotations of (z1, z2) by 45°: each matched |r| = 1/√2 exactly in the population.
		const n = 4000;
		const z = sample(n, 2, 4);
		const y = new Float64Array(n * 2);
		for (let i = 0; i < n; i++) {
			y[i * 2] = z[i * 2] + z[i * 2 + 1];
			y[i * 2 + 1] = z[i * 2] - z[i * 2 + 1];
		}
		const s = mcc(y, z, n, 2, 2, { blocks: [[0, 1]] });
		expect(s.mcc).toBeLessThan(0.8);
		expect(s.blockR2![0]).toBeCloseTo(1, 10);
		expect(s.blockR2![1]).toBeCloseTo(1, 10);
	});

	it('the exact population covariance of a linear unmixing matches a large sample', () => {
		// Cov(Wx, z) = WA and Cov(Wx) = WAAᵀWᵀ + σ²WWᵀ for x = Az + ε, Σ_z = I (standard identity of linear models).
		const p = 5,
			d = 2,
			k = 2,
			sigma = 0.7;
		const r = rngFor(9);
		const a = Float64Array.from({ length: p * d }, () => r.normal());
		const w = Float64Array.from({ length: k * p }, () => r.normal());
		const exact = scoreRecovery(populationJointCovariance(w, a, k, p, d, sigma * sigma), k, d);
		const n = 200_000;
		const z = new Float64Array(n * d);
		const y = new Float64Array(n * k);
		for (let s = 0; s < n; s++) {
			for (let j = 0; j < d; j++) z[s * d + j] = r.normal();
			const x = new Float64Array(p);
			for (let i = 0; i < p; i++) {
				let v = sigma * r.normal();
				for (let j = 0; j < d; j++) v += a[i * d + j] * z[s * d + j];
				x[i] = v;
			}
			for (let t = 0; t < k; t++) {
				let v = 0;
				for (let i = 0; i < p; i++) v += w[t * p + i] * x[i];
				y[s * k + t] = v;
			}
		}
		const sampled = scoreRecovery(jointCovariance(y, z, n, k, d), k, d);
		// Sample correlation SE ≈ (1 − ρ²)/√n ≤ 0.0023 here; 0.01 is > 4 SE.
		for (let t = 0; t < k * d; t++) expect(Math.abs(sampled.absCorr[t] - exact.absCorr[t])).toBeLessThan(0.01);
	});

	it('zero-variance components correlate 0 (documented answer)', () => {
		const n = 10;
		const z = sample(n, 1, 5);
		const y = new Float64Array(n);
		expect(mcc(y, z, n, 1, 1).mcc).toBe(0);
	});
});
