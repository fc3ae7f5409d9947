import { decimalParts } from './decimalParts';
import { exactFraction, Fraction, fractionRank } from './fractionRank';
import { maximumMatching, structuralNullSupport } from './maximumMatching';
import { peelRank } from './peelRank';
import { modularRank, PRIME_A, PRIME_B, residue, type ResidueColumn } from './modularRank';

/** One reagent's stated effects: `values[k]` on factor index `rows[k]` (a stated 0 still counts as a target). */
export interface EffectColumn {
	rows: number[];
	values: number[];
}

export interface TargetedRankOptions {
	/**
	 * Exact-rank arithmetic: `fraction` (rational elimination with fraction.js, the fractions of mathjs), `modular` (two primes
	 * near 2^31 on effects scaled to integers), `auto` (default): fractions when d·R ≤ 400, or
	 * `skip`: structural verdicts only (`exactRank` is then empty).
	 */
	exact?: 'auto' | 'fraction' | 'modular' | 'skip';
}

export interface TargetedRankResult {
	/** Factor j is recovered on its own by support-pattern unmixing (structural rank d − 1). */
	individual: boolean[];
	/** Factor indices (ascending, including j) in j's block: the generic support of the left null space. */
	block: number[][];
	/** Structural rank of M_j = D[:, reagents not targeting j] (maximum matching). */
	structuralRank: number[];
	/** Exact rank of M_j for the stated effects (≤ structural rank); empty with `exact: 'skip'`. */
	exactRank: number[];
	/** Which exact arithmetic was used. */
	exactMethod: 'fraction' | 'modular' | 'skip';
}

/** Above this many entries of D (d·R) the exact rank switches from fractions to modular arithmetic. */
export const FRACTION_LIMIT = 400;

/**
 * Per-factor verdicts of support-pattern unmixing for a d × R effect matrix D given by columns.
 *
 * For factor j let M_j be D restricted to the reagents that do not target j (row j of M_j is
 * zero). Factor j is recovered individually iff rank(M_j) = d − 1, i.e. the left null space of
 * M_j is spanned by e_j; otherwise its block is the support of that null space — the rows whose
 * deletion does not lower the rank. Verdicts use the structural (generic) rank by maximum
 * bipartite matching; the exact rank of the stated effects is reported beside it (singleton
 * peeling, then exact elimination of the remaining core).
 */
export function targetedRankVerdicts(d: number, columns: EffectColumn[], options: TargetedRankOptions = {}): TargetedRankResult {
	if (!Number.isInteger(d) || d < 1) throw new RangeError(`targetedRankVerdicts: d must be an integer ≥ 1, got ${d}`);
	const R = columns.length;
	columns.forEach((col, c) => {
		if (!col || !Array.isArray(col.rows) || !Array.isArray(col.values) || col.rows.length !== col.values.length)
			throw new RangeError(`targetedRankVerdicts: columns[${c}] must have rows and values arrays of equal length`);
		const seen = new Set<number>();
		col.rows.forEach((r, k) => {
			if (!Number.isInteger(r) || r < 0 || r >= d) throw new RangeError(`targetedRankVerdicts: columns[${c}].rows[${k}] must be an integer in [0, ${d - 1}], got ${r}`);
			if (seen.has(r)) throw new RangeError(`targetedRankVerdicts: columns[${c}].rows lists factor ${r} twice`);
			seen.add(r);
			if (!Number.isFinite(col.values[k])) throw new RangeError(`targetedRankVerdicts: columns[${c}].values[${k}] must be a finite number, got ${col.values[k]}`);
		});
	});
	const mode = options.exact ?? 'auto';
	if (!['auto', 'fraction', 'modular', 'skip'].includes(mode))
		throw new RangeError(`targetedRankVerdicts: options.exact must be "auto", "fraction", "modular" or "skip", got ${JSON.stringify(mode)}`);
	const method = mode === 'auto' ? (d * R <= FRACTION_LIMIT ? 'fraction' : 'modular') : mode;

	const rowCols: number[][] = Array.from({ length: d }, () => []);
	columns.forEach((col, c) => col.rows.forEach((r) => rowCols[r].push(c)));

	const exact = method === 'skip' ? null : method === 'fraction' ? fractionEngine(d, columns) : modularEngine(d, columns);
	// Exact nonzero pattern (a stated effect of 0 is a structural target but an exact zero).
	const exactColRows = columns.map((col) => col.rows.filter((_, k) => col.values[k] !== 0));
	const exactRowCols: number[][] = Array.from({ length: d }, () => []);
	exactColRows.forEach((rows, c) => rows.forEach((r) => exactRowCols[r].push(c)));

	const individual: boolean[] = [];
	const block: number[][] = [];
	const structuralRank: number[] = [];
	const exactRank: number[] = [];
	const active = new Uint8Array(R);
	for (let j = 0; j < d; j++) {
		active.fill(1);
		for (const c of rowCols[j]) active[c] = 0;
		const matching = maximumMatching(d, R, rowCols, active);
		const support = structuralNullSupport(matching, rowCols, active);
		const members: number[] = [];
		for (let i = 0; i < d; i++) if (support[i]) members.push(i);
		structuralRank.push(matching.size);
		individual.push(matching.size === d - 1);
		block.push(members);
		if (!exact) continue;
		// The exact rank never exceeds the structural rank, which therefore caps the work.
		const peel = peelRank(d, exactColRows, exactRowCols, active, matching.size);
		const core = peel.coreRows.length && peel.coreCols.length ? exact(peel.coreRows, peel.coreCols, matching.size - peel.peeled) : 0;
		exactRank.push(Math.min(matching.size, peel.peeled + core));
	}
	return { individual, block, structuralRank, exactRank, exactMethod: method };
}

