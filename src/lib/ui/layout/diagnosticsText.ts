/** Small text helpers of the layout diagnostics panel. */

/** A p-value for display: three decimals, or "< 0.001" style scientific notation below 0.001. */
export function pValueText(p: number): string {
	if (!Number.isFinite(p)) return '—';
	if (p < 0.001) return p === 0 ? '< 1e-300' : p.toExponential(1);
	return p.toFixed(3);
}

/** A share in [0, 1] as a whole percentage, e.g. 0.875 → "88%". */
export function shareText(x: number): string {
	return `${Math.round(x * 100)}%`;
}
