import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { linearSumAssignment } from 'linear-sum-assignment';
import { fraction } from 'mathjs';
import { fractionRank, maximumMatching, modularRank, PRIME_A, PRIME_B, structuralNullSupport } from '../../src/lib/core/identify';
import { invMod, mulMod, residue } from '../../src/lib/core/identify/modularRank';
import { peelRank } from '../../src/lib/core/identify/peelRank';
import { decimalParts } from '../../src/lib/core/identify/decimalParts';
import { referenceRank } from './referenceRank';

const isPrimeByTrialDivision = (n: number) => {
	if (n < 2) return false;
	for (let k = 2; k * k <= n; k++) if (n % k === 0) return false;
	return true;
};

/** Random small integer matrix (rows × cols, entries in [−lim, lim], many zeros so singular cases are common). */
const smallMatrix = fc
	.record({ rows: fc.integer({ min: 1, max: 4 }), cols: fc.integer({ min: 1, max: 5 }), lim: fc.integer({ min: 1, max: 3 }) })
	.chain(({ rows, cols, lim }) => fc.array(fc.array(fc.integer({ min: -lim, max: lim }), { minLength: cols, maxLength: cols }), { minLength: rows, maxLength: rows }));

const columnsOf = (m: number[][], p: number) =>
	m[0].map((_, c) => {
		const rows: number[] = [];
		const values: number[] = [];
		m.forEach((row, r) => {
			if (row[c] !== 0) {
				rows.push(r);
				values.push(residue(BigInt(row[c]), p));
			}
		});
		return { rows, values };
	});

describe('modular arithmetic', () => {
	it('the two primes are prime: 2^31 − 1 (Mersenne prime, known since Euler 1772 — from memory) and 2^31 − 19, both by trial division', () => {
		expect(PRIME_A).toBe(2 ** 31 - 1);
		expect(PRIME_B).toBe(2 ** 31 - 19);
		expect(isPrimeByTrialDivision(PRIME_A)).toBe(true);
		expect(isPrimeByTrialDivision(PRIME_B)).toBe(true);
	});

	it('mulMod equals BigInt arithmetic (exact reference) for residues near 2^31', () => {
		fc.assert(
			fc.property(fc.integer({ min: 0, max: PRIME_A - 1 }), fc.integer({ min: 0, max: PRIME_A - 1 }), fc.constantFrom(PRIME_A, PRIME_B), (a, b, p) => {
				const x = a % p;
				const y = b % p;
				expect(mulMod(x, y, p)).toBe(Number((BigInt(x) * BigInt(y)) % BigInt(p)));
			}),
			{ numRuns: 2000 }
		);
		expect(mulMod(PRIME_A - 1, PRIME_A - 1, PRIME_A)).toBe(1); // (−1)² = 1
	});

	it('invMod gives a·a⁻¹ ≡ 1 and refuses 0', () => {
		fc.assert(
			fc.property(fc.integer({ min: 1, max: PRIME_B - 1 }), (a) => {
				expect(Number((BigInt(a) * BigInt(invMod(a, PRIME_B))) % BigInt(PRIME_B))).toBe(1);
			})
		);
		expect(() => invMod(0, PRIME_A)).toThrow(/no inverse/);
	});

	it('decimalParts reads plan numbers exactly, including exponent forms', () => {
		expect(decimalParts(0.7)).toEqual({ numerator: 7n, scale: 1 });
		expect(decimalParts(-1.25)).toEqual({ numerator: -125n, scale: 2 });
		expect(decimalParts(1.5e-7)).toEqual({ numerator: 15n, scale: 8 });
		expect(decimalParts(3e21)).toEqual({ numerator: 3000000000000000000000n, scale: 0 });
		expect(decimalParts(0)).toEqual({ numerator: 0n, scale: 0 });
		expect(() => decimalParts(NaN)).toThrow(/finite/);
	});
});

