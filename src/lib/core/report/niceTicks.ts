/**
 * Tick values for a chart axis: multiples of a step of 1, 2 or 5 × 10^k covering [lo, hi],
 * the step chosen by `niceStep` (about `count` ticks inside the range, little overshoot). Each value is
 * computed as an integer times the step's mantissa and power of ten separately, so 0.1 + 0.2
 * rounding noise never shows (0.3, not 0.30000000000000004). Degenerate input has a documented
 * answer: lo = hi gives [lo]; non-finite bounds or count < 1 throw a RangeError.
 */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
	if (!Number.isFinite(lo) || !Number.isFinite(hi)) throw new RangeError(`lo and hi must be finite numbers, got ${lo} and ${hi}`);
	if (!(Number.isInteger(count) && count >= 1)) throw new RangeError(`count must be an integer ≥ 1, got ${count}`);
	if (lo > hi) [lo, hi] = [hi, lo];
	if (lo === hi) return [lo];
	const { mantissa, exponent } = niceStep(lo, hi, count);
	const scaled = (i: number) => (exponent >= 0 ? i * mantissa * 10 ** exponent : (i * mantissa) / 10 ** -exponent);
	const step = scaled(1);
	const first = Math.floor(lo / step + 1e-9);
	const last = Math.ceil(hi / step - 1e-9);
	const out: number[] = [];
	for (let i = first; i <= last; i++) out.push(scaled(i) + 0); // + 0 turns −0 into 0
	return out;
}

/**
 * The step m × 10^e (m ∈ {1, 2, 5}) for [lo, hi]: the one whose count of ticks inside [lo, hi]
 * is closest to `count`, plus a penalty for how far the covering ticks overshoot the range
 * (extent / span − 1), so a step much coarser than the range never wins. Ties: the larger step.
 */
export function niceStep(lo: number, hi: number, count: number): { mantissa: 1 | 2 | 5; exponent: number; step: number } {
	const span = hi - lo;
	const e0 = Math.floor(Math.log10(span / count));
	let best = { mantissa: 1 as 1 | 2 | 5, exponent: e0, miss: Infinity };
	for (let e = e0 - 1; e <= e0 + 1; e++)
		for (const m of [1, 2, 5] as const) {
			const step = m * 10 ** e;
			const first = Math.floor(lo / step + 1e-9);
			const last = Math.ceil(hi / step - 1e-9);
			const inner = Math.floor(hi / step + 1e-9) - Math.ceil(lo / step - 1e-9) + 1;
			const miss = Math.abs(inner - count) + ((last - first) * step) / span - 1;
			// Candidates come in increasing step order, so `<=` keeps the larger step on ties.
			if (miss <= best.miss + 1e-12) best = { mantissa: m, exponent: e, miss };
		}
	return { mantissa: best.mantissa, exponent: best.exponent, step: best.mantissa * 10 ** best.exponent };
}

/** Decimals needed to show ticks at the step of `ticks` exactly (0 for steps ≥ 1). */
export function tickDecimals(ticks: readonly number[]): number {
	if (ticks.length < 2) return ticks.length && !Number.isInteger(ticks[0]) ? 2 : 0;
	const step = Math.abs(ticks[1] - ticks[0]);
	return Math.max(0, Math.ceil(-Math.log10(step) - 1e-9));
}
