// fraction.js is the rational type mathjs uses for its fractions; importing it directly avoids
// loading all of mathjs (seconds of start-up) in the command line and in workers.
import Fraction from 'fraction.js';
import { decimalParts } from './decimalParts';

export { Fraction };

/** Exact rational value of a plan number as written (e.g. 0.7 → 7/10), as a Fraction. */
export function exactFraction(x: number): Fraction {
	const { numerator, scale } = decimalParts(x);
	return new Fraction(numerator, 10n ** BigInt(scale));
}

/**
 * Rank of a dense rational matrix (`matrix[row][col]`, fraction.js Fractions as used by mathjs) by Gaussian
 * elimination in exact arithmetic. Does not mutate its input. Stops once the rank reaches `cap`.
 */
export function fractionRank(matrix: Fraction[][], cap = Infinity): number {
	const rows = matrix.length;
	if (rows === 0) return 0;
	const cols = matrix[0].length;
	const a = matrix.map((row) => row.slice());
	let rank = 0;
	for (let c = 0; c < cols && rank < rows && rank < cap; c++) {
		let piv = -1;
		for (let r = rank; r < rows; r++)
			if (!a[r][c].equals(0)) {
				piv = r;
				break;
			}
		if (piv < 0) continue;
		[a[rank], a[piv]] = [a[piv], a[rank]];
		const lead = a[rank][c];
		for (let r = rank + 1; r < rows; r++) {
			if (a[r][c].equals(0)) continue;
			const f = a[r][c].div(lead);
			for (let k = c; k < cols; k++) a[r][k] = a[r][k].sub(f.mul(a[rank][k]));
		}
		rank++;
	}
	return rank;
}
