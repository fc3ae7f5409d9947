import { symmetricDecorrelate } from '../linalg/orthogonal';
import type { Rng } from '../simulate/rng';
import type { Unmixing } from './types';
import { tanhViaExp } from './tanhViaExp';
import { whiten } from './whiten';

/**
 * FastICA (Hyvärinen 1999, IEEE TNN 10:626–634; Hyvärinen & Oja 2000) with the logcosh contrast
 * and symmetric (parallel) updates:
 *   W ← sym(E{g(WX)Xᵀ} − diag(E{g′(WX)})·W),  g(u) = tanh(αu), g′(u) = α(1 − tanh²(αu)),
 *   sym(W) = (WWᵀ)^(−1/2)W, on PCA-whitened data X (unit variance, `components` rows);
 * stops when max |(|diag(W₁Wᵀ)| − 1)| < tol. Defaults: α = 1, tol = 1e-4, maxIter = 200
 * (the common defaults listed in REFERENCES.md). The start is a standard normal matrix from
 * `rng`, symmetrically decorrelated.
 *
 * Input: samples x row-major n × p. Output: the unmixing in feature space, W·K (k × p), applied
 * to (centred) profiles. Non-convergence is reported (`converged: false`), not thrown.
 */
export interface FastIcaOptions {
	components: number;
	rng: Rng;
	alpha?: number;
	tol?: number;
	maxIter?: number;
}

export function fastIca(x: Float64Array, n: number, p: number, opts: FastIcaOptions): Unmixing {
	const k = opts.components;
	const alpha = opts.alpha ?? 1;
	const tol = opts.tol ?? 1e-4;
	const maxIter = opts.maxIter ?? 200;
	if (!Number.isInteger(k) || k < 1 || k > p) throw new RangeError(`fastIca: components must be an integer in [1, ${p}], got ${k}`);
	if (!(alpha >= 1 && alpha <= 2)) throw new RangeError(`fastIca: alpha must be in [1, 2], got ${alpha}`);
	// Whitened samples column by column (k columns of length n): each pass of the update below
	// streams through contiguous columns, which V8 runs much faster than k-long inner loops.
	const wh = whiten(x, n, p, k, 'columns');
	const cols = Array.from({ length: k }, (_, b) => wh.whitened.subarray(b * n, b * n + n));
	let w: Float64Array = new Float64Array(k * k);
	for (let i = 0; i < k * k; i++) w[i] = opts.rng.normal();
	w = symmetricDecorrelate(w, k, k);
	const acc = new Float64Array(k * k);
	const gpSum = new Float64Array(k);
	const g = new Float64Array(n);
	const g2 = new Float64Array(n);
	const w1 = new Float64Array(k * k);
	let converged = false;
	let iterations = 0;
	for (let it = 1; it <= maxIter; it++) {
		iterations = it;
		let a = 0;
		for (; a + 1 < k; a += 2) updatePair(cols, n, k, w, a, alpha, g, g2, acc, gpSum);
		if (a < k) gpSum[a] = updateRow(cols, n, k, w, a, alpha, g, acc);
		for (let a = 0; a < k; a++) {
			const gp = (alpha * gpSum[a]) / n;
			for (let b = 0; b < k; b++) w1[a * k + b] = acc[a * k + b] / n - gp * w[a * k + b];
		}
		const wNew = symmetricDecorrelate(w1, k, k);
		let lim = 0;
		for (let a = 0; a < k; a++) {
			let dot = 0;
			for (let b = 0; b < k; b++) dot += wNew[a * k + b] * w[a * k + b];
			lim = Math.max(lim, Math.abs(Math.abs(dot) - 1));
		}
		w = wNew;
		if (lim < tol) {
			converged = true;
			break;
		}
	}
	// Feature-space unmixing W·K.
	const out = new Float64Array(k * p);
	for (let a = 0; a < k; a++)
		for (let b = 0; b < k; b++) {
			const wab = w[a * k + b];
			for (let i = 0; i < p; i++) out[a * p + i] += wab * wh.whitener[b * p + i];
		}
	const warnings = [...wh.warnings];
	if (!converged) warnings.push(`FastICA did not converge within ${maxIter} iterations (tolerance ${tol})`);
	return { k, p, w: out, converged, iterations, warnings };
}

/**
 * One row of the FastICA update on whitened sample columns `cols` (k views of length n):
 * y = Σ_b w[a, b]·col_b, g = tanh(α·y) (into `g`), acc[a, b] = Σ_s g_s·col_b[s]; returns Σ_s (1 − g_s²).
 * Columns are taken two at a time so each pass over the samples does twice the work per load.
 */
