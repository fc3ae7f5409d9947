import type { Rng } from '../simulate/rng';
import { CONTROL, type Placement } from './placement';

/**
 * Objective (lower is better), averaged over (reagent, context) groups. For each of three
 * position variables — usable row, usable column and ring (distance to the edge) — a group adds
 *  - its chi-square contribution Σ_k (n_k − E_k)² / E_k minus the smallest value whole-well
 *    counts allow, divided by (levels − 1), where n_k is the group's wells at level k and
 *    E_k = n · (share of its plates' free wells at level k);
 *  - the squared standardised deviation of its mean position, (Σ v − n μ)² / (n σ²), with μ, σ²
 *    the mean and variance of the position over its plates' free wells (a gradient term).
 * Under random placement each part is at most about 1 per variable (less for small groups,
 * whose counts cannot be balanced much anyway), so a random layout scores up to about 6 and 0
 * means as balanced as whole wells allow. Free wells = wells not holding controls.
 */
export class PlacementObjective {
	readonly levels: [number, number, number];
	/** Value of each cell on each variable: row, column, ring. */
	readonly value: [Int32Array, Int32Array, Int32Array];
	/** Counts and chi-square weights per group × level, per variable. */
	readonly count: [Int32Array, Int32Array, Int32Array];
	readonly weight: [Float64Array, Float64Array, Float64Array];
	/** Per group × variable: D = Σ v − n μ, and the gradient weight 1 / (n σ²). */
	readonly dev: Float64Array;
	readonly gradW: Float64Array;
	/** Smallest possible Σ n² w over all groups and variables (subtracted so that 0 is attainable in principle). */
	readonly floor: number;

	constructor(readonly pl: Placement) {
		const { rows, columns, plates, occ, slotGroup, groups, groupReplicates, groupBlock, plateBlock, blocks, ring, rings } = pl;
		const cells = rows * columns;
		this.levels = [rows, columns, rings];
		const rowOf = new Int32Array(cells);
		const colOf = new Int32Array(cells);
		for (let c = 0; c < cells; c++) {
			rowOf[c] = Math.floor(c / columns);
			colOf[c] = c % columns;
		}
		this.value = [rowOf, colOf, ring];
		// Free-well share per block and level, and mean/variance of each variable per block.
		const share = this.levels.map((k) => new Float64Array(blocks * k));
		const freeTotal = new Float64Array(blocks);
		for (let p = 0; p < plates; p++) {
			const b = plateBlock[p];
			for (let c = 0; c < cells; c++) {
				if (occ[p * cells + c] === CONTROL) continue;
				freeTotal[b]++;
				for (let v = 0; v < 3; v++) share[v][b * this.levels[v] + this.value[v][c]]++;
			}
		}
		const mean = new Float64Array(blocks * 3);
		const variance = new Float64Array(blocks * 3);
		for (let b = 0; b < blocks; b++) {
			for (let v = 0; v < 3; v++) {
				const k = this.levels[v];
				let m = 0;
				for (let l = 0; l < k; l++) {
					share[v][b * k + l] /= freeTotal[b] || 1;
					m += share[v][b * k + l] * l;
				}
				let s2 = 0;
				for (let l = 0; l < k; l++) s2 += share[v][b * k + l] * (l - m) * (l - m);
				mean[b * 3 + v] = m;
				variance[b * 3 + v] = s2;
			}
		}
		this.count = [new Int32Array(groups * rows), new Int32Array(groups * columns), new Int32Array(groups * rings)];
		this.weight = [new Float64Array(groups * rows), new Float64Array(groups * columns), new Float64Array(groups * rings)];
		this.dev = new Float64Array(groups * 3);
		this.gradW = new Float64Array(groups * 3);
		for (let g = 0; g < groups; g++) {
			const n = groupReplicates[g];
			const b = groupBlock[g];
			for (let v = 0; v < 3; v++) {
				const k = this.levels[v];
				for (let l = 0; l < k; l++) {
					const e = n * share[v][b * k + l];
					this.weight[v][g * k + l] = k > 1 && e > 0 ? 1 / ((k - 1) * e) : 0;
				}
				const s2 = variance[b * 3 + v];
				this.gradW[g * 3 + v] = s2 > 0 && n > 0 ? 1 / (n * s2) : 0;
				this.dev[g * 3 + v] = -n * mean[b * 3 + v];
			}
		}
		// Σ m_l² w_l is separable and convex in whole counts, so adding wells one at a time where
		// the increase (2 m_l + 1) w_l is smallest reaches its minimum.
		let floor = 0;
		for (let g = 0; g < groups; g++) {
			for (let v = 0; v < 3; v++) {
				const k = this.levels[v];
				const w = this.weight[v].subarray(g * k, g * k + k);
				if (!w.some((x) => x > 0)) continue;
				const m = new Int32Array(k);
				for (let i = 0; i < groupReplicates[g]; i++) {
					let best = -1;
					let bestInc = Infinity;
					for (let l = 0; l < k; l++) {
						if (w[l] === 0) continue;
						const inc = (2 * m[l] + 1) * w[l];
						if (inc < bestInc) {
							bestInc = inc;
							best = l;
						}
					}
					m[best]++;
					floor += bestInc;
				}
			}
		}
		this.floor = floor;
		for (let p = 0; p < plates; p++) {
			for (let c = 0; c < cells; c++) {
				const s = occ[p * cells + c];
				if (s < 0) continue;
				const g = slotGroup[s];
				for (let v = 0; v < 3; v++) {
					const x = this.value[v][c];
					this.count[v][g * this.levels[v] + x]++;
					this.dev[g * 3 + v] += x;
				}
			}
		}
	}

