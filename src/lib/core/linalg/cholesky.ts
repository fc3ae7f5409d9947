/**
 * Cholesky factorisation A = L·Lᵀ of a symmetric positive definite n × n matrix (row-major;
 * only the lower triangle is read) and solves with it. A matrix that is not numerically
 * positive definite is reported through `positiveDefinite: false` (its failing pivot is
 * floored at `floor`, so the factor is still usable as a regularised solve).
 */
export interface Cholesky {
	n: number;
	/** Row-major lower-triangular factor. */
	l: Float64Array;
	positiveDefinite: boolean;
}

export function cholesky(a: Float64Array, n: number, floor = 1e-12): Cholesky {
	const l = new Float64Array(n * n);
	let positiveDefinite = true;
	let scale = 0;
	for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(a[i * n + i]));
	const minPivot = floor * Math.max(scale, 1e-300);
	for (let i = 0; i < n; i++) {
		for (let j = 0; j <= i; j++) {
			let s = a[i * n + j];
			for (let k = 0; k < j; k++) s -= l[i * n + k] * l[j * n + k];
			if (i === j) {
				if (!(s > minPivot)) {
					positiveDefinite = false;
					s = minPivot;
				}
				l[i * n + i] = Math.sqrt(s);
			} else l[i * n + j] = s / l[j * n + j];
		}
	}
	return { n, l, positiveDefinite };
}

/** Solves A·x = b with a Cholesky factor of A (b is not modified). */
export function choleskySolve(ch: Cholesky, b: ArrayLike<number>, out = new Float64Array(ch.n)): Float64Array {
	const { n, l } = ch;
	for (let i = 0; i < n; i++) {
		let s = b[i];
		for (let k = 0; k < i; k++) s -= l[i * n + k] * out[k];
		out[i] = s / l[i * n + i];
	}
	for (let i = n - 1; i >= 0; i--) {
		let s = out[i];
		for (let k = i + 1; k < n; k++) s -= l[k * n + i] * out[k];
		out[i] = s / l[i * n + i];
	}
	return out;
}
