import { fraction, type Fraction } from 'mathjs';
import { decimalParts } from './decimalParts';
import { exactFraction, fractionRank } from './fractionRank';
import { maximumMatching, structuralNullSupport } from './maximumMatching';
import { modularRank, PRIME_A, PRIME_B, residue, type ResidueColumn } from './modularRank';

/** One reagent's stated effects: `values[k]` on factor index `rows[k]` (a stated 0 still counts as a target). */
export interface EffectColumn {
	rows: number[];
	values: number[];
}

export interface TargetedRankOptions {
	/**
	 * Exact-rank arithmetic: `fraction` (mathjs rational elimination), `modular` (two primes
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
 * bipartite matching; the exact rank of the stated effects is reported beside it.
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
		// Matched columns first: generically they alone reach the structural rank, which bounds
		// the exact rank from above, so elimination usually stops after them.
		const order: number[] = [];
		for (let c = 0; c < R; c++) if (active[c] && matching.colMate[c] >= 0) order.push(c);
		for (let c = 0; c < R; c++) if (active[c] && matching.colMate[c] < 0) order.push(c);
		exactRank.push(matching.size === 0 ? 0 : exact(order, matching.size));
	}
	return { individual, block, structuralRank, exactRank, exactMethod: method };
}

type ExactRank = (order: number[], cap: number) => number;

/** Rational rank with mathjs fractions (small plans). */
function fractionEngine(d: number, columns: EffectColumn[]): ExactRank {
	const zero = fraction(0);
	const dense: Fraction[][] = columns.map((col) => {
		const v = new Array<Fraction>(d).fill(zero);
		col.rows.forEach((r, k) => (v[r] = exactFraction(col.values[k])));
		return v;
	});
	return (order, cap) => {
		const m: Fraction[][] = Array.from({ length: d }, (_, i) => order.map((c) => dense[c][i]));
		return fractionRank(m, cap);
	};
}

/**
 * Rank over the rationals via two primes: each column is scaled by its own power of ten so its
 * decimals become integers (column scaling keeps the rank), reduced modulo p. The rational
 * rank is ≥ each modular rank and ≤ the structural cap, so the second prime is needed only when
 * the first falls short of the cap; the result is the larger of the two.
 */
function modularEngine(d: number, columns: EffectColumn[]): ExactRank {
	const scaled = columns.map((col) => {
		const parts = col.values.map(decimalParts);
		const top = Math.max(0, ...parts.map((q) => q.scale));
		return parts.map((q) => q.numerator * 10n ** BigInt(top - q.scale));
	});
	const residues = (p: number): ResidueColumn[] => columns.map((col, c) => ({ rows: col.rows, values: scaled[c].map((n) => residue(n, p)) }));
	const byPrime = new Map<number, ResidueColumn[]>();
	const get = (p: number) => {
		let r = byPrime.get(p);
		if (!r) byPrime.set(p, (r = residues(p)));
		return r;
	};
	return (order, cap) => {
		const a = modularRank(d, get(PRIME_A), PRIME_A, order, cap);
		if (a >= cap) return a;
		return Math.max(a, modularRank(d, get(PRIME_B), PRIME_B, order, cap));
	};
}
