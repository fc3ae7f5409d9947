/**
 * Number formatting for the report, independent of the runtime's locale (so the same inputs
 * give the same bytes in Node, a worker and any browser): fixed decimals, a comma between
 * thousands from 10 000 up, a real minus sign, and "—" for null, undefined or non-finite values.
 */
export function formatNumber(x: number | null | undefined, decimals = 2): string {
	if (x === null || x === undefined || !Number.isFinite(x)) return '—';
	const fixed = Math.abs(x).toFixed(decimals);
	const [whole, frac] = fixed.split('.');
	const grouped = Math.abs(x) >= 10000 ? whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',') : whole;
	const negative = x < 0 && Number(fixed) !== 0;
	return (negative ? '−' : '') + grouped + (frac !== undefined ? '.' + frac : '');
}

/** An amount of money with two decimals and the currency code after it, e.g. "15,000.00 EUR". */
export function formatMoney(x: number | null | undefined, currency: string): string {
	const s = formatNumber(x, 2);
	return s === '—' ? s : `${s} ${currency}`;
}

/** A probability as a percentage with `decimals` decimals, e.g. 0.812 → "81 %". */
export function formatPercent(p: number | null | undefined, decimals = 0): string {
	const s = formatNumber(p === null || p === undefined ? p : p * 100, decimals);
	return s === '—' ? s : `${s} %`;
}
