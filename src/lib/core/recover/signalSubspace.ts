import { gramCols, gramRows } from '../linalg/matMul';
import { symEigen } from '../linalg/symEigen';

/**
 * Signal subspace: the top-k right singular vectors of a row-major m × p matrix of effect
 * estimates (reagent mean differences, one row per reagent) or of centred samples.
 * k = min(requested, m, p). Result `basis` is row-major k × p with orthonormal rows, ordered by
 * decreasing singular value; `values` are those singular values.
 * Sign convention: each basis row's largest-magnitude entry is positive.
 */
export interface Subspace {
	k: number;
	p: number;
	basis: Float64Array;
	values: Float64Array;
	converged: boolean;
}

export function signalSubspace(x: Float64Array, m: number, p: number, requested: number): Subspace {
	if (x.length < m * p) throw new RangeError(`signalSubspace: matrix needs ${m * p} entries, got ${x.length}`);
	if (!Number.isInteger(requested) || requested < 1) throw new RangeError(`signalSubspace: dimension must be an integer ≥ 1, got ${requested}`);
	const k = Math.min(requested, m, p);
	const basis = new Float64Array(k * p);
	const values = new Float64Array(k);
	if (m <= p) {
		// Right singular vectors v = Xᵀu/σ from the eigenvectors u of X·Xᵀ (m × m).
		const eig = symEigen(gramRows(x, m, p), m);
		for (let t = 0; t < k; t++) {
			const src = m - 1 - t;
			const s = Math.sqrt(Math.max(eig.values[src], 0));
			values[t] = s;
			if (s === 0) continue;
			const row = t * p;
			for (let r = 0; r < m; r++) {
				const u = eig.vectors[r * m + src] / s;
				if (u === 0) continue;
				const xr = r * p;
				for (let i = 0; i < p; i++) basis[row + i] += u * x[xr + i];
			}
			fixRowSign(basis, row, p);
		}
		return { k, p, basis, values, converged: eig.converged };
	}
	const eig = symEigen(gramCols(x, m, p), p);
	for (let t = 0; t < k; t++) {
		const src = p - 1 - t;
		values[t] = Math.sqrt(Math.max(eig.values[src], 0));
		for (let i = 0; i < p; i++) basis[t * p + i] = eig.vectors[i * p + src];
	}
	return { k, p, basis, values, converged: eig.converged };
}

function fixRowSign(a: Float64Array, row: number, p: number) {
	let best = 0;
	for (let i = 1; i < p; i++) if (Math.abs(a[row + i]) > Math.abs(a[row + best]) + 1e-12) best = i;
	if (a[row + best] < 0) for (let i = 0; i < p; i++) a[row + i] = -a[row + i];
}

/** Coordinates of the m rows of x (m × p) in a subspace basis (k × p): row-major m × k. */
export function projectRows(x: Float64Array, m: number, p: number, sub: Subspace, out = new Float64Array(m * sub.k)): Float64Array {
	const { k, basis } = sub;
	for (let r = 0; r < m; r++)
		for (let t = 0; t < k; t++) {
			let s = 0;
			const xr = r * p;
			const bt = t * p;
			for (let i = 0; i < p; i++) s += x[xr + i] * basis[bt + i];
			out[r * k + t] = s;
		}
	return out;
}
