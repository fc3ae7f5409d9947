import { describe, expect, it } from 'vitest';
import pkg from 'jstat';
import { drawFactor, fillFactor, rngFor } from '../../src/lib/core/simulate';

const { jStat } = pkg;

describe('bulk draws (fillUniform, fillFactor, fillNormal)', () => {
	it('fillUniform returns exactly the values of repeated next() calls and leaves the stream in the same state', () => {
		for (const seed of [1, 2, 99]) {
			const a = rngFor(seed, 3);
			const b = rngFor(seed, 3);
			const bulk = new Float64Array(1003);
			a.fillUniform(bulk, 2, 1000);
			for (let i = 0; i < 1000; i++) expect(bulk[2 + i]).toBe(b.next());
			expect(bulk[0]).toBe(0);
			expect(bulk[1002]).toBe(0);
			expect(a.next()).toBe(b.next());
		}
	});

	it('Laplace columns from fillFactor equal drawFactor draws in order (strided and contiguous)', () => {
		const a = rngFor(5);
		const b = rngFor(5);
		const out = new Float64Array(3 * 400);
		fillFactor('laplace', a, out, 1, 3, 400);
		for (let t = 0; t < 400; t++) expect(out[1 + 3 * t]).toBe(drawFactor('laplace', b));
		const c = new Float64Array(500);
		fillFactor('laplace', a, c, 0, 1, 500);
		for (let t = 0; t < 500; t++) expect(c[t]).toBe(drawFactor('laplace', b));
	});

	it('fillNormal passes a Kolmogorov–Smirnov check against the standard normal CDF (jStat), including the tails', () => {
		const n = 100_000;
		const x = new Float64Array(n);
		rngFor(2024).fillNormal(x, 0, n);
		const sorted = Array.from(x).sort((p, q) => p - q);
		let dMax = 0;
		for (let i = 0; i < n; i++) {
			const f = jStat.normal.cdf(sorted[i], 0, 1);
			dMax = Math.max(dMax, Math.abs(f - i / n), Math.abs((i + 1) / n - f));
		}
		// Critical value of the KS statistic at α = 0.001: 1.95/√n (asymptotic; standard tables).
		expect(dMax).toBeLessThan(1.95 / Math.sqrt(n));
		// Tail share beyond ±3: 2·(1 − Φ(3)) = 0.0027 (normal table); SE √(0.0027/n) ≈ 1.6e-4.
		const tail = sorted.filter((v) => Math.abs(v) > 3).length / n;
		expect(Math.abs(tail - 2 * (1 - jStat.normal.cdf(3, 0, 1)))).toBeLessThan(8e-4);
	});
});
