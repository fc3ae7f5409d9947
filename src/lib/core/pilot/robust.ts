/** Scale factor making the MAD a consistent estimator of the SD for normal data: 1/Φ⁻¹(3/4). */
export const MAD_TO_SD = 1.482602218505602;

/** Median of `values` (NaN when empty); the input is not modified. */
export function median(values: ArrayLike<number>): number {
	const n = values.length;
	if (n === 0) return NaN;
	const s = Float64Array.from(values).sort();
	const h = n >> 1;
	return n % 2 ? s[h] : (s[h - 1] + s[h]) / 2;
}

/** Median absolute deviation from `center` (default: the median), unscaled. */
export function mad(values: ArrayLike<number>, center = median(values)): number {
	const d = new Float64Array(values.length);
	for (let i = 0; i < values.length; i++) d[i] = Math.abs(values[i] - center);
	return median(d);
}

/** Mean and sample variance (n − 1) by Welford's update; variance NaN for fewer than 2 values. */
export function meanVariance(values: ArrayLike<number>): { mean: number; variance: number } {
	let mean = 0;
	let m2 = 0;
	for (let i = 0; i < values.length; i++) {
		const delta = values[i] - mean;
		mean += delta / (i + 1);
		m2 += delta * (values[i] - mean);
	}
	return { mean: values.length ? mean : NaN, variance: values.length > 1 ? m2 / (values.length - 1) : NaN };
}

/** Upper quantile by the nearest-rank rule: the ⌈q·n⌉-th smallest value (NaN when empty). */
export function nearestRankQuantile(values: ArrayLike<number>, q: number): number {
	const n = values.length;
	if (n === 0) return NaN;
	const s = Float64Array.from(values).sort();
	return s[Math.min(n - 1, Math.max(0, Math.ceil(q * n) - 1))];
}

/** Pearson correlation of two equal-length vectors (NaN when either is constant). */
export function pearson(a: ArrayLike<number>, b: ArrayLike<number>): number {
	const n = a.length;
	let ma = 0;
	let mb = 0;
	for (let i = 0; i < n; i++) {
		ma += a[i];
		mb += b[i];
	}
	ma /= n;
	mb /= n;
	let sab = 0;
	let saa = 0;
	let sbb = 0;
	for (let i = 0; i < n; i++) {
		const x = a[i] - ma;
		const y = b[i] - mb;
		sab += x * y;
		saa += x * x;
		sbb += y * y;
	}
	return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : NaN;
}
