import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { diagonalOrder } from '../../src/lib/core/layout/diagonalOrder';
import { allocateReplicates } from '../../src/lib/core/layout/allocateReplicates';
import { optimisePlacement, placementScore, PlacementObjective } from '../../src/lib/core/layout/optimisePlacement';
import { CONTROL, EMPTY, type Placement } from '../../src/lib/core/layout/placement';
import { rngFor, shuffleInPlace } from '../../src/lib/core/simulate/rng';

// Usable grids of the three formats with and without the edge (rows × columns).
const GRIDS: [number, number][] = [
	[8, 12],
	[6, 10],
	[16, 24],
	[14, 22],
	[32, 48],
	[30, 46]
];

describe('diagonalOrder', () => {
	it.each(GRIDS)('%i × %i: visits every cell once; runs of ≤ R cells use distinct rows and columns; prefixes are balanced', (rows, cols) => {
		const rng = rngFor(11, rows, cols);
		const order = diagonalOrder(rows, cols, shuffleInPlace([...Array(rows).keys()], rng), shuffleInPlace([...Array(cols).keys()], rng));
		expect(new Set(order).size).toBe(rows * cols);
		for (let j = 0; j + rows <= order.length; j++) {
			const run = Array.from(order.subarray(j, j + rows));
			expect(new Set(run.map((c) => Math.floor(c / cols))).size).toBe(rows);
			expect(new Set(run.map((c) => c % cols)).size).toBe(rows);
		}
		const rowCount = new Array(rows).fill(0);
		const colCount = new Array(cols).fill(0);
		for (let j = 0; j < order.length; j++) {
			rowCount[Math.floor(order[j] / cols)]++;
			colCount[order[j] % cols]++;
			expect(Math.max(...rowCount) - Math.min(...rowCount)).toBeLessThanOrEqual(1);
			expect(Math.max(...colCount) - Math.min(...colCount)).toBeLessThanOrEqual(1);
		}
	});
});

describe('allocateReplicates', () => {
	it('splits each group evenly over plates and keeps plate loads within one well (property)', () => {
		fc.assert(
			fc.property(fc.array(fc.integer({ min: 0, max: 30 }), { maxLength: 40 }), fc.integer({ min: 1, max: 12 }), fc.integer(), (reps, plates, seed) => {
				const counts = allocateReplicates(reps, plates, rngFor(seed));
				const load = new Array(plates).fill(0);
				reps.forEach((n, g) => {
					const row = Array.from(counts.subarray(g * plates, g * plates + plates));
					expect(row.reduce((a, b) => a + b, 0)).toBe(n);
					expect(Math.max(...row) - Math.min(...row)).toBeLessThanOrEqual(1);
					row.forEach((v, p) => (load[p] += v));
				});
				expect(Math.max(...load) - Math.min(...load)).toBeLessThanOrEqual(1);
			})
		);
	});
});

/** A small random placement that obeys the hard constraints (built with diagonalOrder). */
function randomPlacement(seed: number): Placement {
	const rng = rngFor(seed);
	const rows = 6;
	const columns = 10;
	const plates = 2;
	const groups = 9;
	const reps = 5;
	const cells = rows * columns;
	const occ = new Int32Array(plates * cells).fill(EMPTY);
	const slotGroup: number[] = [];
	const slotPlate: number[] = [];
	const alloc = allocateReplicates(new Array(groups).fill(reps), plates, rng);
	for (let p = 0; p < plates; p++) {
		const order = diagonalOrder(rows, columns, shuffleInPlace([...Array(rows).keys()], rng), shuffleInPlace([...Array(columns).keys()], rng));
		let at = 0;
		for (let k = 0; k < 6; k++) occ[p * cells + order[at++]] = CONTROL;
		for (let g = 0; g < groups; g++) {
			const slot = slotGroup.length;
			slotGroup.push(g);
			slotPlate.push(p);
			for (let k = 0; k < alloc[g * plates + p]; k++) occ[p * cells + order[at++]] = slot;
		}
	}
	const ring = new Int32Array(cells);
	for (let c = 0; c < cells; c++) {
		const r = Math.floor(c / columns);
		const q = c % columns;
		ring[c] = Math.min(r, q, rows - 1 - r, columns - 1 - q);
	}
	return {
		rows,
		columns,
		plates,
		occ,
		slotGroup: Int32Array.from(slotGroup),
		slotPlate: Int32Array.from(slotPlate),
		groups,
		groupReplicates: new Int32Array(groups).fill(reps),
		groupBlock: new Int32Array(groups),
		plateBlock: new Int32Array(plates),
		blocks: 1,
		ring,
		rings: 3
	};
}

describe('placement objective and optimiser', () => {
	it('the incremental Δ of a move equals the change of the recomputed objective (property)', () => {
		fc.assert(
			fc.property(fc.integer({ min: 0, max: 10_000 }), fc.integer({ min: 0, max: 119 }), fc.integer({ min: 0, max: 59 }), (seed, from, toCell) => {
				const pl = randomPlacement(seed);
				const slot = pl.occ[from];
				const p = Math.floor(from / 60);
				const to = p * 60 + toCell;
				fc.pre(slot >= 0 && pl.occ[to] === EMPTY);
				const obj = new PlacementObjective(pl);
				const before = obj.total();
				const delta = obj.moveDelta(pl.slotGroup[slot], from - p * 60, toCell);
				pl.occ[to] = slot;
				pl.occ[from] = EMPTY;
				const after = new PlacementObjective(pl).total();
				expect(delta).toBeCloseTo(after - before, 9);
			})
		);
	});
	it('keeps every hard constraint, never worsens the score, and is reproducible', () => {
		for (const seed of [1, 2, 3]) {
			const pl = randomPlacement(seed);
			const controlsBefore = Array.from(pl.occ).map((o, i) => (o === CONTROL ? i : -1)).filter((i) => i >= 0);
			const res = optimisePlacement(pl, 20_000, rngFor(seed, 9));
			expect(res.finalScore).toBeLessThanOrEqual(res.initialScore);
			expect(res.finalScore).toBeCloseTo(placementScore(pl), 12);
			expect(Array.from(pl.occ).map((o, i) => (o === CONTROL ? i : -1)).filter((i) => i >= 0)).toEqual(controlsBefore);
			for (let s = 0; s < pl.slotGroup.length; s++) {
				const cells = Array.from(pl.occ).map((o, i) => (o === s ? i % 60 : -1)).filter((c) => c >= 0);
				expect(new Set(cells.map((c) => Math.floor(c / 10))).size).toBe(cells.length);
				expect(new Set(cells.map((c) => c % 10)).size).toBe(cells.length);
				expect(Array.from(pl.occ).every((o, i) => o !== s || Math.floor(i / 60) === pl.slotPlate[s])).toBe(true);
			}
			const again = randomPlacement(seed);
			optimisePlacement(again, 20_000, rngFor(seed, 9));
			expect(Array.from(again.occ)).toEqual(Array.from(pl.occ));
		}
	});
	it('zero iterations leave the placement untouched; bad budgets throw', () => {
		const pl = randomPlacement(4);
		const before = Array.from(pl.occ);
		expect(optimisePlacement(pl, 0, rngFor(1))).toMatchObject({ iterations: 0, accepted: 0 });
		expect(Array.from(pl.occ)).toEqual(before);
		expect(() => optimisePlacement(pl, -1, rngFor(1))).toThrow(/iterations/);
	});
});
