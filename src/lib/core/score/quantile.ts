/**
 * Sample quantile by linear interpolation between order statistics, definition 7 of Hyndman &
 * Fan (1996, The American Statistician 50:361–365): h = (n − 1)·q, x₍⌊h⌋₎ + (h − ⌊h⌋)(x₍⌊h⌋+1₎ − x₍⌊h⌋₎)
 * on 0-based sorted values. Empty input gives NaN. The input is not modified.
 */
export function quantile(values: ArrayLike<number>, q: number): number {
	if (!(q >= 0 && q <= 1)) throw new RangeError(`quantile: q must be in [0, 1], got ${q}`);
	const sorted = Float64Array.from(values).sort();
	return quantileSorted(sorted, q);
}

/** Same on values already sorted ascending. */
export function quantileSorted(sorted: ArrayLike<number>, q: number): number {
	const n = sorted.length;
	if (n === 0) return NaN;
	const h = (n - 1) * q;
	const lo = Math.floor(h);
	const hi = Math.min(lo + 1, n - 1);
	return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}