	/** Total objective (sum over groups; divide by groups for the reported mean). */
	total(): number {
		const { groups } = this.pl;
		let t = 0;
		for (let g = 0; g < groups; g++) {
			for (let v = 0; v < 3; v++) {
				const k = this.levels[v];
				let chi = 0;
				for (let l = 0; l < k; l++) {
					const m = this.count[v][g * k + l];
					chi += m * m * this.weight[v][g * k + l];
				}
				t += chi;
				const d = this.dev[g * 3 + v];
				t += d * d * this.gradW[g * 3 + v];
			}
		}
		return t - this.floor;
	}

	/** Change of the total when one well of group g moves from cell a to cell b. */
	moveDelta(g: number, a: number, b: number): number {
		let delta = 0;
		for (let v = 0; v < 3; v++) {
			const val = this.value[v];
			const va = val[a];
			const vb = val[b];
			if (va === vb) continue;
			const base = g * this.levels[v];
			const cnt = this.count[v];
			const w = this.weight[v];
			// (n_b + 1)² − n_b² = 2 n_b + 1 and (n_a − 1)² − n_a² = 1 − 2 n_a.
			delta += w[base + vb] * (2 * cnt[base + vb] + 1) + w[base + va] * (1 - 2 * cnt[base + va]);
			const d = vb - va;
			delta += this.gradW[g * 3 + v] * d * (2 * this.dev[g * 3 + v] + d);
		}
		return delta;
	}

	applyMove(g: number, a: number, b: number) {
		for (let v = 0; v < 3; v++) {
			const va = this.value[v][a];
			const vb = this.value[v][b];
			if (va === vb) continue;
			const base = g * this.levels[v];
			this.count[v][base + va]--;
			this.count[v][base + vb]++;
			this.dev[g * 3 + v] += vb - va;
		}
	}
}

/** Objective of a placement, as the mean over groups (see `PlacementObjective`); 0 when there are no groups. */
export function placementScore(pl: Placement): number {
	return pl.groups > 0 ? new PlacementObjective(pl).total() / pl.groups : 0;
}

export interface OptimiseResult {
	iterations: number;
	accepted: number;
	initialScore: number;
	finalScore: number;
}

/**
 * Improves `pl.occ` in place by simulated annealing over swaps of two non-control wells of the
 * same plate (treatment–treatment of different groups, or treatment–empty). A swap is allowed
 * only if every group keeps its wells on distinct rows and distinct columns of the plate, so
 * the placement's hard constraints hold throughout; plate counts and controls never change.
 * The score is updated incrementally per swap; the temperature falls geometrically from T₀
 * (half the mean |Δ| of sampled swaps) to T₀/500 over `iterations` proposals. If the end state
 * scored worse than the start, the start is restored.
 */
