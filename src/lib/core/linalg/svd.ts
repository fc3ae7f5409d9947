import { gramCols, gramRows } from './matMul';
import { symEigen } from './symEigen';

/**
 * Thin singular value decomposition A = U·diag(s)·Vᵀ of an m × n matrix (row-major), computed
 * from the eigen-decomposition of the smaller Gram matrix (A·Aᵀ when m ≤ n, else Aᵀ·A).
 * Squaring the matrix halves the relative precision of small singular values, which is
 * adequate for the noisy estimates this project decomposes (singular values below
 * ~1e-7·s_max lose their digits; the corresponding vectors are then only a basis of the
 * numerical null space).
 *
 * Result layout: r = min(m, n); `values` descending (length r); `u` row-major m × r and `v`
 * row-major n × r, column k belonging to values[k]. Sign convention: each column of `v`
 * has its largest-magnitude entry positive (u follows from it).
 */
export interface Svd {
	m: number;
	n: number;
	r: number;
	values: Float64Array;
	u: Float64Array;
	v: Float64Array;
	converged: boolean;
}

export function svd(a: Float64Array, m: number, n: number): Svd {
	if (a.length < m * n) throw new RangeError(`svd: matrix needs ${m * n} entries, got ${a.length}`);
	const r = Math.min(m, n);
	const values = new Float64Array(r);
	const u = new Float64Array(m * r);
	const v = new Float64Array(n * r);
	if (r === 0) return { m, n, r, values, u, v, converged: true };
	if (n <= m) {
		const eig = symEigen(gramCols(a, m, n), n);
		for (let k = 0; k < r; k++) {
			const src = n - 1 - k; // descending
			const s = Math.sqrt(Math.max(eig.values[src], 0));
			values[k] = s;
			for (let i = 0; i < n; i++) v[i * r + k] = eig.vectors[i * n + src];
			if (s > 0) {
				for (let i = 0; i < m; i++) {
					let t = 0;
					for (let j = 0; j < n; j++) t += a[i * n + j] * v[j * r + k];
					u[i * r + k] = t / s;
				}
			}
		}
		return { m, n, r, values, u, v, converged: eig.converged };
	}
	const eig = symEigen(gramRows(a, m, n), m);
	for (let k = 0; k < r; k++) {
		const src = m - 1 - k;
		const s = Math.sqrt(Math.max(eig.values[src], 0));
		values[k] = s;
		for (let i = 0; i < m; i++) u[i * r + k] = eig.vectors[i * m + src];
		if (s > 0) {
			let bestAbs = -1;
			let bestSign = 1;
			for (let j = 0; j < n; j++) {
				let t = 0;
				for (let i = 0; i < m; i++) t += a[i * n + j] * u[i * r + k];
				t /= s;
				v[j * r + k] = t;
				if (Math.abs(t) > bestAbs + 1e-12) {
					bestAbs = Math.abs(t);
					bestSign = t < 0 ? -1 : 1;
				}
			}
			if (bestSign < 0) {
				for (let j = 0; j < n; j++) v[j * r + k] = -v[j * r + k];
				for (let i = 0; i < m; i++) u[i * r + k] = -u[i * r + k];
			}
		}
	}
	return { m, n, r, values, u, v, converged: eig.converged };
}
