import { symmetricDecorrelate } from '../linalg/orthogonal';
import type { Rng } from '../simulate/rng';
import type { Unmixing } from './types';
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
	const wh = whiten(x, n, p, k);
	const xw = wh.whitened; // n × k
	let w: Float64Array = new Float64Array(k * k);
	for (let i = 0; i < k * k; i++) w[i] = opts.rng.normal();
	w = symmetricDecorrelate(w, k, k);
	const acc = new Float64Array(k * k);
	const gpSum = new Float64Array(k);
	const y = new Float64Array(k);
	const w1 = new Float64Array(k * k);
	let converged = false;
	let iterations = 0;
	for (let it = 1; it <= maxIter; it++) {
		iterations = it;
		acc.fill(0);
		gpSum.fill(0);
		for (let s = 0; s < n; s++) {
			const row = s * k;
			for (let a = 0; a < k; a++) {
				let v = 0;
				const wa = a * k;
				for (let b = 0; b < k; b++) v += w[wa + b] * xw[row + b];
				// tanh(αv) = 1 − 2/(e^{2αv} + 1), saturating safely for large |v|
				const e2 = Math.exp(2 * alpha * v);
				const g = e2 === Infinity ? 1 : 1 - 2 / (e2 + 1);
				y[a] = g;
				gpSum[a] += 1 - g * g;
			}
			for (let a = 0; a < k; a++) {
				const g = y[a];
				const aa = a * k;
				for (let b = 0; b < k; b++) acc[aa + b] += g * xw[row + b];
			}
		}
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
