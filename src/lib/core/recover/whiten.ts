import { symEigen } from '../linalg/symEigen';

/**
 * PCA whitening of samples x (row-major n × p) to k components: centre the columns, take the
 * top-k eigenvectors E and eigenvalues λ of the covariance (divisor n), K = diag(λ^(−1/2))·Eᵀ.
 * Returns K (k × p), the means (p) and the whitened samples (unit variance): row-major n × k, or
 * with `layout: 'columns'` column-major (component t's n values at t·n … t·n + n − 1).
 * Eigenvalues below 1e-12·λ_max are floored there (rank-deficient data; reported as a warning).
 */
export interface Whitening {
	k: number;
	p: number;
	mean: Float64Array;
	/** Row-major k × p. */
	whitener: Float64Array;
	/** Row-major n × k, or column-major when `layout` is 'columns'. */
	whitened: Float64Array;
	layout: 'rows' | 'columns';
	eigenvalues: Float64Array;
	warnings: string[];
}

export function whiten(x: Float64Array, n: number, p: number, k: number, layout: 'rows' | 'columns' = 'rows'): Whitening {
	if (n < 2) throw new RangeError(`whiten: need at least 2 samples, got ${n}`);
	if (k < 1 || k > p) throw new RangeError(`whiten: components must be in [1, ${p}], got ${k}`);
	const mean = new Float64Array(p);
	for (let s = 0; s < n; s++) {
		const row = s * p;
		for (let i = 0; i < p; i++) mean[i] += x[row + i];
	}
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
	const rowStride = layout === 'rows' ? k : 1;
	const colStride = layout === 'rows' ? 1 : n;
	for (let s = 0; s < n; s++) {
		const row = s * p;
		for (let i = 0; i < p; i++) xc[i] = x[row + i] - mean[i];
		const base = s * rowStride;
		// Two components per pass over the centred sample.
		let t = 0;
		for (; t + 1 < k; t += 2) {
			const w0 = t * p;
			const w1 = w0 + p;
			let v0 = 0;
			let v1 = 0;
			for (let i = 0; i < p; i++) {
				const c = xc[i];
				v0 += whitener[w0 + i] * c;
				v1 += whitener[w1 + i] * c;
			}
			whitened[base + t * colStride] = v0;
			whitened[base + (t + 1) * colStride] = v1;
		}
		if (t < k) {
			const w0 = t * p;
			let v0 = 0;
			for (let i = 0; i < p; i++) v0 += whitener[w0 + i] * xc[i];
			whitened[base + t * colStride] = v0;
		}
	}
	return { k, p, mean, whitener, whitened, layout, eigenvalues, warnings };
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
