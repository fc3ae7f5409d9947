import type { FactorShape } from '../plan/types';
import type { Rng } from './rng';

/** Mode offset of the `bimodal` shape: ½N(−μ, s²) + ½N(μ, s²) with μ = 0.9, s² = 1 − μ² (unit variance; common practice choice, ours). */
export const BIMODAL_MU = 0.9;
const BIMODAL_S = Math.sqrt(1 - BIMODAL_MU * BIMODAL_MU);
const LAPLACE_B = Math.SQRT1_2; // variance 2b² = 1
const UNIFORM_HALF = Math.sqrt(3); // variance (2a)²/12 = 1

/**
 * One draw of a standardised factor (mean 0, variance 1):
 * gaussian N(0, 1); laplace with scale 1/√2 (inverse CDF); uniform on [−√3, √3];
 * bimodal: equal mixture of N(±0.9, 0.19).
 */
export function drawFactor(shape: FactorShape, rng: Rng): number {
	switch (shape) {
		case 'gaussian':
			return rng.normal();
		case 'laplace': {
			let u = rng.next() - 0.5;
			while (u === -0.5) u = rng.next() - 0.5;
			return u < 0 ? LAPLACE_B * Math.log(1 + 2 * u) : -LAPLACE_B * Math.log(1 - 2 * u);
		}
		case 'uniform':
			return (2 * rng.next() - 1) * UNIFORM_HALF;
		case 'bimodal':
			return (rng.next() < 0.5 ? -BIMODAL_MU : BIMODAL_MU) + BIMODAL_S * rng.normal();
	}
}

/**
 * Fills `count` draws of one standardised factor into out[offset], out[offset + stride], …
 * (a column of a row-major sample matrix). Same distributions as drawFactor; Gaussian
 * columns use the ziggurat bulk generator, Laplace ones bulk uniforms (the values drawFactor
 * would use, in order).
 */
export function fillFactor(shape: FactorShape, rng: Rng, out: Float64Array, offset: number, stride: number, count: number, scratch?: Float64Array): void {
	if (shape === 'gaussian') {
		const buf = scratch && scratch.length >= count ? scratch : new Float64Array(count);
		rng.fillNormal(buf, 0, count);
		for (let t = 0; t < count; t++) out[offset + t * stride] = buf[t];
		return;
	}
	if (shape === 'laplace') {
		// Uniforms in bulk (the same values as count calls of rng.next()), then the inverse CDF;
		// a uniform of exactly 0 (probability 2⁻³² per draw) is redrawn from the stream.
		const buf = stride === 1 ? out : scratch && scratch.length >= count ? scratch : new Float64Array(count);
		const b0 = stride === 1 ? offset : 0;
		rng.fillUniform(buf, b0, count);
		for (let t = 0; t < count; t++) {
			let u = buf[b0 + t] - 0.5;
			while (u === -0.5) u = rng.next() - 0.5;
			out[offset + t * stride] = u < 0 ? LAPLACE_B * Math.log(1 + 2 * u) : -LAPLACE_B * Math.log(1 - 2 * u);
		}
		return;
	}
	if (shape === 'uniform') {
		for (let t = 0; t < count; t++) out[offset + t * stride] = (2 * rng.next() - 1) * UNIFORM_HALF;
		return;
	}
	for (let t = 0; t < count; t++) out[offset + t * stride] = drawFactor(shape, rng);
}

/** Excess kurtosis of each standardised shape: gaussian 0, laplace 3, uniform −1.2, bimodal from its mixture moments. */
export function excessKurtosis(shape: FactorShape): number {
	switch (shape) {
		case 'gaussian':
			return 0;
		case 'laplace':
			return 3;
		case 'uniform':
			return -1.2;
		case 'bimodal': {
			// E z⁴ of ½N(±μ, s²) = μ⁴ + 6μ²s² + 3s⁴; variance 1
			const m = BIMODAL_MU * BIMODAL_MU;
			const s2 = 1 - m;
			return m * m + 6 * m * s2 + 3 * s2 * s2 - 3;
		}
	}
}
