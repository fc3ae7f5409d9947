import { describe, expect, it } from 'vitest';
import { gramCols, symEigen } from '../../src/lib/core/linalg';
import { rngFor } from '../../src/lib/core/simulate/rng';
import { fMatrixUpperEdge, groupRoots, johnstoneCentringScale, marchenkoPasturEdges, spectrumUpperEdge, TRACY_WIDOM_1_95 } from '../../src/lib/core/pilot';

/** Largest eigenvalue of XᵀX for an n × p matrix of N(0, variances[j]) entries. */
function largestWishart(n: number, p: number, seed: number, rep: number, variances?: number[]): number {
	const rng = rngFor(seed, rep);
	const x = new Float64Array(n * p);
	for (let i = 0; i < n; i++) for (let j = 0; j < p; j++) x[i * p + j] = rng.normal() * Math.sqrt(variances ? variances[j] : 1);
	const eig = symEigen(gramCols(x, n, p), p);
	return eig.values[p - 1];
}

describe('Marchenko–Pastur edges (Marchenko & Pastur 1967)', () => {
	it('σ² = 1, p = 100, n = 400 gives the upper edge 2.25 (REFERENCES.md, verified) and lower edge 0.25', () => {
		const e = marchenkoPasturEdges(100 / 400, 1);
		expect(e.upper).toBeCloseTo(2.25, 12);
		expect(e.lower).toBeCloseTo(0.25, 12);
		expect(marchenkoPasturEdges(0.25, 3).upper).toBeCloseTo(6.75, 12); // scales with σ²
	});
	it('rejects a non-positive ratio', () => {
		expect(() => marchenkoPasturEdges(0)).toThrow(/gamma/);
		expect(() => marchenkoPasturEdges(0.5, -1)).toThrow(/variance/);
	});
});

describe('spectrumUpperEdge (Silverstein & Choi 1995 edge for unequal variances)', () => {
	it('equal variances give the Marchenko–Pastur edge σ²(1 + √γ)² (identity shown in the doc comment)', () => {
		expect(spectrumUpperEdge(new Array(100).fill(1), 0.25)).toBeCloseTo(2.25, 8);
		expect(spectrumUpperEdge(new Array(7).fill(2.5), 3)).toBeCloseTo(2.5 * (1 + Math.sqrt(3)) ** 2, 8);
		expect(spectrumUpperEdge([0, 0, 0], 1)).toBe(0);
	});
	it('matches the largest sample eigenvalue of a two-level noise (simulation, 30 draws, within 6%)', () => {
		const n = 400;
		const variances = [...new Array(50).fill(1), ...new Array(50).fill(4)];
		const edge = spectrumUpperEdge(variances, 100 / n);
		let sum = 0;
		for (let r = 0; r < 30; r++) sum += largestWishart(n, 100, 11, r, variances) / n;
		expect(Math.abs(sum / 30 / edge - 1)).toBeLessThan(0.06);
		// Above the MP edge of the mean variance (2.5·2.25), below that of the largest (4·2.25).
		expect(edge).toBeGreaterThan(2.5 * 2.25);
		expect(edge).toBeLessThan(4 * 2.25);
	});
});

describe('Johnstone (2001) centring and scale of the largest Wishart eigenvalue', () => {
	it('values for n − 1 = 399, p = 100 (formula in REFERENCES.md, verified; computed by hand: 898.50 and 15.93)', () => {
		const { centre, scale } = johnstoneCentringScale(400, 100);
		expect(centre).toBeCloseTo(898.5, 1);
		expect(scale).toBeCloseTo(15.93, 2);
	});
	it('simulated largest eigenvalues: mean ≈ μ − 1.2065σ and 95% point ≈ μ + 0.9793σ (TW₁ mean and 95% point from memory)', () => {
		const n = 200;
		const p = 50;
		const { centre, scale } = johnstoneCentringScale(n, p);
		const draws = Array.from({ length: 300 }, (_, r) => (largestWishart(n, p, 5, r) - centre) / scale).sort((a, b) => a - b);
		const mean = draws.reduce((a, b) => a + b, 0) / draws.length;
		expect(mean).toBeGreaterThan(-1.2065 - 0.3);
		expect(mean).toBeLessThan(-1.2065 + 0.3);
		const q95 = draws[Math.ceil(0.95 * draws.length) - 1];
		expect(Math.abs(q95 - TRACY_WIDOM_1_95)).toBeLessThan(0.5);
	});
});

describe('fMatrixUpperEdge (Wachter 1980; Bai & Silverstein 2010 §4.4 — formula from memory, confirmed here by simulation)', () => {
	it('reduces to the Marchenko–Pastur edge when the noise covariance is known (y₂ → 0)', () => {
		expect(fMatrixUpperEdge(0.25, 0)).toBeCloseTo(2.25, 12);
		expect(fMatrixUpperEdge(0.25, 1e-9)).toBeCloseTo(2.25, 6);
		expect(() => fMatrixUpperEdge(0.5, 1)).toThrow(/y2/);
	});

	/** Mean largest root of pure-noise group means (q dimensions, G groups, N rows). */
	function meanLargestRoot(q: number, G: number, N: number, draws: number): number {
		const labels = Array.from({ length: N }, (_, i) => i % G);
		let sum = 0;
		for (let r = 0; r < draws; r++) {
			const rng = rngFor(3, q, r);
			const z = new Float64Array(N * q);
			for (let i = 0; i < N * q; i++) z[i] = rng.normal();
			const mean = new Float64Array(q);
			for (let i = 0; i < N; i++) for (let j = 0; j < q; j++) mean[j] += z[i * q + j] / N;
			for (let i = 0; i < N; i++) for (let j = 0; j < q; j++) z[i * q + j] -= mean[j];
			sum += groupRoots(z, N, q, gramCols(z, N, q), labels, G).roots[0];
		}
		return sum / draws;
	}

	it('the largest pure-noise root approaches the edge from below as the dimensions grow (y₁ = 2, y₂ ≈ 0.05)', () => {
		// Same ratios at two sizes: finite samples sit below the edge (the Tracy–Widom mean is negative)
		// and the gap shrinks with size — at 20 dimensions within 20%, at 80 within 8%.
		const edge = fMatrixUpperEdge(2, 20 / 389);
		const small = meanLargestRoot(20, 11, 400, 30);
		const large = meanLargestRoot(80, 41, 1600, 6);
		expect(fMatrixUpperEdge(80 / 40, 80 / 1559)).toBeCloseTo(edge, 1);
		expect(small).toBeLessThan(edge * 1.02);
		expect(small).toBeGreaterThan(edge * 0.8);
		expect(large).toBeLessThan(edge * 1.02);
		expect(large).toBeGreaterThan(edge * 0.92);
		expect(edge - large).toBeLessThan(edge - small);
	});

	it('y₁ = 0.5, y₂ ≈ 0.1: 80 dimensions, 161 groups, 800 rows within 6% below the edge', () => {
		const edge = fMatrixUpperEdge(80 / 160, 80 / 639);
		const mean = meanLargestRoot(80, 161, 800, 6);
		expect(mean).toBeLessThan(edge * 1.02);
		expect(mean).toBeGreaterThan(edge * 0.94);
	});
});
