import type { Rng } from '../simulate/rng';
import { shuffleInPlace } from '../simulate/rng';

/**
 * Splits each group's replicates over `plates` plates as evenly as possible: every plate gets
 * ⌊n/P⌋ of a group and the remaining n mod P go to distinct plates, chosen among the least
 * loaded (ties broken at random), so plate loads never differ by more than one well.
 * Groups are visited in random order.
 *
 * Returns counts in group-major layout: `counts[g * plates + p]`.
 */
export function allocateReplicates(replicates: readonly number[], plates: number, rng: Rng): Int32Array {
	if (!Number.isInteger(plates) || plates < 1) throw new RangeError(`plates must be an integer ≥ 1, got ${plates}`);
	const g = replicates.length;
	const counts = new Int32Array(g * plates);
	const load = new Float64Array(plates);
	const order = shuffleInPlace(Array.from({ length: g }, (_, i) => i), rng);
	const plateIdx = Array.from({ length: plates }, (_, i) => i);
	const tie = new Float64Array(plates);
	for (const gi of order) {
		const n = replicates[gi];
		const base = Math.floor(n / plates);
		const extra = n - base * plates;
		for (let p = 0; p < plates; p++) {
			counts[gi * plates + p] = base;
			load[p] += base;
		}
		if (extra === 0) continue;
		for (let p = 0; p < plates; p++) tie[p] = rng.next();
		plateIdx.sort((a, b) => load[a] - load[b] || tie[a] - tie[b]);
		for (let q = 0; q < extra; q++) {
			const p = plateIdx[q];
			counts[gi * plates + p]++;
			load[p]++;
		}
	}
	return counts;
}
