import { describe, expect, it } from 'vitest';
import { eigs, inv, multiply, transpose, subtract } from 'mathjs';
import { gramCols } from '../../src/lib/core/linalg';
import { groupRoots } from '../../src/lib/core/pilot';
import { rngFor } from '../../src/lib/core/simulate/rng';

describe('groupRoots (one-way MANOVA roots)', () => {
	it.each([
		[24, 4, 5], // more groups than dimensions: the q × q path
		[30, 6, 3] // fewer groups than dimensions: the G × G path
	])('equal the eigenvalues of (W/ν)⁻¹(H/(G − 1)) computed with mathjs (reference library), N = %i, q = %i, G = %i', (N, q, G) => {
		const rng = rngFor(12, q);
		const labels = Array.from({ length: N }, (_, i) => i % G);
		const z = new Float64Array(N * q);
		for (let i = 0; i < N; i++) for (let j = 0; j < q; j++) z[i * q + j] = rng.normal() + (j === labels[i] % q ? 1.5 : 0);
		const mean = new Array(q).fill(0);
		for (let i = 0; i < N; i++) for (let j = 0; j < q; j++) mean[j] += z[i * q + j] / N;
		for (let i = 0; i < N; i++) for (let j = 0; j < q; j++) z[i * q + j] -= mean[j];
		const rows = Array.from({ length: N }, (_, i) => Array.from(z.subarray(i * q, (i + 1) * q)));
		// Reference: T = ZᵀZ, H = Σ n_g m_g m_gᵀ with group means m_g, W = T − H.
		const T = multiply(transpose(rows), rows) as number[][];
		let H = Array.from({ length: q }, () => new Array(q).fill(0)) as number[][];
		for (let g = 0; g < G; g++) {
			const members = rows.filter((_, i) => labels[i] === g);
			const m = members[0].map((_, j) => members.reduce((s, r) => s + r[j], 0) / members.length);
			H = H.map((row, a) => row.map((v, b) => v + members.length * m[a] * m[b]));
		}
		const W = subtract(T, H) as number[][];
		const nu = N - G;
		const M = multiply(inv(multiply(W, 1 / nu) as number[][]), multiply(H, 1 / (G - 1))) as number[][];
		const reference = (eigs(M).values as number[]).map(Number).sort((a, b) => b - a);
		const ours = groupRoots(z, N, q, gramCols(z, N, q), labels, G);
		expect(ours.positiveDefinite).toBe(true);
		expect(ours.roots.length).toBe(Math.min(q, G - 1));
		ours.roots.forEach((r, k) => expect(r).toBeCloseTo(reference[k], 8));
	});
});
