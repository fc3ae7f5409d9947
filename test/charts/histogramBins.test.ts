/**
 * histogramBins / alignedRange: the bin convention of the MCC histogram, checked against
 * numpy.histogram's documented examples and against jStat.histogram (npm jstat 1.9.6).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import pkg from 'jstat';
import { alignedRange, histogramBins } from '../../src/lib/ui/charts/histogramBins';

const { jStat } = pkg;

describe('histogramBins', () => {
	it('matches the numpy.histogram documentation examples', () => {
		// numpy.histogram reference page, "Examples": np.histogram([1, 2, 1], bins=[0, 1, 2, 3]) → [0, 2, 1]
		expect(histogramBins([1, 2, 1], 0, 3, 3).counts).toEqual([0, 2, 1]);
		// same page: np.histogram([[1, 2, 1], [1, 0, 1]], bins=[0, 1, 2, 3]) → [1, 4, 1]
		expect(histogramBins([1, 2, 1, 1, 0, 1], 0, 3, 3).counts).toEqual([1, 4, 1]);
		// same page: np.histogram(np.arange(5), density=True) gives 0.5 in bins 0, 2, 5, 7, 9 of ten bins
		// over [0, 4] (width 0.4); counts = density × 5 values × 0.4 = 1 in those bins.
		expect(histogramBins([0, 1, 2, 3, 4], 0, 4, 10).counts).toEqual([1, 0, 1, 0, 0, 1, 0, 1, 0, 1]);
	});

	it('closes the last bin at hi and half-opens the others (numpy.histogram notes)', () => {
		// numpy: "All but the last (righthand-most) bin is half-open … the last bin is [3, 4], which includes 4."
		expect(histogramBins([1, 2, 3, 4], 1, 4, 3).counts).toEqual([1, 1, 2]);
	});

	it('agrees with jStat.histogram over [min, max] for random data', () => {
		fc.assert(
			fc.property(fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 2, maxLength: 300 }), fc.integer({ min: 1, max: 40 }), (values, bins) => {
				const lo = Math.min(...values);
				const hi = Math.max(...values);
				fc.pre(lo < hi);
				const ours = histogramBins(values, lo, hi, bins);
				expect(ours.counts).toEqual(jStat.histogram(values, bins));
				expect(ours.below + ours.above + ours.invalid).toBe(0);
			})
		);
	});

	it('counts values outside the range and non-finite values apart', () => {
		const out = histogramBins([-1, 0, 0.5, 1, 2, NaN, Infinity], 0, 1, 2);
		expect(out).toEqual({ lo: 0, hi: 1, width: 0.5, counts: [1, 2], below: 1, above: 1, invalid: 2 });
	});

	it('does not mutate its input and throws on caller mistakes', () => {
		const values = [0.3, 0.1, 0.2];
		histogramBins(values, 0, 1, 4);
		expect(values).toEqual([0.3, 0.1, 0.2]);
		expect(() => histogramBins(values, 0, 1, 0)).toThrow(/bins must be an integer ≥ 1, got 0/);
		expect(() => histogramBins(values, 1, 1, 3)).toThrow(/finite lo < hi/);
		expect(() => histogramBins(values, 0, NaN, 3)).toThrow(/finite lo < hi/);
	});
});

describe('alignedRange', () => {
	it('aligns to steps of 1/perUnit and holds every finite value', () => {
		fc.assert(
			fc.property(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 100 }), fc.integer({ min: 1, max: 100 }), (values, perUnit) => {
				const r = alignedRange(values, perUnit, 0, 1);
				expect(r.lo).toBeGreaterThanOrEqual(0);
				expect(r.hi).toBeLessThanOrEqual(1);
				expect(r.bins).toBe(Math.round((r.hi - r.lo) * perUnit));
				expect(r.bins).toBeGreaterThanOrEqual(1);
				const binned = histogramBins(values, r.lo, r.hi, r.bins);
				expect(binned.below + binned.above).toBe(0);
			})
		);
	});

	it('gives MCC-style ranges in steps of 0.025 (common practice for a 0–1 score)', () => {
		expect(alignedRange([0.61, 0.9, 0.97], 40, 0, 1)).toEqual({ lo: 0.6, hi: 0.975, bins: 15 });
		// all values equal to the ceiling: one step below it
		expect(alignedRange([1, 1], 40, 0, 1)).toEqual({ lo: 0.975, hi: 1, bins: 1 });
		// no finite value: one step from the floor
		expect(alignedRange([NaN], 40, 0, 1)).toEqual({ lo: 0, hi: 0.025, bins: 1 });
	});
});