function updateRow(cols: Float64Array[], n: number, k: number, w: Float64Array, a: number, alpha: number, g: Float64Array, acc: Float64Array): number {
	const wa = a * k;
	let b = 0;
	if (k % 2 === 1) {
		const w0 = w[wa];
		const c0 = cols[0];
		for (let s = 0; s < n; s++) g[s] = w0 * c0[s];
		b = 1;
	} else g.fill(0, 0, n);
	let gp = 0;
	for (; b < k; b += 2) {
		const w0 = w[wa + b];
		const w1 = w[wa + b + 1];
		const c0 = cols[b];
		const c1 = cols[b + 1];
		if (b + 2 < k) {
			for (let s = 0; s < n; s++) g[s] += w0 * c0[s] + w1 * c1[s];
		} else {
			// Last pair: finish y and apply tanh(αy).
			for (let s = 0; s < n; s++) {
				const t = tanhViaExp(alpha * (g[s] + w0 * c0[s] + w1 * c1[s]));
				g[s] = t;
				gp += 1 - t * t;
			}
		}
	}
	if (k === 1) {
		// No pair was left for the tanh pass above.
		for (let s = 0; s < n; s++) {
			const t = tanhViaExp(alpha * g[s]);
			g[s] = t;
			gp += 1 - t * t;
		}
	}
	b = 0;
	for (; b + 1 < k; b += 2) {
		const c0 = cols[b];
		const c1 = cols[b + 1];
		let s0 = 0;
		let s1 = 0;
		for (let s = 0; s < n; s++) {
			const t = g[s];
			s0 += t * c0[s];
			s1 += t * c1[s];
		}
		acc[wa + b] = s0;
		acc[wa + b + 1] = s1;
	}
	if (b < k) {
		const c0 = cols[b];
		let s0 = 0;
		for (let s = 0; s < n; s++) s0 += g[s] * c0[s];
		acc[wa + b] = s0;
	}
	return gp;
}

/**
 * Rows a and a + 1 of the update together (the same arithmetic as updateRow for each): every
 * column value loaded serves both rows. k ≥ 2. Writes Σ_s (1 − g_s²) of each row to gpSum.
 */
function updatePair(cols: Float64Array[], n: number, k: number, w: Float64Array, a: number, alpha: number, ga: Float64Array, gb: Float64Array, acc: Float64Array, gpSum: Float64Array): void {
	const wa = a * k;
	const wb = wa + k;
	let b = 0;
	if (k % 2 === 1) {
		const pa = w[wa];
		const pb = w[wb];
		const c0 = cols[0];
		for (let s = 0; s < n; s++) {
			const v = c0[s];
			ga[s] = pa * v;
			gb[s] = pb * v;
		}
		b = 1;
	} else {
		ga.fill(0, 0, n);
		gb.fill(0, 0, n);
	}
	let gpa = 0;
	let gpb = 0;
	for (; b < k; b += 2) {
		const pa0 = w[wa + b];
		const pa1 = w[wa + b + 1];
		const pb0 = w[wb + b];
		const pb1 = w[wb + b + 1];
		const c0 = cols[b];
		const c1 = cols[b + 1];
		if (b + 2 < k) {
			for (let s = 0; s < n; s++) {
				const v0 = c0[s];
				const v1 = c1[s];
				ga[s] += pa0 * v0 + pa1 * v1;
				gb[s] += pb0 * v0 + pb1 * v1;
			}
		} else {
			for (let s = 0; s < n; s++) {
				const v0 = c0[s];
				const v1 = c1[s];
				const ta = tanhViaExp(alpha * (ga[s] + pa0 * v0 + pa1 * v1));
				const tb = tanhViaExp(alpha * (gb[s] + pb0 * v0 + pb1 * v1));
				ga[s] = ta;
				gb[s] = tb;
				gpa += 1 - ta * ta;
				gpb += 1 - tb * tb;
			}
		}
	}
	gpSum[a] = gpa;
	gpSum[a + 1] = gpb;
	b = 0;
	for (; b + 1 < k; b += 2) {
		const c0 = cols[b];
		const c1 = cols[b + 1];
		let sa0 = 0;
		let sa1 = 0;
		let sb0 = 0;
		let sb1 = 0;
		for (let s = 0; s < n; s++) {
			const v0 = c0[s];
			const v1 = c1[s];
			const ta = ga[s];
			const tb = gb[s];
			sa0 += ta * v0;
			sa1 += ta * v1;
			sb0 += tb * v0;
			sb1 += tb * v1;
		}
		acc[wa + b] = sa0;
		acc[wa + b + 1] = sa1;
		acc[wb + b] = sb0;
		acc[wb + b + 1] = sb1;
	}
	if (b < k) {
		const c0 = cols[b];
		let sa0 = 0;
		let sb0 = 0;
		for (let s = 0; s < n; s++) {
			const v0 = c0[s];
			sa0 += ga[s] * v0;
			sb0 += gb[s] * v0;
		}
		acc[wa + b] = sa0;
		acc[wb + b] = sb0;
	}
}
