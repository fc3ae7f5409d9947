import type { Rng } from '../simulate/rng';

/**
 * Contrastive lift for nonlinear mixes: a multinomial logistic regression that classifies
 * samples (wells or cells) by their label (reagent or context) on standardised features plus
 * random Fourier features φ(x) = √(2/D)·cos(Ωx̃ + b), Ω ~ N(0, 1/ℓ²), b ~ U(0, 2π)
 * (Rahimi & Recht 2007; ℓ = √p for standardised inputs, common practice). The centred logits
 * are the lifted representation: for class-conditional shifts of Gaussian-like latents the
 * log-odds are linear in the latents (the idea behind segment-contrastive learning, Hyvärinen
 * & Morioka 2016), so a linear step on the logits can undo a mild nonlinearity.
 * Training: full-batch gradient descent with Nesterov momentum on the L2-penalised
 * cross-entropy, step 1/L with L = ½·λmax(ΦᵀΦ/n) + l2 (a bound on the Hessian; Φ = feature rows).
 * Everything in the result is plain data; `applyLift` maps one profile to its K logits.
 */
export interface Lift {
	p: number;
	classes: number;
	rff: number;
	/** Standardisation of the inputs. */
	mean: Float64Array;
	scale: Float64Array;
	/** Row-major rff × p and rff. */
	omega: Float64Array;
	phase: Float64Array;
	/** Row-major classes × (p + rff + 1): linear, random-feature and bias weights. */
	weights: Float64Array;
	converged: boolean;
	iterations: number;
	/** Training accuracy (share of samples whose largest logit is their label). */
	accuracy: number;
}

export interface ContrastiveLiftOptions {
	rng: Rng;
	/** Random Fourier features D (default 64). */
	features?: number;
	/** L2 penalty (default 1e-2). */
	l2?: number;
	/** Gradient steps (default 200). */
	maxIter?: number;
	/** Stop when the largest gradient entry is below this (default 1e-3). */
	tol?: number;
}

export function contrastiveLift(x: Float64Array, labels: Int32Array, n: number, p: number, classes: number, opts: ContrastiveLiftOptions): Lift {
	if (n < 2) throw new RangeError(`contrastiveLift: need at least 2 samples, got ${n}`);
	if (classes < 2) throw new RangeError(`contrastiveLift: need at least 2 classes, got ${classes}`);
	for (let s = 0; s < n; s++) if (labels[s] < 0 || labels[s] >= classes) throw new RangeError(`contrastiveLift: label ${labels[s]} of sample ${s} is outside [0, ${classes})`);
	const D = opts.features ?? 64;
	const l2 = opts.l2 ?? 1e-2;
	const maxIter = opts.maxIter ?? 200;
	const tol = opts.tol ?? 1e-3;
	const mean = new Float64Array(p);
	const scale = new Float64Array(p);
	for (let s = 0; s < n; s++) for (let i = 0; i < p; i++) mean[i] += x[s * p + i];
	for (let i = 0; i < p; i++) mean[i] /= n;
	for (let s = 0; s < n; s++)
		for (let i = 0; i < p; i++) {
			const v = x[s * p + i] - mean[i];
			scale[i] += v * v;
		}
	for (let i = 0; i < p; i++) scale[i] = Math.sqrt(scale[i] / n) || 1;
	const bw = Math.sqrt(p);
	const omega = new Float64Array(D * p);
	for (let i = 0; i < D * p; i++) omega[i] = opts.rng.normal() / bw;
	const phase = new Float64Array(D);
	for (let t = 0; t < D; t++) phase[t] = 2 * Math.PI * opts.rng.next();
	const q = p + D + 1;
	const lift: Lift = { p, classes, rff: D, mean, scale, omega, phase, weights: new Float64Array(classes * q), converged: false, iterations: 0, accuracy: 0 };
	// Design matrix Φ (n × q).
	const phi = new Float64Array(n * q);
	let maxRow = 0;
	for (let s = 0; s < n; s++) {
		featuresOf(lift, x, s * p, phi, s * q);
		let r2 = 0;
		for (let t = 0; t < q; t++) r2 += phi[s * q + t] ** 2;
		maxRow = Math.max(maxRow, r2);
	}
	// Lipschitz bound of the gradient: the softmax Hessian is ≤ ½·(ΦᵀΦ/n) ⊗ I (its per-sample
	// factor diag(p) − ppᵀ has eigenvalues ≤ ½), so L = ½·λmax(ΦᵀΦ/n) + l2; λmax by power iteration
	// (capped by the cruder ½·max‖φ_i‖² bound, which is always valid).
	const L = Math.min(0.5 * maxRow, 0.5 * 1.02 * largestEigen(phi, n, q, opts.rng)) + l2;
	const step = 1 / L;
	const W = lift.weights;
	const V = new Float64Array(classes * q); // look-ahead point
	const Wprev = new Float64Array(classes * q);
	const grad = new Float64Array(classes * q);
	const logits = new Float64Array(classes);
	let tk = 1;
	let it = 0;
	for (it = 1; it <= maxIter; it++) {
		grad.fill(0);
		for (let s = 0; s < n; s++) {
			const row = s * q;
			let mx = -Infinity;
			for (let c = 0; c < classes; c++) {
				let v = 0;
				const vc = c * q;
				for (let t = 0; t < q; t++) v += V[vc + t] * phi[row + t];
				logits[c] = v;
				if (v > mx) mx = v;
			}
			let z = 0;
			for (let c = 0; c < classes; c++) z += (logits[c] = Math.exp(logits[c] - mx));
			for (let c = 0; c < classes; c++) {
				const r = logits[c] / z - (labels[s] === c ? 1 : 0);
				if (r === 0) continue;
				const gc = c * q;
				for (let t = 0; t < q; t++) grad[gc + t] += r * phi[row + t];
			}
		}
		let gmax = 0;
		for (let i = 0; i < grad.length; i++) {
			grad[i] = grad[i] / n + l2 * V[i];
			gmax = Math.max(gmax, Math.abs(grad[i]));
		}
		if (gmax < tol) {
			W.set(V);
			lift.converged = true;
			break;
		}
		Wprev.set(W);
		for (let i = 0; i < W.length; i++) W[i] = V[i] - step * grad[i];
		const tNext = (1 + Math.sqrt(1 + 4 * tk * tk)) / 2;
		const mom = (tk - 1) / tNext;
		for (let i = 0; i < W.length; i++) V[i] = W[i] + mom * (W[i] - Wprev[i]);
		tk = tNext;
	}
	lift.iterations = Math.min(it, maxIter);
	let correct = 0;
	const out = new Float64Array(classes);
	for (let s = 0; s < n; s++) {
		applyLift(lift, x, s * p, out);
		let best = 0;
		for (let c = 1; c < classes; c++) if (out[c] > out[best]) best = c;
		if (best === labels[s]) correct++;
	}
	lift.accuracy = correct / n;
	return lift;
}

