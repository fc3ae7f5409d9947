/**
 * Dense matrix kernels on row-major Float64Array storage: element (i, j) of an m × n matrix
 * is at index i·n + j. Dimensions are passed explicitly; outputs may be supplied to avoid
 * allocation in hot loops (they must not alias the inputs).
 */

/** C (m × n) = A (m × k) · B (k × n). */
export function matMul(a: Float64Array, b: Float64Array, m: number, k: number, n: number, out = new Float64Array(m * n)): Float64Array {
	out.fill(0, 0, m * n);
	for (let i = 0; i < m; i++) {
		const ci = i * n;
		for (let t = 0; t < k; t++) {
			const ait = a[i * k + t];
			if (ait === 0) continue;
			const bt = t * n;
			for (let j = 0; j < n; j++) out[ci + j] += ait * b[bt + j];
		}
	}
	return out;
}

/** C (m × n) = A (m × k) · Bᵀ where B is n × k. */
export function matMulT(a: Float64Array, b: Float64Array, m: number, k: number, n: number, out = new Float64Array(m * n)): Float64Array {
	for (let i = 0; i < m; i++) {
		const ai = i * k;
		for (let j = 0; j < n; j++) {
			const bj = j * k;
			let s = 0;
			for (let t = 0; t < k; t++) s += a[ai + t] * b[bj + t];
			out[i * n + j] = s;
		}
	}
	return out;
}

/** C (k × n) = Aᵀ · B where A is m × k and B is m × n. */
export function matTMul(a: Float64Array, b: Float64Array, m: number, k: number, n: number, out = new Float64Array(k * n)): Float64Array {
	out.fill(0, 0, k * n);
	for (let i = 0; i < m; i++) {
		const ai = i * k;
		const bi = i * n;
		for (let t = 0; t < k; t++) {
			const v = a[ai + t];
			if (v === 0) continue;
			const ct = t * n;
			for (let j = 0; j < n; j++) out[ct + j] += v * b[bi + j];
		}
	}
	return out;
}

/** Aᵀ (n × m) of an m × n matrix. */
export function transpose(a: Float64Array, m: number, n: number, out = new Float64Array(m * n)): Float64Array {
	for (let i = 0; i < m; i++) for (let j = 0; j < n; j++) out[j * m + i] = a[i * n + j];
	return out;
}

/** Gram matrix A·Aᵀ (m × m, symmetric) of an m × n matrix. */
export function gramRows(a: Float64Array, m: number, n: number, out = new Float64Array(m * m)): Float64Array {
	for (let i = 0; i < m; i++) {
		const ai = i * n;
		for (let j = 0; j <= i; j++) {
			const aj = j * n;
			let s = 0;
			for (let t = 0; t < n; t++) s += a[ai + t] * a[aj + t];
			out[i * m + j] = s;
			out[j * m + i] = s;
		}
	}
	return out;
}

/** Gram matrix Aᵀ·A (n × n, symmetric) of an m × n matrix. */
export function gramCols(a: Float64Array, m: number, n: number, out = new Float64Array(n * n)): Float64Array {
	out.fill(0, 0, n * n);
	for (let r = 0; r < m; r++) {
		const ar = r * n;
		for (let i = 0; i < n; i++) {
			const v = a[ar + i];
			if (v === 0) continue;
			const oi = i * n;
			for (let j = 0; j <= i; j++) out[oi + j] += v * a[ar + j];
		}
	}
	for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) out[j * n + i] = out[i * n + j];
	return out;
}

/** n × n identity. */
export function identity(n: number): Float64Array {
	const out = new Float64Array(n * n);
	for (let i = 0; i < n; i++) out[i * n + i] = 1;
	return out;
}
