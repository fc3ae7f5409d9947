import { describe, expect, it } from 'vitest';
import { inv, multiply, fraction, type Fraction } from 'mathjs';
import { targetedRankVerdicts, type EffectColumn } from '../../src/lib/core/identify';
import { referenceRank } from './referenceRank';

/** Dense d × R matrix of a column list (for the reference rank). */
function dense(d: number, cols: EffectColumn[]): number[][] {
	const m = Array.from({ length: d }, () => new Array(cols.length).fill(0));
	cols.forEach((c, r) => c.rows.forEach((i, k) => (m[i][r] = c.values[k])));
	return m;
}

/** M_j: the columns that do not target j. */
function withoutTargetsOf(d: number, cols: EffectColumn[], j: number): number[][] {
	return dense(
		d,
		cols.filter((c) => !c.rows.includes(j))
	);
}

const col = (rows: number[], values: number[] = rows.map(() => 1)): EffectColumn => ({ rows, values });

describe('targetedRankVerdicts — worked examples', () => {
	// Worked example (DESIGN.md "Identifiability checks"): three reagents on {f1,f2}, {f2,f3},
	// {f1,f3} separate every pair yet recover no factor individually. Rank condition: factor j is
	// individual iff the left null space of the non-targeting effects is one-dimensional
	// (support-pattern unmixing; block identifiability under sparse perturbations, Ahuja,
	// Hartford & Bengio 2022, NeurIPS). Here M_j has a single column, so rank 1 < d − 1 = 2.
	const triangle = [col([0, 1], [1.2, 0.7]), col([1, 2], [0.9, 1.1]), col([0, 2], [1.5, 0.6])];

	it('the triangle {1,2}, {2,3}, {1,3} recovers no factor individually; all three form one block', () => {
		for (const exact of ['fraction', 'modular'] as const) {
			const res = targetedRankVerdicts(3, triangle, { exact });
			expect(res.individual).toEqual([false, false, false]);
			expect(res.block).toEqual([[0, 1, 2], [0, 1, 2], [0, 1, 2]]);
			expect(res.structuralRank).toEqual([1, 1, 1]);
			expect(res.exactRank).toEqual([1, 1, 1]);
		}
	});

	it('…and a second model with the same support pattern reproduces the same reagent shifts (non-identifiability, checked with mathjs)', () => {
		// D holds the effects (rows = factors). For another effect matrix D2 with the same
		// support, T = D2·D⁻¹ maps factors to new factors that give exactly the same observed
		// reagent shifts: A·D = (A·T⁻¹)·D2. Identification would require T to be diagonal.
		const D = [
			[1.2, 0, 1.5],
			[0.7, 0.9, 0],
			[0, 1.1, 0.6]
		].map((r) => r.map((x) => fraction(String(x))));
		const D2 = [
			[1.2, 0, 3],
			[0.7, 0.9, 0],
			[0, 1.1, 0.6]
		].map((r) => r.map((x) => fraction(String(x))));
		const T = multiply(D2, inv(D)) as unknown as Fraction[][];
		const offDiagonal = T.flatMap((row, i) => row.filter((_, j) => j !== i)).filter((x) => !fraction(x).equals(0));
		expect(offDiagonal.length).toBeGreaterThan(0);
		// T·D equals D2 exactly, so both models explain the same shifts.
		const TD = multiply(T, D) as unknown as Fraction[][];
		TD.forEach((row, i) => row.forEach((x, j) => expect(fraction(x).equals(D2[i][j])).toBe(true)));
	});

	it('one single-target reagent per factor recovers every factor (Squires, Seigal, Bhate & Uhler 2023, ICML)', () => {
		const res = targetedRankVerdicts(4, [col([0]), col([1]), col([2]), col([3])]);
		expect(res.individual).toEqual([true, true, true, true]);
		expect(res.block).toEqual([[0], [1], [2], [3]]);
	});

	it('an untargeted factor can still be individual when the other reagents span the rest (coverage is a warning)', () => {
		// d = 3; reagents on {1}, {2}: for factor 3, M_3 = both columns, rank 2 = d − 1.
		const res = targetedRankVerdicts(3, [col([0]), col([1])]);
		expect(res.individual).toEqual([false, false, true]);
		// Factor 1: M_1 = column {2} only; factors 1 and 3 are left mixed.
		expect(res.block[0]).toEqual([0, 2]);
		expect(res.block[1]).toEqual([1, 2]);
	});

	it('two factors always targeted together form a block (no reagent separates them)', () => {
		const res = targetedRankVerdicts(3, [col([0, 1], [1, 2]), col([2]), col([0, 1, 2], [1, 1, 3])]);
		// Factors 1 and 2: only the reagent on {3} avoids them, leaving {1, 2} mixed.
		expect(res.block[0]).toEqual([0, 1]);
		expect(res.block[1]).toEqual([0, 1]);
		// Factor 3: only the reagent on {1, 2} avoids it — one direction for two factors, so the
		// left null space (1·y1 + 2·y2 = 0, y3 free) has support {1, 2, 3}.
		expect(res.individual[2]).toBe(false);
		expect(res.block[2]).toEqual([0, 1, 2]);
	});
});