/** Feature row [x̃, φ(x̃), 1] of the profile at x[off…off+p). */
function featuresOf(lift: Lift, x: ArrayLike<number>, off: number, out: Float64Array, outOff: number) {
	const { p, rff: D, mean, scale, omega, phase } = lift;
	for (let i = 0; i < p; i++) out[outOff + i] = (x[off + i] - mean[i]) / scale[i];
	const c = Math.sqrt(2 / D);
	for (let t = 0; t < D; t++) {
		let v = phase[t];
		for (let i = 0; i < p; i++) v += omega[t * p + i] * out[outOff + i];
		out[outOff + p + t] = c * Math.cos(v);
	}
	out[outOff + p + D] = 1;
}

/** Centred logits (K values summing to 0) of the profile at x[off…off+p). */
export function applyLift(lift: Lift, x: ArrayLike<number>, off: number, out: Float64Array, scratch = new Float64Array(lift.p + lift.rff + 1)): Float64Array {
	const q = lift.p + lift.rff + 1;
	featuresOf(lift, x, off, scratch, 0);
	let mean = 0;
	for (let c = 0; c < lift.classes; c++) {
		let v = 0;
		for (let t = 0; t < q; t++) v += lift.weights[c * q + t] * scratch[t];
		out[c] = v;
		mean += v;
	}
	mean /= lift.classes;
	for (let c = 0; c < lift.classes; c++) out[c] -= mean;
	return out;
}

/** Largest eigenvalue of ΦᵀΦ/n (Φ row-major n × q) by 30 power iterations from a random start. */
function largestEigen(phi: Float64Array, n: number, q: number, rng: Rng): number {
	let v = new Float64Array(q);
	for (let t = 0; t < q; t++) v[t] = rng.normal();
	const u = new Float64Array(n);
	let lambda = 0;
	for (let it = 0; it < 30; it++) {
		let norm = 0;
		for (let t = 0; t < q; t++) norm += v[t] * v[t];
		norm = Math.sqrt(norm) || 1;
		for (let t = 0; t < q; t++) v[t] /= norm;
		for (let s = 0; s < n; s++) {
			let x = 0;
			for (let t = 0; t < q; t++) x += phi[s * q + t] * v[t];
			u[s] = x;
		}
		const w = new Float64Array(q);
		for (let s = 0; s < n; s++) {
			const us = u[s] / n;
			for (let t = 0; t < q; t++) w[t] += phi[s * q + t] * us;
		}
		lambda = 0;
		for (let t = 0; t < q; t++) lambda += w[t] * v[t];
		v = w;
	}
	return lambda;
}
