import { describe, expect, it } from 'vitest';
import { eigs, matrix } from 'mathjs';
import { cholesky, choleskySolve, gramCols, gramRows, matMul, matMulT, matTMul, randomOrthogonal, svd, symEigen, symmetricDecorrelate, transpose } from '../../src/lib/core/linalg';
import { rngFor } from '../../src/lib/core/simulate/rng';

function randomSym(n: number, seed: number) {
	const r = rngFor(seed);
	const a = new Float64Array(n * n);
	for (let i = 0; i < n; i++)
		for (let j = 0; j <= i; j++) {
			const v = r.normal();
			a[i * n + j] = v;
			a[j * n + i] = v;
		}
	return a;
}
const toRows = (a: Float64Array, m: number, n: number) => Array.from({ length: m }, (_, i) => Array.from(a.subarray(i * n, i * n + n)));

describe('symEigen (Householder tridiagonalisation + implicit QL)', () => {
	it.each([1, 2, 3, 7, 24, 48])('n = %i: eigenvalues agree with mathjs eigs and A·v = λ·v with orthonormal vectors', (n) => {
		const a = randomSym(n, n);
		const e = symEigen(a, n);
		expect(e.converged).toBe(true);
		// Reference library: mathjs 15.2.0 eigs (sorted ascending here; mathjs orders by magnitude).
		const ref = (eigs(matrix(toRows(a, n, n))).values as unknown as { toArray(): number[] }).toArray().sort((x, y) => x - y);
		for (let k = 0; k < n; k++) expect(e.values[k]).toBeCloseTo(ref[k], 10);
		for (let k = 0; k < n; k++)
			for (let i = 0; i < n; i++) {
				let s = 0;
				for (let j = 0; j < n; j++) s += a[i * n + j] * e.vectors[j * n + k];
				expect(s).toBeCloseTo(e.values[k] * e.vectors[i * n + k], 10);
			}
		const vtv = matTMul(e.vectors, e.vectors, n, n, n);
		for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(vtv[i * n + j]).toBeCloseTo(i === j ? 1 : 0, 12);
	});
	it('handles repeated eigenvalues, zero matrices, and does not mutate its input', () => {
		const a = new Float64Array([2, 0, 0, 0, 2, 0, 0, 0, 5]);
		const copy = a.slice();
		const e = symEigen(a, 3);
		expect(Array.from(e.values)).toEqual([2, 2, 5]);
		expect(a).toEqual(copy);
		const z = symEigen(new Float64Array(4), 2);
		expect(Array.from(z.values)).toEqual([0, 0]);
	});
	it('fixes signs: the largest entry of every eigenvector is positive (reproducible results)', () => {
		const e = symEigen(randomSym(6, 11), 6);
		for (let k = 0; k < 6; k++) {
			let best = 0;
			for (let i = 1; i < 6; i++) if (Math.abs(e.vectors[i * 6 + k]) > Math.abs(e.vectors[best * 6 + k])) best = i;
			expect(e.vectors[best * 6 + k]).toBeGreaterThan(0);
		}
	});
});

describe('svd', () => {
	it.each([
		[5, 3],
		[3, 5],
		[24, 40],
		[1, 4]
	])('%i × %i reconstructs A = U·diag(s)·Vᵀ with orthonormal V and descending s', (m, n) => {
		const r = rngFor(m * 100 + n);
		const a = Float64Array.from({ length: m * n }, () => r.normal());
		const s = svd(a, m, n);
		for (let k = 1; k < s.r; k++) expect(s.values[k]).toBeLessThanOrEqual(s.values[k - 1]);
		for (let i = 0; i < m; i++)
			for (let j = 0; j < n; j++) {
				let t = 0;
				for (let k = 0; k < s.r; k++) t += s.u[i * s.r + k] * s.values[k] * s.v[j * s.r + k];
				expect(t).toBeCloseTo(a[i * n + j], 9);
			}
		const vtv = matTMul(s.v, s.v, n, s.r, s.r);
		for (let i = 0; i < s.r; i++) for (let j = 0; j < s.r; j++) expect(vtv[i * s.r + j]).toBeCloseTo(i === j ? 1 : 0, 9);
	});
});

describe('products, Cholesky, orthogonal matrices', () => {
	it('matMul, matMulT, matTMul, transpose and the Gram matrices agree with each other', () => {
		const r = rngFor(3);
		const a = Float64Array.from({ length: 12 }, () => r.normal()); // 3 × 4
		const b = Float64Array.from({ length: 20 }, () => r.normal()); // 4 × 5
		const ab = matMul(a, b, 3, 4, 5);
		const ab2 = matMulT(a, transpose(b, 4, 5), 3, 4, 5);
		const ab3 = matTMul(transpose(a, 3, 4), b, 4, 3, 5);
		for (let i = 0; i < 15; i++) {
			expect(ab2[i]).toBeCloseTo(ab[i], 12);
			expect(ab3[i]).toBeCloseTo(ab[i], 12);
		}
		const g1 = gramRows(a, 3, 4);
		const g2 = matMulT(a, a, 3, 4, 3);
		const g3 = gramCols(a, 3, 4);
		const g4 = matTMul(a, a, 3, 4, 4);
		for (let i = 0; i < 9; i++) expect(g1[i]).toBeCloseTo(g2[i], 12);
		for (let i = 0; i < 16; i++) expect(g3[i]).toBeCloseTo(g4[i], 12);
	});
	it('Cholesky solves an SPD system and flags a singular one', () => {
		const a = new Float64Array([4, 2, 2, 3]);
		const x = choleskySolve(cholesky(a, 2), [2, 1]);
		// 4x + 2y = 2, 2x + 3y = 1 → x = 0.5, y = 0 (by hand)
		expect(x[0]).toBeCloseTo(0.5, 14);
		expect(x[1]).toBeCloseTo(0, 14);
		expect(cholesky(new Float64Array([1, 1, 1, 1]), 2).positiveDefinite).toBe(false);
	});
	it('randomOrthogonal has orthonormal rows; symmetric decorrelation gives orthonormal rows', () => {
		const q = randomOrthogonal(6, rngFor(1));
		const qqt = matMulT(q, q, 6, 6, 6);
		for (let i = 0; i < 6; i++) for (let j = 0; j < 6; j++) expect(qqt[i * 6 + j]).toBeCloseTo(i === j ? 1 : 0, 12);
		const r = rngFor(2);
		const w = Float64Array.from({ length: 3 * 5 }, () => r.normal());
		const o = symmetricDecorrelate(w, 3, 5);
		const oot = matMulT(o, o, 3, 5, 3);
		for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(oot[i * 3 + j]).toBeCloseTo(i === j ? 1 : 0, 10);
	});
});
