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
 * Layout: basis vector i occupies `store[i*dim … i*dim+dim)` (residues as doubles); its pivot
 * row `pivotRow[i]` holds 1 and every other basis vector holds 0 there (fully reduced), so a new
 * column is reduced with one pass per pivot row it touches.
 */
export class ModularEchelon {
	readonly dim: number;
	readonly p: number;
	private store: Float64Array;
	private count = 0;
	private pivotRow: Int32Array;
	private pivotOf: Int32Array;
	private work: Float64Array;
	/** High (15-bit) and low (16-bit) halves of the vector being added, for split products. */
	private hi: Float64Array;
	private lo: Float64Array;

	constructor(dim: number, p: number) {
		if (!(p > 2 && p < 2 ** 31)) throw new RangeError(`ModularEchelon: p must be a prime below 2^31, got ${p}`);
		this.dim = dim;
		this.p = p;
		this.store = new Float64Array(dim * dim);
		this.pivotRow = new Int32Array(dim);
		this.pivotOf = new Int32Array(dim).fill(-1);
		this.work = new Float64Array(dim);
		this.hi = new Float64Array(dim);
		this.lo = new Float64Array(dim);
	}

	get rank(): number {
		return this.count;
	}

	/** Empties the basis for reuse with the same dimension and prime. */
	reset() {
		this.count = 0;
		this.pivotOf.fill(-1);
	}

	/** Adds a column; returns true when it raised the rank. */
	add(col: ResidueColumn): boolean {
		const { dim, p, store, pivotOf, hi, lo } = this;
		const v = this.work;
		v.fill(0);
		for (let k = 0; k < col.rows.length; k++) v[col.rows[k]] = col.values[k];
		// Eliminate the pivots the column touches: v -= v[r]·b_i. Subtracting basis vector i
		// changes no other pivot row (fully reduced basis), so the column's own rows suffice.
		for (let k = 0; k < col.rows.length; k++) {
			const r = col.rows[k];
			const i = pivotOf[r];
			if (i < 0) continue;
			const c = v[r];
			if (c === 0) continue;
			const ch = Math.floor(c / 65536);
			const cl = c - ch * 65536;
			const base = i * dim;
			for (let t = 0; t < dim; t++) {
				const bt = store[base + t];
				if (bt === 0) continue;
				// c·bt mod p with c = ch·2^16 + cl; every intermediate < 2^48.
				let x = ch * bt;
				x -= Math.floor(x / p) * p;
				x = x * 65536 + cl * bt;
				x -= Math.floor(x / p) * p;
				if (x < 0) x += p;
				else if (x >= p) x -= p;
				const s = v[t] - x;
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
		const inv = invMod(v[piv], p);
		const fresh = this.count * dim;
		for (let t = 0; t < dim; t++) {
			const x = v[t] === 0 ? 0 : mulMod(v[t], inv, p);
			store[fresh + t] = x;
			hi[t] = Math.floor(x / 65536);
			lo[t] = x - hi[t] * 65536;
		}
		// Clear the new pivot row from every existing basis vector: b -= b[piv]·fresh.
		for (let i = 0; i < this.count; i++) {
			const base = i * dim;
			const c = store[base + piv];
			if (c === 0) continue;
			for (let t = 0; t < dim; t++) {
				if (hi[t] === 0 && lo[t] === 0) continue;
				let x = c * hi[t];
				x -= Math.floor(x / p) * p;
				x = x * 65536 + c * lo[t];
				x -= Math.floor(x / p) * p;
				if (x < 0) x += p;
				else if (x >= p) x -= p;
				const s = store[base + t] - x;
				store[base + t] = s < 0 ? s + p : s;
			}
		}
		pivotOf[piv] = this.count;
		this.pivotRow[this.count] = piv;
		this.count++;
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
