/**
 * Reference rank from the definition — the largest k with a nonzero k × k minor — with every
 * determinant computed by mathjs `det` on exact fractions (a general-purpose library from npm,
 * independent of the elimination code under test). Only for small matrices.
 */
import { det, fraction, type Fraction } from 'mathjs';

function subsets(n: number, k: number): number[][] {
	const out: number[][] = [];
	const rec = (start: number, acc: number[]) => {
		if (acc.length === k) return void out.push([...acc]);
		for (let i = start; i < n; i++) rec(i + 1, [...acc, i]);
	};
	rec(0, []);
	return out;
}

/** `m[row][col]` of integers or decimal numbers (converted exactly through their decimal text). */
export function referenceRank(m: number[][]): number {
	const rows = m.length;
	const cols = rows ? m[0].length : 0;
	const f: Fraction[][] = m.map((row) => row.map((x) => fraction(String(x))));
	for (let k = Math.min(rows, cols); k > 0; k--)
		for (const rs of subsets(rows, k))
			for (const cs of subsets(cols, k)) {
				const minor = rs.map((r) => cs.map((c) => f[r][c]));
				const value = k === 1 ? minor[0][0] : (det(minor) as unknown as Fraction);
				if (!fraction(value as Fraction).equals(0)) return k;
			}
	return 0;
}