/** Exact rank of the submatrix on `rows` × `cols`, stopping at `cap`. */
type ExactRank = (rows: number[], cols: number[], cap: number) => number;

/** Rational rank with exact fractions (small plans). */
function fractionEngine(d: number, columns: EffectColumn[]): ExactRank {
	let dense: Fraction[][] | null = null;
	return (rows, cols, cap) => {
		const zero = new Fraction(0);
		dense ??= columns.map((col) => {
			const v = new Array<Fraction>(d).fill(zero);
			col.rows.forEach((r, k) => (v[r] = exactFraction(col.values[k])));
			return v;
		});
		return fractionRank(rows.map((i) => cols.map((c) => dense![c][i])), cap);
	};
}

/**
 * Rank over the rationals via two primes: each column is scaled by its own power of ten so its
 * decimals become integers (column scaling keeps the rank), reduced modulo p. The rational
 * rank is ≥ each modular rank and ≤ the structural cap, so the second prime is needed only when
 * the first falls short of the cap; the result is the larger of the two.
 */
function modularEngine(d: number, columns: EffectColumn[]): ExactRank {
	// Built on first use: most plans peel completely and never need a core elimination.
	let scaled: bigint[][] | null = null;
	const residues = (p: number): ResidueColumn[] => {
		scaled ??= columns.map((col) => {
			const parts = col.values.map(decimalParts);
			const top = Math.max(0, ...parts.map((q) => q.scale));
			return parts.map((q) => q.numerator * 10n ** BigInt(top - q.scale));
		});
		return columns.map((col, c) => ({ rows: col.rows, values: scaled![c].map((n) => residue(n, p)) }));
	};
	const byPrime = new Map<number, ResidueColumn[]>();
	const get = (p: number) => {
		let r = byPrime.get(p);
		if (!r) byPrime.set(p, (r = residues(p)));
		return r;
	};
	return (rows, cols, cap) => {
		const a = coreRank(get(PRIME_A), PRIME_A, rows, cols, cap);
		if (a >= cap) return a;
		return Math.max(a, coreRank(get(PRIME_B), PRIME_B, rows, cols, cap));
	};
}

/** Rank modulo p of the core submatrix (rows renumbered 0…rows.length−1). */
function coreRank(columns: ResidueColumn[], p: number, rows: number[], cols: number[], cap: number): number {
	const local = new Map(rows.map((r, i) => [r, i]));
	const sub: ResidueColumn[] = cols.map((c) => {
		const rr: number[] = [];
		const vv: number[] = [];
		const col = columns[c];
		for (let k = 0; k < col.rows.length; k++) {
			const i = local.get(col.rows[k]);
			if (i !== undefined && col.values[k] !== 0) {
				rr.push(i);
				vv.push(col.values[k]);
			}
		}
		return { rows: rr, values: vv };
	});
	return modularRank(rows.length, sub, p, undefined, cap);
}
