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
	// Blocks of centred samples feature by feature; each component's values for the block are
	// accumulated (two components and two features per pass), then stored in the requested layout.
	const buf = new Float64Array(p * BLOCK);
	const acc = new Float64Array(BLOCK);
	const acc2 = new Float64Array(BLOCK);
	for (let s0 = 0; s0 < n; s0 += BLOCK) {
		const m = Math.min(BLOCK, n - s0);
		centredBlock(x, p, mean, s0, m, buf);
		let t = 0;
		// Two components per pass: each block value loaded serves both.
		for (; t + 1 < k; t += 2) {
			const wt = t * p;
			const wu = wt + p;
			acc.fill(0);
			acc2.fill(0);
			let i = 0;
			for (; i + 1 < p; i += 2) {
				const k0 = whitener[wt + i];
				const k1 = whitener[wt + i + 1];
				const l0 = whitener[wu + i];
				const l1 = whitener[wu + i + 1];
				const o0 = i * BLOCK;
				const o1 = o0 + BLOCK;
				for (let u = 0; u < m; u++) {
					const b0 = buf[o0 + u];
					const b1 = buf[o1 + u];
					acc[u] += k0 * b0 + k1 * b1;
					acc2[u] += l0 * b0 + l1 * b1;
				}
			}
			if (i < p) {
				const k0 = whitener[wt + i];
				const l0 = whitener[wu + i];
				const o0 = i * BLOCK;
				for (let u = 0; u < m; u++) {
					const b0 = buf[o0 + u];
					acc[u] += k0 * b0;
					acc2[u] += l0 * b0;
				}
			}
			storeComponent(whitened, layout, acc, t, n, k, s0, m);
			storeComponent(whitened, layout, acc2, t + 1, n, k, s0, m);
		}
		if (t < k) {
			const wt = t * p;
			acc.fill(0);
			for (let i = 0; i < p; i++) {
				const k0 = whitener[wt + i];
				const o0 = i * BLOCK;
				for (let u = 0; u < m; u++) acc[u] += k0 * buf[o0 + u];
			}
			storeComponent(whitened, layout, acc, t, n, k, s0, m);
		}
	}
	return { k, p, mean, whitener, whitened, layout, eigenvalues, warnings };
}

/** Component t's values for block samples s0 … s0+m−1, from acc, into the whitened samples. */
function storeComponent(whitened: Float64Array, layout: 'rows' | 'columns', acc: Float64Array, t: number, n: number, k: number, s0: number, m: number) {
	if (layout === 'columns') whitened.set(acc.subarray(0, m), t * n + s0);
	else for (let u = 0; u < m; u++) whitened[(s0 + u) * k + t] = acc[u];
}

/** Samples per block in covarianceAbout and the whitening projection (a p × BLOCK buffer stays in L1). */
const BLOCK = 64;

/**
 * Covariance (divisor n) of row-major n × p samples about `mean`; row-major p × p.
 * Works on blocks of BLOCK centred samples copied feature by feature into a small buffer, and
 * accumulates the lower triangle in 2 × 2 tiles (four dot products share each pass).
 */
export function covarianceAbout(x: Float64Array, n: number, p: number, mean: Float64Array): Float64Array {
	const cov = new Float64Array(p * p);
	const buf = new Float64Array(p * BLOCK);
	for (let s0 = 0; s0 < n; s0 += BLOCK) {
		const m = Math.min(BLOCK, n - s0);
		centredBlock(x, p, mean, s0, m, buf);
		for (let i = 0; i < p; i += 2) {
			const i1 = i + 1 < p ? i + 1 : i;
			const oi = i * BLOCK;
			const oi1 = i1 * BLOCK;
			for (let j = 0; j <= i; j += 2) {
				const j1 = j + 1 < p ? j + 1 : j;
				const oj = j * BLOCK;
				const oj1 = j1 * BLOCK;
				let a00 = 0;
				let a01 = 0;
				let a10 = 0;
				let a11 = 0;
				for (let t = 0; t < m; t++) {
					const u0 = buf[oi + t];
					const u1 = buf[oi1 + t];
					const v0 = buf[oj + t];
					const v1 = buf[oj1 + t];
					a00 += u0 * v0;
					a01 += u0 * v1;
					a10 += u1 * v0;
					a11 += u1 * v1;
				}
				// Entries above the diagonal are overwritten from below at the end; with an odd p
				// the last row and column repeat (i1 = i, j1 = j) and are added once.
				cov[i * p + j] += a00;
				if (j1 !== j) cov[i * p + j1] += a01;
				if (i1 !== i) {
					cov[i1 * p + j] += a10;
					if (j1 !== j) cov[i1 * p + j1] += a11;
				}
			}
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

/** Copies samples s0 … s0+m−1 of x (row-major n × p), centred, into buf feature by feature (p × BLOCK). */
function centredBlock(x: Float64Array, p: number, mean: Float64Array, s0: number, m: number, buf: Float64Array) {
	for (let t = 0; t < m; t++) {
		const r = (s0 + t) * p;
		for (let i = 0; i < p; i++) buf[i * BLOCK + t] = x[r + i] - mean[i];
	}
}
