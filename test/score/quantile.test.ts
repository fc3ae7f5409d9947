import { describe, expect, it } from 'vitest';
import pkg from 'jstat';
import { quantile } from '../../src/lib/core/score';

const { jStat } = pkg;

describe('quantile (Hyndman & Fan 1996, definition 7)', () => {
	it('interpolates between order statistics as definition 7 prescribes', () => {
		// Worked by hand from the definition: sorted [1, 2, 3, 4, 10], q = 0.1 → h = 0.4 → 1 + 0.4·(2 − 1) = 1.4;
		// q = 0.9 → h = 3.6 → 4 + 0.6·(10 − 4) = 7.6; median = 3.
		const x = [10, 3, 1, 4, 2];
		expect(quantile(x, 0.1)).toBeCloseTo(1.4, 12);
		expect(quantile(x, 0.5)).toBe(3);
		expect(quantile(x, 0.9)).toBeCloseTo(7.6, 12);
		expect(x).toEqual([10, 3, 1, 4, 2]); // input not mutated
	});
	it('agrees with jstat.quantiles with plotting positions (alphap, betap) = (1, 1), which is definition 7, on random data', () => {
		// Reference library: jstat 1.9.6 jStat.quantiles(arr, [q], 1, 1) (the scipy mquantiles convention; (1, 1) = Hyndman–Fan 7).
		let s = 7;
		const rnd = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296);
		for (let t = 0; t < 50; t++) {
			const n = 1 + (t % 17);
			const x = Array.from({ length: n }, rnd);
			for (const q of [0.1, 0.25, 0.5, 0.9]) expect(quantile(x, q)).toBeCloseTo(n === 1 ? x[0] : jStat.quantiles(x, [q], 1, 1)[0], 12);
		}
	});
	it('empty input gives NaN; q outside [0, 1] throws', () => {
		expect(quantile([], 0.5)).toBeNaN();
		expect(() => quantile([1], 1.5)).toThrow(/q must be in \[0, 1\]/);
	});
	it('jstat reproduces the distribution quantiles of REFERENCES.md used elsewhere in the planner', () => {
		// Source: REFERENCES.md "Distribution quantiles" (computed; matched against printed tables).
		expect(jStat.normal.inv(0.95, 0, 1)).toBeCloseTo(1.644853627, 8);
		expect(jStat.normal.inv(0.995, 0, 1)).toBeCloseTo(2.575829304, 8);
		expect(jStat.chisquare.inv(0.95, 1)).toBeCloseTo(3.841458821, 6);
		expect(jStat.chisquare.inv(0.95, 10)).toBeCloseTo(18.30703805, 6);
		expect(jStat.studentt.inv(0.975, 10)).toBeCloseTo(2.228138852, 6);
	});
});
