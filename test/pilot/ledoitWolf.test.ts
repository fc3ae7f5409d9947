import { describe, expect, it } from 'vitest';
import { ledoitWolfShrinkage } from '../../src/lib/core/pilot';
import { rngFor } from '../../src/lib/core/simulate/rng';

describe('ledoitWolfShrinkage (Ledoit & Wolf 2004, Lemma 3.2 and Theorem 3.4)', () => {
	it('worked example computed by hand from the paper’s formulas: ρ = 0.53125 / 0.5625 = 0.94444', () => {
		// Rows (1,0), (−1,0), (0,2), (0,−2): S = diag(0.5, 2), μ = 1.25, δ² = 0.5625,
		// each ‖xₖxₖᵀ − S‖² = 2.125, β̄² = 4·2.125/16 = 0.53125 < δ².
		const x = Float64Array.from([1, 0, -1, 0, 0, 2, 0, -2]);
		for (const via of ['covariance', 'gram'] as const) {
			const r = ledoitWolfShrinkage(x, 4, 2, via);
			expect(r.mu).toBeCloseTo(1.25, 12);
			expect(r.shrinkage).toBeCloseTo(0.53125 / 0.5625, 12);
		}
	});

	it('the covariance and Gram paths agree on random data (p < n and p > n)', () => {
		for (const [n, p] of [
			[30, 8],
			[8, 30]
		]) {
			const rng = rngFor(4, n, p);
			const x = Float64Array.from({ length: n * p }, () => rng.normal() * (1 + rng.next()));
			const a = ledoitWolfShrinkage(x, n, p, 'covariance');
			const b = ledoitWolfShrinkage(x, n, p, 'gram');
			expect(a.shrinkage).toBeCloseTo(b.shrinkage, 10);
			expect(a.mu).toBeCloseTo(b.mu, 10);
			expect(a.shrinkage).toBeGreaterThanOrEqual(0);
			expect(a.shrinkage).toBeLessThanOrEqual(1);
		}
	});

	it('shrinks less as the sample grows for the same population (consistency of the estimator)', () => {
		const draw = (n: number) => {
			const rng = rngFor(9, n);
			const p = 20;
			const x = Float64Array.from({ length: n * p }, (_, i) => rng.normal() * Math.sqrt(1 + (i % p) / 4));
			return ledoitWolfShrinkage(x, n, p).shrinkage;
		};
		const small = draw(15);
		const large = draw(2000);
		expect(large).toBeLessThan(small);
		expect(large).toBeLessThan(0.1);
		expect(small).toBeGreaterThan(0.3);
	});

	it('a sample covariance that is already a multiple of I gives ρ = 1; empty input gives 0', () => {
		expect(ledoitWolfShrinkage(Float64Array.from([1, 0, 0, 1, -1, 0, 0, -1]), 4, 2).shrinkage).toBe(1);
		expect(ledoitWolfShrinkage(new Float64Array(0), 0, 3).shrinkage).toBe(0);
		expect(() => ledoitWolfShrinkage(new Float64Array(3), 2, 2)).toThrow(/needs 4 entries/);
	});
});