export function optimisePlacement(pl: Placement, iterations: number, rng: Rng): OptimiseResult {
	if (!Number.isInteger(iterations) || iterations < 0) throw new RangeError(`iterations must be an integer ≥ 0, got ${iterations}`);
	const { rows, columns, plates, occ, slotGroup } = pl;
	if (rows > 32 || columns > 64) throw new RangeError(`usable grid ${rows} × ${columns} exceeds the 32 × 64 the optimiser supports`);
	const cells = rows * columns;
	const obj = new PlacementObjective(pl);
	const initialTotal = obj.total();
	const groups = Math.max(1, pl.groups);
	if (iterations === 0 || pl.groups === 0) return { iterations: 0, accepted: 0, initialScore: initialTotal / groups, finalScore: initialTotal / groups };

	// Hard-constraint masks per slot: rows (≤ 32) and columns (≤ 48, in two words) in use.
	const nSlots = slotGroup.length;
	const rowMask = new Uint32Array(nSlots);
	const colLo = new Uint32Array(nSlots);
	const colHi = new Uint32Array(nSlots);
	const free: number[] = [];
	const start = new Int32Array(plates + 1);
	for (let p = 0; p < plates; p++) {
		start[p] = free.length;
		for (let c = 0; c < cells; c++) {
			const s = occ[p * cells + c];
			if (s === CONTROL) continue;
			free.push(p * cells + c);
			if (s >= 0) {
				rowMask[s] |= 1 << Math.floor(c / columns);
				const col = c % columns;
				if (col < 32) colLo[s] |= 1 << col;
				else colHi[s] |= 1 << (col - 32);
			}
		}
	}
	start[plates] = free.length;
	const freeCells = Int32Array.from(free);
	const platesOfFree = new Int32Array(freeCells.length);
	for (let p = 0; p < plates; p++) platesOfFree.fill(p, start[p], start[p + 1]);

	const hasCol = (s: number, col: number) => (col < 32 ? (colLo[s] >>> col) & 1 : (colHi[s] >>> (col - 32)) & 1) === 1;
	const canMove = (s: number, a: number, b: number) => {
		const ra = Math.floor(a / columns);
		const rb = Math.floor(b / columns);
		if (ra !== rb && ((rowMask[s] >>> rb) & 1) === 1) return false;
		const ca = a - ra * columns;
		const cb = b - rb * columns;
		return ca === cb || !hasCol(s, cb);
	};
	const moveMask = (s: number, a: number, b: number) => {
		const ra = Math.floor(a / columns);
		const rb = Math.floor(b / columns);
		rowMask[s] = (rowMask[s] & ~(1 << ra)) | (1 << rb);
		const ca = a - ra * columns;
		const cb = b - rb * columns;
		if (ca < 32) colLo[s] &= ~(1 << ca);
		else colHi[s] &= ~(1 << (ca - 32));
		if (cb < 32) colLo[s] |= 1 << cb;
		else colHi[s] |= 1 << (cb - 32);
	};
	/** Δ of swapping global cells A and B of plate p, or NaN when not allowed / no change. */
	const swapDelta = (A: number, B: number, p: number) => {
		const sa = occ[A];
		const sb = occ[B];
		if (sa === sb) return NaN;
		const a = A - p * cells;
		const b = B - p * cells;
		if (sa >= 0 && !canMove(sa, a, b)) return NaN;
		if (sb >= 0 && !canMove(sb, b, a)) return NaN;
		let d = 0;
		if (sa >= 0) d += obj.moveDelta(slotGroup[sa], a, b);
		if (sb >= 0) d += obj.moveDelta(slotGroup[sb], b, a);
		return d;
	};
	const nFree = freeCells.length;

	// Starting temperature from the typical size of a swap's effect.
	let sumAbs = 0;
	let nAbs = 0;
	for (let t = 0; t < 2000 && nAbs < 500; t++) {
		const i = rng.int(nFree);
		const p = platesOfFree[i];
		const d = swapDelta(freeCells[i], freeCells[start[p] + rng.int(start[p + 1] - start[p])], p);
		if (d === d && d !== 0) {
			sumAbs += Math.abs(d);
			nAbs++;
		}
	}
	if (nAbs === 0) return { iterations: 0, accepted: 0, initialScore: initialTotal / groups, finalScore: initialTotal / groups };
	const t0 = (0.5 * sumAbs) / nAbs;
	const ratio = 1 / 500;
	const initialOcc = occ.slice();
	let temperature = t0;
	let accepted = 0;
	for (let it = 0; it < iterations; it++) {
		if ((it & 1023) === 0) temperature = t0 * Math.pow(ratio, it / iterations);
		// Proposal: a random free well, and a random free well of the same plate.
		const i = rng.int(nFree);
		const p = platesOfFree[i];
		const A = freeCells[i];
		const B = freeCells[start[p] + rng.int(start[p + 1] - start[p])];
		const d = swapDelta(A, B, p);
		if (d !== d) continue;
		if (d > 0 && rng.next() >= Math.exp(-d / temperature)) continue;
		const sa = occ[A];
		const sb = occ[B];
		const a = A - p * cells;
		const b = B - p * cells;
		if (sa >= 0) {
			obj.applyMove(slotGroup[sa], a, b);
			moveMask(sa, a, b);
		}
		if (sb >= 0) {
			obj.applyMove(slotGroup[sb], b, a);
			moveMask(sb, b, a);
		}
		occ[A] = sb;
		occ[B] = sa;
		accepted++;
	}
	// Recompute from scratch: the incremental total drifts by rounding only, but report exact figures.
	let finalTotal = new PlacementObjective(pl).total();
	if (finalTotal > initialTotal) {
		occ.set(initialOcc);
		finalTotal = initialTotal;
	}
	return { iterations, accepted, initialScore: initialTotal / groups, finalScore: finalTotal / groups };
}

