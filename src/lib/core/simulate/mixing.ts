import { randomOrthogonal } from '../linalg/orthogonal';
import { svd } from '../linalg/svd';
import type { Rng } from './rng';

/**
 * Mixing g from factors (d) to features (p): g(z) = A·(z + λ·V·tanh(U·z)).
 * A: p × d with independent standard normal entries (optionally with its condition number reset);
 * U, V: random orthogonal d × d, so the residual branch z ↦ λ·V·tanh(U·z) has Lipschitz
 * constant ≤ λ·‖V‖·‖U‖·max|tanh′| = λ < 1 and z ↦ z + branch is invertible (Behrmann et al.
 * 2019, invertible residual networks — from memory). λ = 0 gives exactly g(z) = A·z.
 * Layout: row-major; `u` and `v` are null when λ = 0.
 */
export interface Mixing {
	p: number;
	d: number;
	a: Float64Array;
	lambda: number;
	u: Float64Array | null;
	v: Float64Array | null;
}

export function drawMixing(p: number, d: number, rng: Rng, opts: { nonlinearity?: number; condition?: [number, number] | null } = {}): Mixing {
	const lambda = opts.nonlinearity ?? 0;
	if (!(lambda >= 0 && lambda < 1)) throw new RangeError(`nonlinearity must be in [0, 1), got ${lambda}`);
	const a = new Float64Array(p * d);
	rng.fillNormal(a, 0, p * d);
	if (opts.condition) resetCondition(a, p, d, opts.condition, rng);
	let u: Float64Array | null = null;
	let v: Float64Array | null = null;
	if (lambda > 0) {
		u = randomOrthogonal(d, rng);
		v = randomOrthogonal(d, rng);
	}
	return { p, d, a, lambda, u, v };
}

/** Replaces A's singular values by log-spaced ones with condition κ ~ log-uniform[lo, hi], same Frobenius norm. */
function resetCondition(a: Float64Array, p: number, d: number, [lo, hi]: [number, number], rng: Rng) {
	if (!(lo >= 1 && hi >= lo)) throw new RangeError(`mixingCondition must satisfy 1 ≤ lo ≤ hi, got [${lo}, ${hi}]`);
	const kappa = Math.exp(Math.log(lo) + rng.next() * (Math.log(hi) - Math.log(lo)));
	const s = svd(a, p, d);
	const r = s.r;
	const target = Array.from({ length: r }, (_, k) => (r === 1 ? 1 : kappa ** (-k / (r - 1))));
	let frob = 0;
	for (let i = 0; i < p * d; i++) frob += a[i] * a[i];
	const norm = Math.sqrt(frob / target.reduce((t, x) => t + x * x, 0));
	a.fill(0);
	for (let k = 0; k < r; k++) {
		const sk = target[k] * norm;
		for (let i = 0; i < p; i++) {
			const uik = s.u[i * r + k] * sk;
			for (let j = 0; j < d; j++) a[i * d + j] += uik * s.v[j * r + k];
		}
	}
}

/**
 * x (length p) = g(z) for one factor vector z (length d). `scratch` (length 2d) avoids allocation.
 */
export function applyMixing(mix: Mixing, z: ArrayLike<number>, zOff: number, x: Float64Array, xOff: number, scratch = new Float64Array(2 * mix.d)): void {
	const { p, d, a } = mix;
	let src: ArrayLike<number> = z;
	let off = zOff;
	if (mix.lambda > 0 && mix.u && mix.v) {
		const h = scratch; // h[0..d) = tanh(U z), h[d..2d) = z + λ V h
		for (let i = 0; i < d; i++) {
			let s = 0;
			for (let j = 0; j < d; j++) s += mix.u[i * d + j] * z[zOff + j];
			h[i] = Math.tanh(s);
		}
		for (let i = 0; i < d; i++) {
			let s = 0;
			for (let j = 0; j < d; j++) s += mix.v[i * d + j] * h[j];
			h[d + i] = z[zOff + i] + mix.lambda * s;
		}
		src = h;
		off = d;
	}
	for (let i = 0; i < p; i++) {
		let s = 0;
		const ai = i * d;
		for (let j = 0; j < d; j++) s += a[ai + j] * src[off + j];
		x[xOff + i] = s;
	}
}
