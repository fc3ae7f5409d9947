/**
 * Exact decimal value of a finite double as written in a plan file: `x = numerator / 10^scale`.
 * Uses the shortest round-trip decimal representation (`String(x)`), which is the number the
 * user typed for every value read from JSON. Exponent forms such as `1.5e-7` are handled.
 */
export function decimalParts(x: number): { numerator: bigint; scale: number } {
	if (!Number.isFinite(x)) throw new RangeError(`decimalParts: expected a finite number, got ${x}`);
	const text = String(x);
	const match = /^(-?)(\d+)(?:\.(\d+))?(?:e([+-]?\d+))?$/.exec(text);
	if (!match) throw new RangeError(`decimalParts: cannot read ${text} as a decimal`);
	const [, sign, whole, frac = '', exp = '0'] = match;
	let digits = BigInt(whole + frac);
	let scale = frac.length - Number(exp);
	if (scale < 0) {
		digits *= 10n ** BigInt(-scale);
		scale = 0;
	}
	return { numerator: sign === '-' ? -digits : digits, scale };
}
