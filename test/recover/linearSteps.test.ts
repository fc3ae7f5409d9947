import { describe, expect, it } from 'vitest';
import { contrastiveLift, applyLift, jointDiagonalise, jointDiagUnmixing, signalSubspace, sparseUnmixing, supportUnmixing } from '../../src/lib/core/recover';
import { populationJointCovariance, scoreRecovery } from '../../src/lib/core/score';
import { drawFactor, drawMixing, randomOrthogonalForTest, rngFor } from './fixtures';

/** Noiseless effects Δ_r = A·δ_r (rows) for the given target sets and effect size. */
function effects(a: Float64Array, p: number, d: number, targets: number[][], size = 1) {
	const out = new Float64Array(targets.length * p);
	targets.forEach((t, r) => {
		for (let i = 0; i < p; i++) for (const j of t) out[r * p + i] += a[i * d + j] * size * (1 + 0.1 * j);
	});
	return out;
}

const exactScore = (w: Float64Array, a: Float64Array, k: number, p: number, d: number) => scoreRecovery(populationJointCovariance(w, a, k, p, d, 0), k, d);

describe('support-pattern unmixing', () => {
	it('recovers every factor exactly (MCC = 1) from noiseless effects when the per-factor rank condition holds', () => {
		const d = 4,
			p = 9;
		const a = drawMixing(p, d, rngFor(1)).a;
		const targets = [[0], [1], [2], [3], [0, 1], [2, 3], [1, 3]];
		const u = supportUnmixing({ effects: effects(a, p, d, targets), reagents: targets.length, features: p, factors: d, targets });
		const s = exactScore(u.w, a, u.k, p, d);
		expect(s.mcc).toBeCloseTo(1, 9);
		expect(s.matched).toEqual([0, 1, 2, 3]); // rows come out in factor order
		expect(u.warnings).toEqual([]);
	});
	it('warns when too few reagents avoid a factor', () => {
		const a = drawMixing(6, 3, rngFor(2)).a;
		const targets = [[0, 1], [1, 2], [0, 2]];
		const u = supportUnmixing({ effects: effects(a, 6, 3, targets), reagents: 3, features: 6, factors: 3, targets, factorIds: ['f1', 'f2', 'f3'] });
		expect(u.warnings[0]).toMatch(/^f1: only 1 reagent\(s\) with known targets avoid it/);
	});
	it('the signal subspace spans the effects (orthonormal basis, descending singular values)', () => {
		const a = drawMixing(8, 3, rngFor(3)).a;
		const x = effects(a, 8, 3, [[0], [1], [2], [0, 2]]);
		const sub = signalSubspace(x, 4, 8, 3);
		for (let t = 1; t < 3; t++) expect(sub.values[t]).toBeLessThanOrEqual(sub.values[t - 1]);
		for (let r = 0; r < 4; r++) {
			// residual of row r after projection on the basis is 0
			const row = x.subarray(r * 8, r * 8 + 8);
			const proj = new Float64Array(8);
			for (let t = 0; t < 3; t++) {
				let c = 0;
				for (let i = 0; i < 8; i++) c += row[i] * sub.basis[t * 8 + i];
				for (let i = 0; i < 8; i++) proj[i] += c * sub.basis[t * 8 + i];
			}
			for (let i = 0; i < 8; i++) expect(proj[i]).toBeCloseTo(row[i], 9);
		}
	});
});

describe('sparsity-seeking unmixing', () => {
	it('recovers every factor from noiseless effects without being told the targets', () => {
		const d = 4,
			p = 10;
		const a = drawMixing(p, d, rngFor(4)).a;
		const targets = [[0], [1], [2], [3], [0, 1], [2, 3], [1, 2], [0, 3], [1], [2]];
		const u = sparseUnmixing({ effects: effects(a, p, d, targets), reagents: targets.length, features: p, factors: d });
		expect(u.k).toBe(d);
		expect(exactScore(u.w, a, u.k, p, d).mcc).toBeGreaterThan(0.999);
	});
});

