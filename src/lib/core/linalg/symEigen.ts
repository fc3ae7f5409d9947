/**
 * Eigen-decomposition of a real symmetric n × n matrix: Householder reduction to tridiagonal
 * form followed by the implicit QL algorithm with Wilkinson shifts (Wilkinson & Reinsch,
 * Handbook for Automatic Computation II, 1971, procedures tred2 and tql2).
 *
 * Layout: `a` is row-major n × n (only its values are read; it is not modified).
 * Result: eigenvalues ascending in `values`; `vectors` row-major n × n whose COLUMN k is the
 * unit eigenvector of values[k]. Sign convention (so results reproduce bit for bit): each
 * eigenvector's entry of largest magnitude is positive.
 */
export interface SymEigen {
	n: number;
	values: Float64Array;
	vectors: Float64Array;
	/** False when some eigenvalue needed more than 60 QL iterations (result then approximate). */
	converged: boolean;
}

const EPS = 2 ** -52;

/** √(a² + b²) without overflow or underflow; much faster than Math.hypot in V8. */
function hypot(a: number, b: number): number {
	const x = Math.abs(a);
	const y = Math.abs(b);
	const m = x > y ? x : y;
	if (m === 0) return 0;
	if (m > 1e150 || m < 1e-150) {
		const r = x > y ? y / x : x / y;
		return m * Math.sqrt(1 + r * r);
	}
	return Math.sqrt(a * a + b * b);
}
const MAX_ITER = 60;

export function symEigen(a: Float64Array, n: number): SymEigen {
	if (a.length < n * n) throw new RangeError(`symEigen: matrix needs ${n * n} entries, got ${a.length}`);
	const V = Float64Array.from(a.subarray(0, n * n));
	const d = new Float64Array(n);
	const e = new Float64Array(n);
	if (n === 0) return { n, values: d, vectors: V, converged: true };
	tridiagonalise(V, d, e, n);
	// QL rotates pairs of eigenvector columns; on the transpose those are contiguous rows.
	transposeInPlace(V, n);
	const converged = diagonalise(V, d, e, n);
	transposeInPlace(V, n);
	// Sort ascending (selection sort: n is small), moving eigenvector columns along.
	for (let i = 0; i < n - 1; i++) {
		let k = i;
		let p = d[i];
		for (let j = i + 1; j < n; j++)
			if (d[j] < p) {
				k = j;
				p = d[j];
			}
		if (k !== i) {
			d[k] = d[i];
			d[i] = p;
			for (let r = 0; r < n; r++) {
				const t = V[r * n + i];
				V[r * n + i] = V[r * n + k];
				V[r * n + k] = t;
			}
		}
	}
	fixSigns(V, n);
	return { n, values: d, vectors: V, converged };
}

function transposeInPlace(V: Float64Array, n: number) {
	for (let i = 1; i < n; i++)
		for (let j = 0; j < i; j++) {
			const t = V[i * n + j];
			V[i * n + j] = V[j * n + i];
			V[j * n + i] = t;
		}
}

/** Makes the largest-magnitude entry of every column positive. */
function fixSigns(V: Float64Array, n: number) {
	for (let c = 0; c < n; c++) {
		let best = 0;
		let bestAbs = -1;
		for (let r = 0; r < n; r++) {
			const v = Math.abs(V[r * n + c]);
			if (v > bestAbs + 1e-12) {
				bestAbs = v;
				best = r;
			}
		}
		if (V[best * n + c] < 0) for (let r = 0; r < n; r++) V[r * n + c] = -V[r * n + c];
	}
}

