import { symEigen } from '../linalg/symEigen';

/**
 * PCA whitening of samples x (row-major n × p) to k components: centre the columns, take the
 * top-k eigenvectors E and eigenvalues λ of the covariance (divisor n), K = diag(λ^(−1/2))·Eᵀ.
 * Returns K (k × p), the means (p) and the whitened samples (row-major n × k, unit variance).
 * Eigenvalues below 1e-12·λ_max are floored there (rank-deficient data; reported as a warning).
 */
export interface Whitening {
	k: number;
	p: number;
	mean: Float64Array;
	/** Row-major k × p. */
	whitener: Float64Array;
	/** Row-major n × k. */
	whitened: Float64Array;
	eigenvalues: Float64Array;
	warnings: string[];
}

export function whiten(x: Float64Array, n: number, p: number, k: number): Whitening {
	if (n < 2) throw new RangeError(`whiten: need at least 2 samples, got ${n}`);
	if (k < 1 || k > p) throw new RangeError(`whiten: components must be in [1, ${p}], got ${k}`);
	const mean = new Float64Array(p);
	for (let s = 0; s < n; s++) for (let i = 0; i < p; i++) mean[i] += x[s * p + i];
	for (let i = 0; i < p; i++) mean[i] /= n;
	const cov = covarianceAbout(x, n, p, mean);
	const eig = symEigen(cov, p);
	const warnings: string[] = [];
	const lmax = Math.max(eig.values[p - 1], 1e-300);
	const whitener = new Float64Array(k * p);
	const eigenvalues = new Float64Array(k);
	for (let t = 0; t < k; t++) {
		const src = p - 1 - t;
		let l = eig.values[src];
		if (!(l > 1e-12 * lmax)) {
			warnings.push(`whitening: component ${t + 1} has (near) zero variance; the data span fewer than ${k} directions`);
			l = 1e-12 * lmax;
		}
		eigenvalues[t] = l;
		const sc = 1 / Math.sqrt(l);
		for (let i = 0; i < p; i++) whitener[t * p + i] = eig.vectors[i * p + src] * sc;
	}
	const whitened = new Float64Array(n * k);
	const xc = new Float64Array(p);
	for (let s = 0; s < n; s++) {
		for (let i = 0; i < p; i++) xc[i] = x[s * p + i] - mean[i];
		for (let t = 0; t < k; t++) {
			let v = 0;
			const wt = t * p;
			for (let i = 0; i < p; i++) v += whitener[wt + i] * xc[i];
			whitened[s * k + t] = v;
		}
	}
	return { k, p, mean, whitener, whitened, eigenvalues, warnings };
}

/**
 * Covariance (divisor n) of row-major n × p samples about `mean`; row-major p × p.
 * Accumulates the lower triangle four samples at a time (fewer passes over the result).
 */
export function covarianceAbout(x: Float64Array, n: number, p: number, mean: Float64Array): Float64Array {
	const cov = new Float64Array(p * p);
	const c0 = new Float64Array(p);
	const c1 = new Float64Array(p);
	const c2 = new Float64Array(p);
	const c3 = new Float64Array(p);
	let s = 0;
	for (; s + 4 <= n; s += 4) {
		const r0 = s * p;
		for (let i = 0; i < p; i++) {
			const m = mean[i];
			c0[i] = x[r0 + i] - m;
			c1[i] = x[r0 + p + i] - m;
			c2[i] = x[r0 + 2 * p + i] - m;
			c3[i] = x[r0 + 3 * p + i] - m;
		}
		for (let i = 0; i < p; i++) {
			const a0 = c0[i];
			const a1 = c1[i];
			const a2 = c2[i];
			const a3 = c3[i];
			const ci = i * p;
			for (let j = 0; j <= i; j++) cov[ci + j] += a0 * c0[j] + a1 * c1[j] + a2 * c2[j] + a3 * c3[j];
		}
	}
	for (; s < n; s++) {
		const row = s * p;
		for (let i = 0; i < p; i++) c0[i] = x[row + i] - mean[i];
		for (let i = 0; i < p; i++) {
			const v = c0[i];
			const ci = i * p;
			for (let j = 0; j <= i; j++) cov[ci + j] += v * c0[j];
		}
	}
	for (let i = 0; i < p; i++)
		for (let j = 0; j <= i; j++) {
			const v = cov[i * p + j] / n;
			cov[i * p + j] = v;
			cov[j * p + i] = v;
		}
	return cov;
}
