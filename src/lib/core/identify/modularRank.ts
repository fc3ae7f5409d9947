/**
 * Rank of an integer matrix modulo a prime, by incremental Gauss–Jordan elimination on columns.
 *
 * Arithmetic is exact in doubles: residues are < p < 2^31, and every product is split so that
 * no intermediate exceeds 2^48 (well inside the 2^53 of exact integer doubles).
 * The rank modulo p never exceeds the rational rank, and equals it unless p divides every
 * nonzero maximal minor; with two primes near 2^31 the chance of both failing is negligible
 * for the matrices we meet (entries are effect sizes scaled to integers).
 */

/** 2^31 − 1 (a Mersenne prime). */
export const PRIME_A = 2147483647;
/** 2^31 − 19 (prime). */
export const PRIME_B = 2147483629;

/** x mod p for an integer 0 ≤ x < 2^53 held in a double. */
function reduce(x: number, p: number): number {
	const r = x - Math.floor(x / p) * p;
	return r < 0 ? r + p : r >= p ? r - p : r;
}

/** a·b mod p for residues 0 ≤ a, b < p < 2^31 (split b into 15 + 16 bits). */
export function mulMod(a: number, b: number, p: number): number {
	const hi = Math.floor(b / 65536);
	const lo = b - hi * 65536;
	return reduce(reduce(a * hi, p) * 65536 + a * lo, p);
}

/** Multiplicative inverse of a residue 0 < a < p (extended Euclid; all values stay < 2^31). */
export function invMod(a: number, p: number): number {
	let [r0, r1] = [p, a];
	let [t0, t1] = [0, 1];
	while (r1 !== 0) {
		const q = Math.floor(r0 / r1);
		[r0, r1] = [r1, r0 - q * r1];
		[t0, t1] = [t1, t0 - q * t1];
	}
	if (r0 !== 1) throw new RangeError(`invMod: ${a} has no inverse modulo ${p}`);
	return t0 < 0 ? t0 + p : t0;
}

/** Residue in [0, p) of a (possibly negative, possibly huge) integer. */
export function residue(n: bigint, p: number): number {
	const r = Number(n % BigInt(p));
	return r < 0 ? r + p : r;
}

/** A sparse column: `values[k]` (residues mod p) sits in row `rows[k]`. */
export interface ResidueColumn {
	rows: ArrayLike<number>;
	values: ArrayLike<number>;
}

/**
 * Reduced column echelon basis modulo p, grown one column at a time.
 * Layout: `basis[i]` is a Float64Array of length `dim` holding residues; its pivot row
 * `pivotRow[i]` holds 1 and every other basis vector holds 0 there (fully reduced), so a new
 * column is reduced with one pass per pivot row it touches.
 */
export class ModularEchelon {
	readonly dim: number;
	readonly p: number;
	private basis: Float64Array[] = [];
	private pivotRow: number[] = [];
	private pivotOf: Int32Array;
	private work: Float64Array;

	constructor(dim: number, p: number) {
		this.dim = dim;
		this.p = p;
		this.pivotOf = new Int32Array(dim).fill(-1);
		this.work = new Float64Array(dim);
	}

	get rank(): number {
		return this.basis.length;
	}

	/** Adds a column; returns true when it raised the rank. */
	add(col: ResidueColumn): boolean {
		const { dim, p, basis, pivotOf } = this;
		const v = this.work;
		v.fill(0);
		for (let k = 0; k < col.rows.length; k++) v[col.rows[k]] = col.values[k];
		// Eliminate the pivots the column touches. Subtracting basis vector i changes no other
		// pivot row (fully reduced basis), so only the column's own nonzero rows need a pass.
		for (let k = 0; k < col.rows.length; k++) {
			const r = col.rows[k];
			const i = pivotOf[r];
			if (i < 0) continue;
			const c = v[r];
			if (c === 0) continue;
			const b = basis[i];
			for (let t = 0; t < dim; t++) {
				const bt = b[t];
				if (bt === 0) continue;
				const s = v[t] - mulMod(c, bt, p);
				v[t] = s < 0 ? s + p : s;
			}
		}
		let piv = -1;
		for (let t = 0; t < dim; t++)
			if (v[t] !== 0) {
				piv = t;
				break;
			}
		if (piv < 0) return false;
		const fresh = new Float64Array(dim);
		const inv = invMod(v[piv], p);
		for (let t = 0; t < dim; t++) if (v[t] !== 0) fresh[t] = mulMod(v[t], inv, p);
		// Clear the new pivot row from every existing basis vector.
		for (const b of basis) {
			const c = b[piv];
			if (c === 0) continue;
			for (let t = 0; t < dim; t++) {
				const ft = fresh[t];
				if (ft === 0) continue;
				const s = b[t] - mulMod(c, ft, p);
				b[t] = s < 0 ? s + p : s;
			}
		}
		pivotOf[piv] = basis.length;
		basis.push(fresh);
		this.pivotRow.push(piv);
		return true;
	}
}

/**
 * Rank modulo p of the matrix whose columns are `columns` (taken in `order`, default all in
 * index order). Stops early once the rank reaches `cap` (default `dim`).
 */
export function modularRank(dim: number, columns: ResidueColumn[], p: number, order?: ArrayLike<number>, cap = dim): number {
	const e = new ModularEchelon(dim, p);
	const n = order ? order.length : columns.length;
	for (let k = 0; k < n && e.rank < cap; k++) e.add(columns[order ? order[k] : k]);
	return e.rank;
}