describe('targetedRankVerdicts — exact degeneracy of the stated values', () => {
	it('a 4-cycle {1,2}, {2,3}, {3,4}, {1,4} with equal effects is structurally full rank but exactly singular', () => {
		// Leibniz formula: the 4×4 pattern of one even cycle has exactly two permutation terms,
		// +1 and −1, so the determinant is 0 for equal effects (checked with mathjs det below).
		const cycle = [col([0, 1]), col([1, 2]), col([2, 3]), col([0, 3]), col([4])];
		const square = withoutTargetsOf(5, cycle, 4).slice(0, 4);
		expect(referenceRank(square)).toBe(3);
		for (const exact of ['fraction', 'modular'] as const) {
			const res = targetedRankVerdicts(5, cycle, { exact });
			expect(res.structuralRank[4]).toBe(4);
			expect(res.individual[4]).toBe(true); // the verdict stays structural
			expect(res.exactRank[4]).toBe(3);
		}
	});

	it('unequal effects on the same 4-cycle reach the structural rank', () => {
		const cycle = [col([0, 1], [1, 2]), col([1, 2]), col([2, 3]), col([0, 3]), col([4])];
		expect(referenceRank(withoutTargetsOf(5, cycle, 4))).toBe(4);
		expect(targetedRankVerdicts(5, cycle, { exact: 'modular' }).exactRank[4]).toBe(4);
	});

	it('two reagents with identical two-target effect vectors count once exactly, twice structurally', () => {
		const twins = [col([0, 1], [0.8, 1.3]), col([0, 1], [0.8, 1.3]), col([2])];
		for (const exact of ['fraction', 'modular'] as const) {
			const res = targetedRankVerdicts(3, twins, { exact });
			expect(res.structuralRank[2]).toBe(2);
			expect(res.exactRank[2]).toBe(1);
		}
	});

	it('a stated effect of exactly 0 is a target structurally but a zero exactly', () => {
		const res = targetedRankVerdicts(2, [col([0, 1], [1, 0]), col([0])]);
		// Factor 2: the first reagent targets f2 structurally (stated 0), so only {f1} avoids it.
		expect(res.structuralRank[1]).toBe(1);
		expect(res.individual[1]).toBe(true);
		// Factor 1: no reagent avoids f1; rank 0 of d − 1 = 1 → block.
		expect(res.individual[0]).toBe(false);
		// Exact rank of M_2 = [1] on row f1 (column {f1}) = 1.
		expect(res.exactRank[1]).toBe(1);
	});

	it('decimal effects are read exactly: 0.1 + 0.2 style sums do not fake a dependence', () => {
		// Columns (0.1, 0.2), (0.2, 0.4) are exactly proportional; (0.3, 0.6000000000000001) is not.
		const exact = targetedRankVerdicts(3, [col([0, 1], [0.1, 0.2]), col([0, 1], [0.2, 0.4]), col([2])], { exact: 'modular' });
		expect(exact.exactRank[2]).toBe(1);
		const near = targetedRankVerdicts(3, [col([0, 1], [0.1, 0.2]), col([0, 1], [0.3, 0.6000000000000001]), col([2])], { exact: 'modular' });
		expect(near.exactRank[2]).toBe(2);
		expect(referenceRank([[0.1, 0.3], [0.2, 0.6000000000000001]])).toBe(2);
	});
});

describe('targetedRankVerdicts — input checks', () => {
	it('throws on caller mistakes, naming the field', () => {
		expect(() => targetedRankVerdicts(0, [])).toThrow(/d must be an integer ≥ 1/);
		expect(() => targetedRankVerdicts(2, [col([2])])).toThrow(/columns\[0\]\.rows\[0\] must be an integer in \[0, 1\], got 2/);
		expect(() => targetedRankVerdicts(2, [col([0, 0])])).toThrow(/lists factor 0 twice/);
		expect(() => targetedRankVerdicts(2, [{ rows: [0], values: [NaN] }])).toThrow(/values\[0\] must be a finite number/);
		expect(() => targetedRankVerdicts(2, [{ rows: [0], values: [] }])).toThrow(/equal length/);
		expect(() => targetedRankVerdicts(2, [], { exact: 'float' as never })).toThrow(/options\.exact/);
	});

	it('no reagents: one factor is individual, more are one block', () => {
		expect(targetedRankVerdicts(1, [])).toMatchObject({ individual: [true], block: [[0]] });
		expect(targetedRankVerdicts(2, [])).toMatchObject({ individual: [false, false], block: [[0, 1], [0, 1]] });
	});

	it('skip leaves the exact rank empty and the verdicts unchanged', () => {
		const cols = [col([0, 1]), col([1, 2]), col([2])];
		const full = targetedRankVerdicts(3, cols);
		const skip = targetedRankVerdicts(3, cols, { exact: 'skip' });
		expect(skip.exactRank).toEqual([]);
		expect(skip.block).toEqual(full.block);
		expect(skip.individual).toEqual(full.individual);
	});

	it('does not mutate its input', () => {
		const cols = [col([1, 0], [2, 3]), col([2])];
		const copy = structuredClone(cols);
		targetedRankVerdicts(3, cols);
		expect(cols).toEqual(copy);
	});
});