/** Householder reduction (tred2): V becomes the accumulated orthogonal transform, d the diagonal, e the sub-diagonal. */
function tridiagonalise(V: Float64Array, d: Float64Array, e: Float64Array, n: number) {
	for (let j = 0; j < n; j++) d[j] = V[(n - 1) * n + j];
	for (let i = n - 1; i > 0; i--) {
		let scale = 0;
		let h = 0;
		for (let k = 0; k < i; k++) scale += Math.abs(d[k]);
		if (scale === 0) {
			e[i] = d[i - 1];
			for (let j = 0; j < i; j++) {
				d[j] = V[(i - 1) * n + j];
				V[i * n + j] = 0;
				V[j * n + i] = 0;
			}
		} else {
			for (let k = 0; k < i; k++) {
				d[k] /= scale;
				h += d[k] * d[k];
			}
			let f = d[i - 1];
			let g = Math.sqrt(h);
			if (f > 0) g = -g;
			e[i] = scale * g;
			h -= f * g;
			d[i - 1] = f - g;
			for (let j = 0; j < i; j++) e[j] = 0;
			for (let j = 0; j < i; j++) {
				f = d[j];
				V[j * n + i] = f;
				g = e[j] + V[j * n + j] * f;
				for (let k = j + 1; k <= i - 1; k++) {
					g += V[k * n + j] * d[k];
					e[k] += V[k * n + j] * f;
				}
				e[j] = g;
			}
			f = 0;
			for (let j = 0; j < i; j++) {
				e[j] /= h;
				f += e[j] * d[j];
			}
			const hh = f / (h + h);
			for (let j = 0; j < i; j++) e[j] -= hh * d[j];
			for (let j = 0; j < i; j++) {
				f = d[j];
				g = e[j];
				for (let k = j; k <= i - 1; k++) V[k * n + j] -= f * e[k] + g * d[k];
				d[j] = V[(i - 1) * n + j];
				V[i * n + j] = 0;
			}
		}
		d[i] = h;
	}
	// Accumulate the transformations.
	for (let i = 0; i < n - 1; i++) {
		V[(n - 1) * n + i] = V[i * n + i];
		V[i * n + i] = 1;
		const h = d[i + 1];
		if (h !== 0) {
			for (let k = 0; k <= i; k++) d[k] = V[k * n + i + 1] / h;
			for (let j = 0; j <= i; j++) {
				let g = 0;
				for (let k = 0; k <= i; k++) g += V[k * n + i + 1] * V[k * n + j];
				for (let k = 0; k <= i; k++) V[k * n + j] -= g * d[k];
			}
		}
		for (let k = 0; k <= i; k++) V[k * n + i + 1] = 0;
	}
	for (let j = 0; j < n; j++) {
		d[j] = V[(n - 1) * n + j];
		V[(n - 1) * n + j] = 0;
	}
	V[(n - 1) * n + n - 1] = 1;
	e[0] = 0;
}

/** Implicit QL with shifts (tql2) on the tridiagonal (d, e); rotations applied to the rows of Vᵀ (stored in V). */
function diagonalise(V: Float64Array, d: Float64Array, e: Float64Array, n: number): boolean {
	let converged = true;
	for (let i = 1; i < n; i++) e[i - 1] = e[i];
	e[n - 1] = 0;
	let f = 0;
	let tst1 = 0;
	for (let l = 0; l < n; l++) {
		tst1 = Math.max(tst1, Math.abs(d[l]) + Math.abs(e[l]));
		let m = l;
		while (m < n) {
			if (Math.abs(e[m]) <= EPS * tst1) break;
			m++;
		}
		if (m === n) m = n - 1;
		if (m > l) {
			let iter = 0;
			do {
				iter++;
				let g = d[l];
				let p = (d[l + 1] - g) / (2 * e[l]);
				let r = hypot(p, 1);
				if (p < 0) r = -r;
				d[l] = e[l] / (p + r);
				d[l + 1] = e[l] * (p + r);
				const dl1 = d[l + 1];
				let h = g - d[l];
				for (let i = l + 2; i < n; i++) d[i] -= h;
				f += h;
				p = d[m];
				let c = 1;
				let c2 = c;
				let c3 = c;
				const el1 = e[l + 1];
				let s = 0;
				let s2 = 0;
				for (let i = m - 1; i >= l; i--) {
					c3 = c2;
					c2 = c;
					s2 = s;
					g = c * e[i];
					h = c * p;
					r = hypot(p, e[i]);
					e[i + 1] = s * r;
					s = e[i] / r;
					c = p / r;
					p = c * d[i] - s * g;
					d[i + 1] = h + s * (c * g + s * d[i]);
					const r0 = i * n;
					const r1 = r0 + n;
					for (let k = 0; k < n; k++) {
						h = V[r1 + k];
						const vk = V[r0 + k];
						V[r1 + k] = s * vk + c * h;
						V[r0 + k] = c * vk - s * h;
					}
				}
				p = (-s * s2 * c3 * el1 * e[l]) / dl1;
				e[l] = s * p;
				d[l] = c * p;
			} while (Math.abs(e[l]) > EPS * tst1 && iter < MAX_ITER);
			if (Math.abs(e[l]) > EPS * tst1) converged = false;
		}
		d[l] = d[l] + f;
		e[l] = 0;
	}
	return converged;
}