describe('joint diagonalisation', () => {
	it('finds the common eigenbasis of exactly jointly diagonalisable matrices', () => {
		const k = 4;
		const q = randomOrthogonalForTest(k, 5);
		const mats = [
			[1, 2, 3, 4],
			[4, 1, 0.5, 2],
			[0.3, 0.3, 5, 1]
		].map((diag) => {
			const m = new Float64Array(k * k);
			for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) for (let t = 0; t < k; t++) m[i * k + j] += q[t * k + i] * diag[t] * q[t * k + j];
			return m;
		});
		const jd = jointDiagonalise(mats, k);
		expect(jd.converged).toBe(true);
		expect(jd.offDiagonalShare).toBeLessThan(1e-20);
	});
	it('separates factors with non-proportional variance profiles across contexts and leaves proportional ones mixed (Pham & Cardoso 2001)', () => {
		const d = 3,
			p = 7,
			perGroup = 4000;
		const a = drawMixing(p, d, rngFor(6)).a;
		const run = (variances: number[][]) => {
			const r = rngFor(7);
			const G = variances.length;
			const x = new Float64Array(G * perGroup * p);
			const groups = new Int32Array(G * perGroup);
			for (let g = 0; g < G; g++)
				for (let s = 0; s < perGroup; s++) {
					const row = g * perGroup + s;
					groups[row] = g;
					const z = variances[g].map((v) => Math.sqrt(v) * drawFactor('laplace', r));
					for (let i = 0; i < p; i++) {
						let v = 0.05 * r.normal();
						for (let j = 0; j < d; j++) v += a[i * d + j] * z[j];
						x[row * p + i] = v;
					}
				}
			const u = jointDiagUnmixing({ x, n: G * perGroup, p, groups, groupCount: G, components: d });
			return scoreRecovery(populationJointCovariance(u.w, a, d, p, d, 0.0025), d, d, [[0, 1]]);
		};
		const distinct = run([
			[1, 1, 1],
			[3, 0.5, 1.5],
			[0.4, 2, 2.5]
		]);
		expect(distinct.mcc).toBeGreaterThan(0.98);
		// factors 1 and 2 with proportional profiles (1, 3, 0.4) and (2, 6, 0.8) stay mixed: only their block is recovered
		const proportional = run([
			[1, 2, 1],
			[3, 6, 0.5],
			[0.4, 0.8, 2.5]
		]);
		expect(Math.min(proportional.factorCorr[0], proportional.factorCorr[1])).toBeLessThan(0.95);
		expect(proportional.factorCorr[2]).toBeGreaterThan(0.98);
		expect(proportional.blockR2![0]).toBeGreaterThan(0.98);
	});
});

describe('contrastive lift', () => {
	it('learns to classify separable labels, returns centred logits, and is deterministic for a seed', () => {
		const r = rngFor(8);
		const n = 300,
			p = 4,
			K = 3;
		const x = new Float64Array(n * p);
		const labels = new Int32Array(n);
		for (let s = 0; s < n; s++) {
			labels[s] = s % K;
			for (let i = 0; i < p; i++) x[s * p + i] = 0.4 * r.normal() + (i === labels[s] ? 2 : 0);
		}
		const lift = contrastiveLift(x, labels, n, p, K, { rng: rngFor(9) });
		expect(lift.accuracy).toBeGreaterThan(0.95);
		const out = applyLift(lift, x, 0, new Float64Array(K));
		expect(out.reduce((s, v) => s + v, 0)).toBeCloseTo(0, 10);
		const again = contrastiveLift(x, labels, n, p, K, { rng: rngFor(9) });
		expect(again.weights).toEqual(lift.weights);
		expect(() => contrastiveLift(x, labels, n, p, 1, { rng: rngFor(9) })).toThrow(/at least 2 classes/);
	});
});
