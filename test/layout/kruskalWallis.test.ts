import { describe, expect, it } from 'vitest';
import { kruskalWallis } from '../../src/lib/core/layout';

describe('kruskalWallis', () => {
	// scipy.stats.kruskal docstring: x = [1,3,5,7,9], y = [2,4,6,8,10] →
	// statistic 0.2727272727272734, pvalue 0.6015081344405895.
	it('matches the scipy kruskal example without ties', () => {
		const r = kruskalWallis([
			[1, 3, 5, 7, 9],
			[2, 4, 6, 8, 10]
		]);
		expect(r.statistic).toBeCloseTo(0.2727272727272734, 12);
		expect(r.pValue).toBeCloseTo(0.6015081344405895, 10);
		expect(r.df).toBe(1);
	});
	// scipy.stats.kruskal docstring: x = [1,1,1], y = [2,2,2], z = [2,2] → statistic 7.0,
	// pvalue 0.0301973834223185 (needs the tie correction).
	it('matches the scipy kruskal example with ties', () => {
		const r = kruskalWallis([[1, 1, 1], [2, 2, 2], [2, 2]]);
		expect(r.statistic).toBeCloseTo(7, 12);
		expect(r.pValue).toBeCloseTo(0.0301973834223185, 10);
	});
	// scipy.stats.mstats.kruskal docstring (battery example): a = [6.3,5.4,5.7,5.2,5.0],
	// b = [6.9,7.0,6.1,7.9], c = [7.2,6.9,6.1,6.5] → 7.113812154696133, p 0.028526948491942164.
	it('matches the scipy mstats battery example', () => {
		const r = kruskalWallis([
			[6.3, 5.4, 5.7, 5.2, 5.0],
			[6.9, 7.0, 6.1, 7.9],
			[7.2, 6.9, 6.1, 6.5]
		]);
		expect(r.statistic).toBeCloseTo(7.113812154696133, 12);
		expect(r.pValue).toBeCloseTo(0.028526948491942164, 10);
		// η²_H = (H − k + 1)/(N − k) (Tomczak & Tomczak 2014, from memory): (7.1138 − 2)/10.
		expect(r.etaSquared).toBeCloseTo((7.113812154696133 - 2) / 10, 12);
	});
	it('degenerate input has the documented answer', () => {
		expect(kruskalWallis([[1, 2, 3]])).toMatchObject({ statistic: 0, df: 0, pValue: 1, etaSquared: 0 });
		expect(kruskalWallis([[4, 4], [4, 4]])).toMatchObject({ statistic: 0, pValue: 1 });
		expect(kruskalWallis([[1, 2], [], [3, 4]]).df).toBe(1);
		expect(() => kruskalWallis([[1, Infinity]])).toThrow(/finite/);
	});
});
