import pkg from 'jstat';
const { jStat } = pkg;

export interface KruskalWallisResult {
	/** Tie-corrected H (Kruskal & Wallis 1952): [12/(N(N+1)) Σ R_g²/n_g − 3(N+1)] / (1 − Σ(t³ − t)/(N³ − N)). */
	statistic: number;
	/** Number of non-empty groups − 1. */
	df: number;
	/** Upper-tail probability of H under χ²(df), from jStat; 1 when df = 0 or all values tie. */
	pValue: number;
	/** Rank-based effect size η²_H = (H − k + 1)/(N − k) (Tomczak & Tomczak 2014), clamped to [0, 1]; 0 when N = k. */
	etaSquared: number;
	n: number;
}

/**
 * Kruskal–Wallis H test of whether several samples come from the same distribution, with the
 * correction for ties; mid-ranks for tied values. Empty samples are ignored. Throws on
 * non-finite values.
 */
export function kruskalWallis(samples: readonly (readonly number[])[]): KruskalWallisResult {
	const groups = samples.filter((s) => s.length > 0);
	const k = groups.length;
	const n = groups.reduce((s, g) => s + g.length, 0);
	const values = new Float64Array(n);
	const owner = new Int32Array(n);
	let at = 0;
	groups.forEach((g, gi) => {
		for (const v of g) {
			if (!Number.isFinite(v)) throw new RangeError(`Kruskal–Wallis values must be finite, got ${v} in sample ${gi}`);
			values[at] = v;
			owner[at++] = gi;
		}
	});
	const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => values[a] - values[b]);
	const rankSum = new Float64Array(k);
	let tieTerm = 0;
	for (let i = 0; i < n; ) {
		let j = i;
		while (j + 1 < n && values[order[j + 1]] === values[order[i]]) j++;
		const t = j - i + 1;
		const midRank = (i + j) / 2 + 1;
		for (let q = i; q <= j; q++) rankSum[owner[order[q]]] += midRank;
		tieTerm += t * t * t - t;
		i = j + 1;
	}
	const df = Math.max(0, k - 1);
	if (k < 2 || n < 2) return { statistic: 0, df, pValue: 1, etaSquared: 0, n };
	let s = 0;
	groups.forEach((g, gi) => (s += (rankSum[gi] * rankSum[gi]) / g.length));
	const h0 = (12 / (n * (n + 1))) * s - 3 * (n + 1);
	const correction = 1 - tieTerm / (n * n * n - n);
	if (correction <= 0) return { statistic: 0, df, pValue: 1, etaSquared: 0, n };
	const h = Math.max(0, h0 / correction);
	const pValue = Math.min(1, Math.max(0, 1 - jStat.chisquare.cdf(h, df)));
	const etaSquared = n > k ? Math.min(1, Math.max(0, (h - k + 1) / (n - k))) : 0;
	return { statistic: h, df, pValue, etaSquared, n };
}
