import { cholesky, choleskySolve } from '../linalg/cholesky';
import { projectRows, signalSubspace } from './signalSubspace';
import type { Unmixing } from './types';

/**
 * Sparsity-seeking unmixing (targets unknown, each reagent expected to hit few factors).
 * Effects Δ (row-major R × p) are reduced to their top-d signal subspace, coordinates F (R × k).
 * A row w of the unmixing makes F·w sparse (it is orthogonal to every reagent that does not move
 * its factor). For each reagent r, the sparse direction through r is found by
 *   minimise ‖F·w‖₁ subject to f_rᵀw = 1
 * (the linear-programming formulation of sparse-vector recovery of Spielman, Wang & Wright 2012),
 * solved by iteratively reweighted least squares (weights 1/max(|f_iᵀw|, ε); each step
 * w = M⁻¹f_r / (f_rᵀM⁻¹f_r), M = Σ ω_i f_i f_iᵀ). The d candidates with the sparsest
 * profiles (smallest ‖Fw‖₁/‖Fw‖∞) that are not near-duplicates (|cos| < 0.9) become the rows.
 * Rows are in no particular factor order (the score matches them).
 */
export interface SparseUnmixingInput {
	effects: Float64Array;
	reagents: number;
	features: number;
	factors: number;
	/** IRLS iterations per candidate (default 30). */
	iterations?: number;
}

export function sparseUnmixing(input: SparseUnmixingInput): Unmixing {
	const { effects, reagents: R, features: p, factors: d } = input;
	const iters = input.iterations ?? 30;
	const sub = signalSubspace(effects, R, p, d);
	const k = sub.k;
	const f = projectRows(effects, R, p, sub);
	const warnings: string[] = [];
	const cands: { w: Float64Array; score: number }[] = [];
	const m = new Float64Array(k * k);
	const fw = new Float64Array(R);
	let allConverged = sub.converged;
	for (let r = 0; r < R; r++) {
		const fr = f.subarray(r * k, r * k + k);
		let norm = 0;
		for (let t = 0; t < k; t++) norm += fr[t] * fr[t];
		if (!(norm > 0)) continue;
		const weights = new Float64Array(R).fill(1);
		let w = new Float64Array(k);
		let conv = false;
		for (let it = 0; it < iters; it++) {
			m.fill(0);
			for (let i = 0; i < R; i++) {
				const om = weights[i];
				const fi = i * k;
				for (let a = 0; a < k; a++) {
					const va = om * f[fi + a];
					for (let b = 0; b <= a; b++) m[a * k + b] += va * f[fi + b];
				}
			}
			let trace = 0;
			for (let a = 0; a < k; a++) trace += m[a * k + a];
			for (let a = 0; a < k; a++) {
				m[a * k + a] += 1e-10 * trace; // ridge keeps M positive definite
				for (let b = 0; b < a; b++) m[b * k + a] = m[a * k + b];
			}
			const mi = choleskySolve(cholesky(m, k), fr);
			let denom = 0;
			for (let t = 0; t < k; t++) denom += fr[t] * mi[t];
			const wNew = mi.map((v) => v / denom);
			let change = 0;
			for (let t = 0; t < k; t++) change = Math.max(change, Math.abs(wNew[t] - w[t]));
			w = wNew;
			let maxAbs = 0;
			for (let i = 0; i < R; i++) {
				let v = 0;
				for (let t = 0; t < k; t++) v += f[i * k + t] * w[t];
				fw[i] = Math.abs(v);
				maxAbs = Math.max(maxAbs, fw[i]);
			}
			const eps = 1e-6 * Math.max(maxAbs, 1e-300);
			for (let i = 0; i < R; i++) weights[i] = 1 / Math.max(fw[i], eps);
			let wn = 0;
			for (let t = 0; t < k; t++) wn += w[t] * w[t];
			if (change <= 1e-9 * Math.sqrt(wn)) {
				conv = true;
				break;
			}
		}
		if (!conv) allConverged = false;
		let l1 = 0;
		let linf = 0;
		for (let i = 0; i < R; i++) {
			l1 += fw[i];
			linf = Math.max(linf, fw[i]);
		}
		let wn = 0;
		for (let t = 0; t < k; t++) wn += w[t] * w[t];
		wn = Math.sqrt(wn);
		cands.push({ w: w.map((v) => v / wn), score: linf > 0 ? l1 / linf : Infinity });
	}
	cands.sort((a, b) => a.score - b.score);
	const chosen: Float64Array[] = [];
	for (const threshold of [0.9, 0.99, 1.01]) {
		for (const c of cands) {
			if (chosen.length >= d) break;
			if (chosen.includes(c.w)) continue;
			if (chosen.every((o) => Math.abs(dot(o, c.w)) < threshold)) chosen.push(c.w);
		}
		if (chosen.length >= d) break;
	}
	if (chosen.length < d) warnings.push(`sparsity-seeking unmixing found only ${chosen.length} distinct sparse directions for ${d} factors`);
	const rows = chosen.length;
	const w = new Float64Array(rows * p);
	for (let j = 0; j < rows; j++)
		for (let t = 0; t < k; t++) {
			const v = chosen[j][t];
			for (let i = 0; i < p; i++) w[j * p + i] += v * sub.basis[t * p + i];
		}
	return { k: rows, p, w, converged: allConverged, iterations: iters, warnings };
}

function dot(a: Float64Array, b: Float64Array): number {
	let s = 0;
	for (let i = 0; i < a.length; i++) s += a[i] * b[i];
	return s;
}
