import { describe, expect, it } from 'vitest';
import pkg from 'jstat';
import { wilson, Z_95 } from '../../src/lib/core/score';

const { jStat } = pkg;

describe('wilson', () => {
	// Source for all three: Wilson (1927), JASA 22:209–212, examples in REFERENCES.md (verified).
	it('5 of 10 at 90 % gives 0.2692718 – 0.7307282', () => {
		const r = wilson(5, 10, 1.644853627);
		expect(r.p).toBe(0.5);
		expect(r.lo).toBeCloseTo(0.2692718, 6);
		expect(r.hi).toBeCloseTo(0.7307282, 6);
	});
	it('32 of 32 at 95 % gives 0.8928208 – 1', () => {
		const r = wilson(32, 32);
		expect(r.lo).toBeCloseTo(0.8928208, 6);
		expect(r.hi).toBe(1);
	});
	it('0 of 32 at 95 % gives 0 – 0.1071792', () => {
		const r = wilson(0, 32);
		expect(r.lo).toBe(0);
		expect(r.hi).toBeCloseTo(0.1071792, 6);
	});
	it('uses Φ⁻¹(0.975) = 1.959963985 by default, as jstat computes it', () => {
		// Source: REFERENCES.md "Distribution quantiles" (computed, matched against printed tables); reference library jstat.
		expect(Z_95).toBeCloseTo(jStat.normal.inv(0.975, 0, 1), 8);
		expect(jStat.normal.inv(0.975, 0, 1)).toBeCloseTo(1.959963985, 8);
	});
	it('the interval always contains p̂ and lies in [0, 1]', () => {
		for (let n = 1; n <= 40; n++)
			for (let s = 0; s <= n; s++) {
				const r = wilson(s, n);
				expect(r.lo).toBeLessThanOrEqual(r.p + 1e-15);
				expect(r.hi).toBeGreaterThanOrEqual(r.p - 1e-15);
				expect(r.lo).toBeGreaterThanOrEqual(0);
				expect(r.hi).toBeLessThanOrEqual(1);
			}
	});
	it('n = 0 has the documented answer and bad counts throw', () => {
		expect(wilson(0, 0)).toEqual({ p: NaN, lo: 0, hi: 1 });
		expect(() => wilson(3, 2)).toThrow(/successes must be an integer in \[0, 2\]/);
		expect(() => wilson(1, 2.5)).toThrow(/n must be an integer/);
	});
});
