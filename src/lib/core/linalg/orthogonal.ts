import type { Rng } from '../simulate/rng';
import { symEigen } from './symEigen';

/**
 * Random orthogonal n × n matrix from the Haar distribution: Gram–Schmidt (QR) of a matrix of
 * independent standard normals with the signs of R's diagonal absorbed (Mezzadri 2007,
 * "How to generate random matrices from the classical compact groups", Notices AMS 54:592).
 * Row-major; rows are orthonormal.
 */
export function randomOrthogonal(n: number, rng: Rng): Float64Array {
	const q = new Float64Array(n * n);
	for (let i = 0; i < n * n; i++) q[i] = rng.normal();
	// Modified Gram–Schmidt on the rows (the positive-norm choice equals R's diagonal sign fix).
	for (let i = 0; i < n; i++) {
		const qi = i * n;
		for (let j = 0; j < i; j++) {
			const qj = j * n;
			let dot = 0;
			for (let t = 0; t < n; t++) dot += q[qi + t] * q[qj + t];
			for (let t = 0; t < n; t++) q[qi + t] -= dot * q[qj + t];
		}
		let norm = 0;
		for (let t = 0; t < n; t++) norm += q[qi + t] * q[qi + t];
		norm = Math.sqrt(norm);
		for (let t = 0; t < n; t++) q[qi + t] /= norm;
	}
	return q;
}

/**
 * Symmetric decorrelation (W·Wᵀ)^(−1/2)·W of a k × n matrix W (row-major, k ≤ n), in place
 * semantics avoided: returns a new matrix whose rows are orthonormal and as close as possible
 * to W's rows (Hyvärinen & Oja 2000, eq. 45). Eigenvalues below 1e-300 are floored.
 */
export function symmetricDecorrelate(w: Float64Array, k: number, n: number, out = new Float64Array(k * n)): Float64Array {
	const g = new Float64Array(k * k);
	for (let i = 0; i < k; i++)
		for (let j = 0; j <= i; j++) {
			let s = 0;
			for (let t = 0; t < n; t++) s += w[i * n + t] * w[j * n + t];
			g[i * k + j] = s;
			g[j * k + i] = s;
		}
	const eig = symEigen(g, k);
	// M = E diag(λ^(−1/2)) Eᵀ
	const m = new Float64Array(k * k);
	for (let c = 0; c < k; c++) {
		const scale = 1 / Math.sqrt(Math.max(eig.values[c], 1e-300));
		for (let i = 0; i < k; i++) {
			const ei = eig.vectors[i * k + c] * scale;
			for (let j = 0; j < k; j++) m[i * k + j] += ei * eig.vectors[j * k + c];
		}
	}
	out.fill(0, 0, k * n);
	for (let i = 0; i < k; i++)
		for (let j = 0; j < k; j++) {
			const mij = m[i * k + j];
			for (let t = 0; t < n; t++) out[i * n + t] += mij * w[j * n + t];
		}
	return out;
}
