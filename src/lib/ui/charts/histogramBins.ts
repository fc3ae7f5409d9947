/**
 * Equal-width histogram bins for the charts.
 *
 * `bins` bins of width w = (hi − lo) / bins cover [lo, hi]; value v goes to bin
 * ⌊(v − lo) / w⌋, and v = hi goes to the last bin (every bin is half-open [a, b) except the
 * last, which is closed [a, b] — the convention of numpy.histogram and jStat.histogram).
 * Values below lo or above hi are counted in `below` / `above`; NaN and ±Infinity in `invalid`.
 */
export interface HistogramBins {
	lo: number;
	hi: number;
	width: number;
	/** counts[i] = values in [lo + i·w, lo + (i+1)·w) (the last bin includes hi). */
	counts: number[];
	below: number;
	above: number;
	invalid: number;
}

export function histogramBins(values: ArrayLike<number>, lo: number, hi: number, bins: number): HistogramBins {
	if (!Number.isInteger(bins) || bins < 1) throw new RangeError(`histogramBins: bins must be an integer ≥ 1, got ${bins}`);
	if (!Number.isFinite(lo) || !Number.isFinite(hi) || !(lo < hi)) throw new RangeError(`histogramBins: expected finite lo < hi, got lo = ${lo}, hi = ${hi}`);
	const width = (hi - lo) / bins;
	const counts = new Array<number>(bins).fill(0);
	let below = 0;
	let above = 0;
	let invalid = 0;
	for (let i = 0; i < values.length; i++) {
		const v = values[i];
		if (!Number.isFinite(v)) invalid++;
		else if (v < lo) below++;
		else if (v > hi) above++;
		else counts[Math.min(Math.floor((v - lo) / width), bins - 1)]++;
	}
	return { lo, hi, width, counts, below, above, invalid };
}

/**
 * A bin range aligned to steps of 1 / `perUnit` that holds every finite value, e.g. with
 * perUnit = 40 the edges are multiples of 0.025. `floor` and `ceil` clamp the range (MCC lives
 * in [0, 1]). With no finite value, or all values equal, the range is one step wide.
 */
export function alignedRange(values: ArrayLike<number>, perUnit: number, floor = -Infinity, ceil = Infinity): { lo: number; hi: number; bins: number } {
	if (!Number.isInteger(perUnit) || perUnit < 1) throw new RangeError(`alignedRange: perUnit must be an integer ≥ 1, got ${perUnit}`);
	let min = Infinity;
	let max = -Infinity;
	for (let i = 0; i < values.length; i++) {
		const v = values[i];
		if (!Number.isFinite(v)) continue;
		if (v < min) min = v;
		if (v > max) max = v;
	}
	if (min > max) {
		min = Number.isFinite(floor) ? floor : 0;
		max = min;
	}
	let a = Math.floor(Math.max(min, floor) * perUnit);
	let b = Math.ceil(Math.min(max, ceil) * perUnit);
	if (b <= a) {
		if (Number.isFinite(ceil) && (a + 1) / perUnit > ceil) a = b - 1;
		else b = a + 1;
	}
	return { lo: a / perUnit, hi: b / perUnit, bins: b - a };
}
