import pkg from 'jstat';
const { jStat } = pkg;

export interface ChiSquareResult {
	/** Pearson's X² = Σ (O − E)² / E with E = row total × column total / N (no continuity correction). */
	statistic: number;
	/** (r − 1)(c − 1) over the rows and columns with a non-zero total. */
	df: number;
	/** Upper-tail probability of X² under χ²(df), from jStat; 1 when df = 0. */
	pValue: number;
	/** Cramér's V = √(X² / (N · min(r − 1, c − 1))); 0 when min(r − 1, c − 1) = 0. */
	cramersV: number;
	/**
	 * Bias-corrected Cramér's V (Bergsma 2013): φ̃² = max(0, φ² − (r−1)(c−1)/(N−1)),
	 * r̃ = r − (r−1)²/(N−1), c̃ = c − (c−1)²/(N−1), Ṽ = √(φ̃² / min(r̃−1, c̃−1)). Plain V is
	 * inflated for sparse tables (a few wells per group); Ṽ is near 0 when there is no association.
	 */
	cramersVCorrected: number;
	/** Total count N. */
	n: number;
}

/**
 * Pearson chi-square test of independence for a contingency table of counts and Cramér's V
 * (Cramér 1946). Rows and columns whose total is zero are dropped before counting degrees of
 * freedom. The chi-square p-value is an approximation that is poor when many expected counts are
 * below 5 (common practice) — layout tables are often that sparse, so read it as a screening
 * figure. Throws on negative or non-finite counts and ragged tables.
 */
export function chiSquareIndependence(table: readonly (readonly number[])[]): ChiSquareResult {
	const r = table.length;
	const c = r > 0 ? table[0].length : 0;
	const rowTot = new Float64Array(r);
	const colTot = new Float64Array(c);
	for (let i = 0; i < r; i++) {
		if (table[i].length !== c) throw new RangeError(`contingency table rows must have equal length: row ${i} has ${table[i].length}, row 0 has ${c}`);
		for (let j = 0; j < c; j++) {
			const v = table[i][j];
			if (!Number.isFinite(v) || v < 0) throw new RangeError(`contingency table counts must be finite and ≥ 0, got ${v} at [${i}][${j}]`);
			rowTot[i] += v;
			colTot[j] += v;
		}
	}
	let n = 0;
	for (let i = 0; i < r; i++) n += rowTot[i];
	const rows = [...rowTot].filter((t) => t > 0).length;
	const cols = [...colTot].filter((t) => t > 0).length;
	const df = rows > 0 && cols > 0 ? (rows - 1) * (cols - 1) : 0;
	let x2 = 0;
	if (n > 0) {
		for (let i = 0; i < r; i++) {
			if (rowTot[i] === 0) continue;
			for (let j = 0; j < c; j++) {
				if (colTot[j] === 0) continue;
				const e = (rowTot[i] * colTot[j]) / n;
				const d = table[i][j] - e;
				x2 += (d * d) / e;
			}
		}
	}
	const k = Math.min(rows - 1, cols - 1);
	const pValue = df > 0 ? Math.min(1, Math.max(0, 1 - jStat.chisquare.cdf(x2, df))) : 1;
	const cramersV = k > 0 && n > 0 ? Math.min(1, Math.sqrt(x2 / (n * k))) : 0;
	let cramersVCorrected = 0;
	if (k > 0 && n > 1) {
		const phi2 = Math.max(0, x2 / n - ((rows - 1) * (cols - 1)) / (n - 1));
		const kc = Math.min(rows - (rows - 1) ** 2 / (n - 1), cols - (cols - 1) ** 2 / (n - 1)) - 1;
		cramersVCorrected = kc > 0 ? Math.min(1, Math.sqrt(phi2 / kc)) : 0;
	}
	return { statistic: x2, df, pValue, cramersV, cramersVCorrected, n };
}
