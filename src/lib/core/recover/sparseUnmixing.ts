import { cholesky, choleskySolve } from '../linalg/cholesky';
import { symEigen } from '../linalg/symEigen';
import { projectRows, signalSubspace } from './signalSubspace';
import type { Unmixing } from './types';

/**
 * Sparsity-seeking unmixing (targets unknown, each reagent expected to hit few factors).
 * Effects Δ (row-major R × p) are reduced to their top-d signal subspace, coordinates F (R × k).
 * A row w of the unmixing makes F·w sparse (it is orthogonal to every reagent that does not move
 * its factor). For each reagent r, the sparse direction through r is found by
 *   minimise ‖F·w‖₁ subject to f_rᵀw = 1
 * (the linear-programming formulation of sparse-vector recovery of Spielman, Wang & Wright 2012),
 * solved by iteratively reweighted least squares (weights 1/max(|f_iᵀw|, ε), ε = IRLS_FLOOR·max|f_iᵀw|; each step
 * w = M⁻¹f_r / (f_rᵀM⁻¹f_r), M = Σ ω_i f_i f_iᵀ). The d candidates with the sparsest
 * profiles (smallest effective support (‖Fw‖₁/‖Fw‖₂)², which counts k equal entries as k) become
 * the rows, skipping any whose response profile |F·w| resembles a chosen one (cosine ≥ SAME_FACTOR_COS).
 * Each chosen row is then refined: its support (reagents with |f_iᵀw| ≥ SUPPORT_SHARE·max) is read
 * off, and the row re-estimated as in support-pattern unmixing — the smallest eigenvector of
 * Σ f_i f_iᵀ over the reagents outside the support (when at least k − 1 are).
 * Rows are in no particular factor order (the score matches them).
 */
/** Share of a row's largest reagent response above which a reagent counts as moving that factor (common practice choice, ours). */
export const SUPPORT_SHARE = 0.2;
/** Cosine of two response profiles above which they are taken to describe the same factor (ours). */
export const SAME_FACTOR_COS = 0.7;
/** IRLS weight floor relative to the largest response (smoothed ℓ1; common practice choice). */
export const IRLS_FLOOR = 1e-3;
/** IRLS stopping rule: relative change of the objective ‖F·w‖₁ below this (common practice choice). */
export const IRLS_TOL = 1e-4;

export interface SparseUnmixingInput {
	effects: Float64Array;
	reagents: number;
	features: number;
	factors: number;
	/** Most IRLS iterations per candidate (default 100; stops earlier when ‖F·w‖₁ changes by < IRLS_TOL relative). */
	iterations?: number;
}

export function sparseUnmixing(input: SparseUnmixingInput): Unmixing {
	const { effects, reagents: R, features: p, factors: d } = input;
	const iters = input.iterations ?? 100;
	const sub = signalSubspace(effects, R, p, d);
	const k = sub.k;
	const f = projectRows(effects, R, p, sub);
	const warnings: string[] = [];
	const cands: { w: Float64Array; resp: Float64Array; score: number; conv: boolean }[] = [];
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
		let previous = Infinity;
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
			w = wNew;
			let maxAbs = 0;
			let objective = 0;
			for (let i = 0; i < R; i++) {
				let v = 0;
				for (let t = 0; t < k; t++) v += f[i * k + t] * w[t];
				fw[i] = Math.abs(v);
				objective += fw[i];
				maxAbs = Math.max(maxAbs, fw[i]);
			}
			const eps = IRLS_FLOOR * Math.max(maxAbs, 1e-300);
			for (let i = 0; i < R; i++) weights[i] = 1 / Math.max(fw[i], eps);
			if (Math.abs(previous - objective) <= IRLS_TOL * objective) {
				conv = true;
				break;
			}
			previous = objective;
		}
		let l1 = 0;
		let l2 = 0;
		for (let i = 0; i < R; i++) {
			l1 += fw[i];
			l2 += fw[i] * fw[i];
		}
		let wn = 0;
		for (let t = 0; t < k; t++) wn += w[t] * w[t];
		wn = Math.sqrt(wn);
		const l2n = Math.sqrt(l2) || 1;
		cands.push({ w: w.map((v) => v / wn), resp: fw.map((v) => v / l2n), score: l2 > 0 ? (l1 * l1) / l2 : Infinity, conv });
	}
	cands.sort((a, b) => a.score - b.score);
	// Two candidates describe the same factor when the same reagents respond to them: compare
	// their normalised response profiles |F·w| (cosine); keep the sparsest of each group.
	const chosen: Float64Array[] = [];
	const chosenResp: Float64Array[] = [];
	for (const threshold of [SAME_FACTOR_COS, 0.95, 1.01]) {
		for (const c of cands) {
			if (chosen.length >= d) break;
			if (chosen.includes(c.w)) continue;
			if (chosenResp.every((o) => dot(o, c.resp) < threshold)) {
				if (!c.conv) allConverged = false;
				chosen.push(c.w);
				chosenResp.push(c.resp);
			}
		}
		if (chosen.length >= d) break;
	}
	if (chosen.length < d) warnings.push(`sparsity-seeking unmixing found only ${chosen.length} distinct sparse directions for ${d} factors`);
	// Refinement: read each row's support off its profile (|f_iᵀw| ≥ SUPPORT_SHARE · max) and
	// re-estimate the row as in support-pattern unmixing, orthogonal to the reagents outside it.
	for (let j = 0; j < chosen.length; j++) {
		const w0 = chosen[j];
		let mx = 0;
		for (let i = 0; i < R; i++) {
			let v = 0;
			for (let t = 0; t < k; t++) v += f[i * k + t] * w0[t];
			fw[i] = Math.abs(v);
			mx = Math.max(mx, fw[i]);
		}
		m.fill(0);
		let outside = 0;
		for (let i = 0; i < R; i++) {
			if (fw[i] >= SUPPORT_SHARE * mx) continue;
			outside++;
			for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) m[a * k + b] += f[i * k + a] * f[i * k + b];
		}
		if (outside < k - 1) continue;
		const eig = symEigen(m, k);
		const v = Float64Array.from({ length: k }, (_, t) => eig.vectors[t * k]);
		if (dot(v, w0) < 0) for (let t = 0; t < k; t++) v[t] = -v[t];
		chosen[j] = v;
	}
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