describe('exact rank: modular and fraction elimination agree with the definition (mathjs det of minors)', () => {
	it('on random small integer matrices', () => {
		fc.assert(
			fc.property(smallMatrix, (m) => {
				const ref = referenceRank(m);
				expect(modularRank(m.length, columnsOf(m, PRIME_A), PRIME_A)).toBe(ref);
				expect(modularRank(m.length, columnsOf(m, PRIME_B), PRIME_B)).toBe(ref);
				expect(fractionRank(m.map((row) => row.map((x) => fraction(x))))).toBe(ref);
			}),
			{ numRuns: 300 }
		);
	});

	it('peeling singletons then eliminating the core gives the same rank', () => {
		fc.assert(
			fc.property(smallMatrix, (m) => {
				const rows = m.length;
				const cols = m[0].length;
				const colRows = m[0].map((_, c) => m.map((_, r) => r).filter((r) => m[r][c] !== 0));
				const rowCols = m.map((row) => row.map((_, c) => c).filter((c) => row[c] !== 0));
				const peel = peelRank(rows, colRows, rowCols, new Uint8Array(cols).fill(1));
				const core = peel.coreRows.map((r) => peel.coreCols.map((c) => m[r][c]));
				const coreRank = core.length && core[0].length ? referenceRank(core) : 0;
				expect(peel.peeled + coreRank).toBe(referenceRank(m));
			}),
			{ numRuns: 300 }
		);
	});

	it('a singular 2 × 2 example: [[2, 4], [1, 2]] has rank 1 (hand calculation: det = 2·2 − 4·1 = 0)', () => {
		expect(modularRank(2, columnsOf([[2, 4], [1, 2]], PRIME_A), PRIME_A)).toBe(1);
		expect(fractionRank([[fraction(2), fraction(4)], [fraction(1), fraction(2)]])).toBe(1);
	});
});

describe('maximum matching (structural rank)', () => {
	it('matches the maximum matching from the npm reference assignment solver linear-sum-assignment', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 1, max: 7 }),
				fc.integer({ min: 1, max: 9 }),
				fc.array(fc.boolean(), { minLength: 63, maxLength: 63 }),
				(rows, cols, bits) => {
					const edge = (r: number, c: number) => bits[r * 9 + c];
					const rowCols = Array.from({ length: rows }, (_, r) => Array.from({ length: cols }, (_, c) => c).filter((c) => edge(r, c)));
					const ours = maximumMatching(rows, cols, rowCols);
					// Reference: minimise Σ cost with cost −1 on edges and 0 elsewhere; the number of
					// assigned pairs that are edges is the maximum matching size.
					const cost = Array.from({ length: rows }, (_, r) => Array.from({ length: cols }, (_, c) => (edge(r, c) ? -1 : 0)));
					const ref = linearSumAssignment(cost, { maximaze: false });
					const size = rows <= cols ? Array.from(ref.rowAssignments).filter((c, r) => c >= 0 && edge(r, c)).length : Array.from(ref.columnAssignments).filter((r, c) => r >= 0 && edge(r, c)).length;
					expect(ours.size).toBe(size);
					// The matching is valid.
					ours.rowMate.forEach((c, r) => {
						if (c >= 0) {
							expect(edge(r, c)).toBe(true);
							expect(ours.colMate[c]).toBe(r);
						}
					});
				}
			),
			{ numRuns: 300 }
		);
	});

	it('null support = rows whose deletion keeps the matching size (brute force)', () => {
		fc.assert(
			fc.property(fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 6 }), fc.array(fc.boolean(), { minLength: 36, maxLength: 36 }), (rows, cols, bits) => {
				const rowCols = Array.from({ length: rows }, (_, r) => Array.from({ length: cols }, (_, c) => c).filter((c) => bits[r * 6 + c]));
				const m = maximumMatching(rows, cols, rowCols);
				const support = structuralNullSupport(m, rowCols);
				for (let i = 0; i < rows; i++) {
					const without = rowCols.map((cs, r) => (r === i ? [] : cs));
					expect(support[i] === 1).toBe(maximumMatching(rows, cols, without).size === m.size);
				}
			}),
			{ numRuns: 300 }
		);
	});
});
