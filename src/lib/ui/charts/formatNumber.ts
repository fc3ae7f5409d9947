/** Number texts shared by the charts and the result sections. */

/** `x` with `digits` decimals, or "—" when it is not a finite number. */
export function fixed(x: number | null | undefined, digits = 3): string {
	return typeof x === 'number' && Number.isFinite(x) ? x.toFixed(digits) : '—';
}

/** A share in [0, 1] as a percentage with `digits` decimals, e.g. 0.515 → "51.5 %". */
export function percent(x: number | null | undefined, digits = 1): string {
	return typeof x === 'number' && Number.isFinite(x) ? `${(100 * x).toFixed(digits)} %` : '—';
}

/** A whole number with thousands separators, e.g. 4875 → "4,875". */
export function count(n: number): string {
	return Number.isFinite(n) ? Math.round(n).toLocaleString('en-GB') : '—';
}
