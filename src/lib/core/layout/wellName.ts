/**
 * ANSI/SLAS 4-2004 well names: a row label (A…Z, then AA…AF on 1536-well plates) followed by
 * the 1-based column number, e.g. `A1`, `P24`, `AF48`. Rows past Z continue as AA, AB, … (the
 * convention used on 1536-well plates); the general rule is bijective base 26, so row 52 is BA.
 */

/** Row label for a 0-based row index: 0 → "A", 25 → "Z", 26 → "AA", 31 → "AF". */
export function rowLabel(row0: number): string {
	if (!Number.isSafeInteger(row0) || row0 < 0) throw new RangeError(`row0 must be an integer ≥ 0, got ${row0}`);
	let n = row0 + 1;
	let label = '';
	while (n > 0) {
		const r = (n - 1) % 26;
		label = String.fromCharCode(65 + r) + label;
		n = Math.floor((n - 1) / 26);
	}
	return label;
}

/** Well name for 0-based row and column: (0, 0) → "A1", (15, 23) → "P24". No zero padding. */
export function wellName(row0: number, col0: number): string {
	if (!Number.isSafeInteger(col0) || col0 < 0) throw new RangeError(`col0 must be an integer ≥ 0, got ${col0}`);
	return rowLabel(row0) + String(col0 + 1);
}

/**
 * Parses a well name into 0-based indices. Accepts upper or lower case and zero-padded
 * columns ("a01", "AF48"); throws a RangeError naming the input otherwise.
 */
export function parseWellName(name: string): { row0: number; col0: number } {
	const m = typeof name === 'string' ? /^([A-Za-z]{1,3})0*([1-9][0-9]{0,3})$/.exec(name.trim()) : null;
	if (!m) throw new RangeError(`well name must be row letters followed by a column number (e.g. "B7", "AF48"), got ${JSON.stringify(name)}`);
	let row = 0;
	for (const ch of m[1].toUpperCase()) row = row * 26 + (ch.charCodeAt(0) - 64);
	return { row0: row - 1, col0: Number(m[2]) - 1 };
}
