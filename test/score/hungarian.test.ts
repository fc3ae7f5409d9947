import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { linearSumAssignment } from 'linear-sum-assignment';
import { hungarian } from '../../src/lib/core/score';

/** Brute force over all permutations (small n only). */
function bruteForce(cost: number[][]): number {
	const n = cost.length;
	const m = cost[0].length;
	let best = Infinity;
	const used = new Array(m).fill(false);
	const rec = (i: number, acc: number) => {
		if (i === n) return void (best = Math.min(best, acc));
		for (let j = 0; j < m; j++)
			if (!used[j]) {
				used[j] = true;
				rec(i + 1, acc + cost[i][j]);
				used[j] = false;
			}
	};
	rec(0, 0);
	return best;
}

describe('hungarian', () => {
	it('solves the worked example of the scipy linear_sum_assignment documentation', () => {
		// Source: REFERENCES.md "Hungarian algorithm" — cost [[4,1,3],[2,0,5],[3,2,2]] → columns [1,0,2], minimum 5 (verified; brute force agrees).
		const res = hungarian([
			[4, 1, 3],
			[2, 0, 5],
			[3, 2, 2]
		]);
		expect(res.assignment).toEqual([1, 0, 2]);
		expect(res.cost).toBe(5);
	});

	it('agrees with the npm reference implementation linear-sum-assignment (Jonker–Volgenant) on random square and rectangular matrices', () => {
		fc.assert(
			fc.property(fc.integer({ min: 1, max: 9 }), fc.integer({ min: 0, max: 4 }), fc.integer({ min: 1, max: 1e9 }), (n, extra, seed) => {
				let s = seed;
				const rnd = () => ((s = (Math.imul(s, 1103515245) + 12345) >>> 0) / 4294967296) * 10;
				const m = n + extra;
				const cost = Array.from({ length: n }, () => Array.from({ length: m }, () => Math.round(rnd() * 100) / 100));
				const ours = hungarian(cost);
				const ref = linearSumAssignment(cost, { maximaze: false });
				const refCost = Array.from(ref.rowAssignments).reduce((t, j, i) => t + cost[i][j], 0);
				expect(ours.cost).toBeCloseTo(refCost, 9);
				expect(new Set(ours.assignment).size).toBe(n);
				expect(ours.assignment.reduce((t, j, i) => t + cost[i][j], 0)).toBeCloseTo(ours.cost, 12);
			}),
			{ numRuns: 200 }
		);
	});

	it('matches brute force when there are more rows than columns (every column used once)', () => {
		const cost = [
			[5, 9],
			[1, 7],
			[8, 2],
			[4, 4]
		];
		const res = hungarian(cost);
		const t = cost[0].map((_, j) => cost.map((r) => r[j]));
		expect(res.cost).toBe(bruteForce(t));
		expect(res.assignment.filter((j) => j >= 0).length).toBe(2);
	});

	it('handles empty input and rejects ragged or non-finite matrices', () => {
		expect(hungarian([])).toEqual({ assignment: [], cost: 0 });
		expect(() => hungarian([[1, 2], [3]])).toThrow(/row 1 has 1 entries, expected 2/);
		expect(() => hungarian([[1, NaN]])).toThrow(/cost\[0\]\[1\] must be a finite number/);
	});

	it('does not mutate its input', () => {
		const cost = [
			[3, 1],
			[1, 3]
		];
		const copy = cost.map((r) => [...r]);
		hungarian(cost);
		expect(cost).toEqual(copy);
	});
});
