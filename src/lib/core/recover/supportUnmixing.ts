import { symEigen } from '../linalg/symEigen';
import { projectRows, signalSubspace } from './signalSubspace';
import type { Unmixing } from './types';

/**
 * Support-pattern unmixing (targets known). Effects Δ (row-major R × p, one row per reagent)
 * are reduced to their top-d signal subspace; in it, row j of the unmixing is the direction
 * orthogonal to the estimated effects of the reagents that do not target factor j — the
 * smallest right singular vector of their stacked coordinates (the eigenvector of the
 * smallest eigenvalue of Σ_{r∌j} f_r f_rᵀ). Reagents with unknown targets (null) shape the
 * subspace but are not used for the rows. Output: d rows in factor order (when fewer than d
 * reagents span the subspace, the rows live in that smaller subspace and cannot all differ).
 *
 * Degenerate cases are data: when fewer than d − 1 known reagents avoid factor j its row is
 * not pinned down (warning; the smallest direction is still returned).
 */
export interface SupportUnmixingInput {
	effects: Float64Array;
	reagents: number;
	features: number;
	factors: number;
	/** Known target factor indices per reagent row, or null when unknown. */
	targets: readonly (readonly number[] | null)[];
	/** Factor labels for warnings (default "factor j"). */
	factorIds?: readonly string[];
}

export function supportUnmixing(input: SupportUnmixingInput): Unmixing {
	const { effects, reagents: R, features: p, factors: d, targets } = input;
	if (targets.length !== R) throw new RangeError(`supportUnmixing: targets has ${targets.length} rows, expected ${R}`);
	const sub = signalSubspace(effects, R, p, d);
	const k = sub.k;
	const coords = projectRows(effects, R, p, sub);
	const warnings: string[] = [];
	let converged = sub.converged;
	const rows = d;
	const w = new Float64Array(rows * p);
	const m = new Float64Array(k * k);
	// hits[r·d + j] = 1 when reagent r is known to target factor j; unknown targets (null) = 2.
	const hits = new Uint8Array(R * d);
	for (let r = 0; r < R; r++) {
		const t = targets[r];
		if (t === null) hits.fill(2, r * d, r * d + d);
		else for (let i = 0; i < t.length; i++) if (t[i] >= 0 && t[i] < d) hits[r * d + t[i]] = 1;
	}
	for (let j = 0; j < rows; j++) {
		const used = avoidingGram(m, coords, hits, R, d, j, k);
		if (used < k - 1) warnings.push(`${input.factorIds?.[j] ?? `factor ${j + 1}`}: only ${used} reagent(s) with known targets avoid it, fewer than the ${k - 1} needed to pin its direction down`);
		const eig = symEigen(m, k);
		converged &&= eig.converged;
		// Smallest eigenvalue's vector (column 0) mapped back to feature space.
		addColumnInBasis(w, j * p, eig.vectors, sub.basis, k, p);
	}
	return { k: rows, p, w, converged, iterations: 1, warnings };
}

/**
 * m (k × k, symmetric) = Σ f_r f_rᵀ over the reagents known not to target factor j (coords
 * row-major R × k); returns how many there are.
 */
function avoidingGram(m: Float64Array, coords: Float64Array, hits: Uint8Array, R: number, d: number, j: number, k: number): number {
	m.fill(0);
	let used = 0;
	for (let r = 0; r < R; r++) {
		if (hits[r * d + j] !== 0) continue;
		used++;
		const fr = r * k;
		for (let a = 0; a < k; a++) {
			const va = coords[fr + a];
			for (let b = 0; b <= a; b++) m[a * k + b] += va * coords[fr + b];
		}
	}
	for (let a = 0; a < k; a++) for (let b = 0; b < a; b++) m[b * k + a] = m[a * k + b];
	return used;
}

/** w[row…row+p) += Σ_t vectors[t·k] · basis row t (column 0 of the eigenvectors in feature space). */
function addColumnInBasis(w: Float64Array, row: number, vectors: Float64Array, basis: Float64Array, k: number, p: number): void {
	for (let t = 0; t < k; t++) {
		const v = vectors[t * k];
		if (v === 0) continue;
		const bt = t * p;
		for (let i = 0; i < p; i++) w[row + i] += v * basis[bt + i];
	}
}
