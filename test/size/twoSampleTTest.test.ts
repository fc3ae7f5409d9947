import { describe, expect, it } from 'vitest';
import pkg from 'jstat';
import { erfc, noncentralTCdf, normalCdf, replicatesForPower, tQuantile, twoSampleTTestPower } from '../../src/lib/core/size/twoSampleTTest';

const { jStat } = pkg;

describe('normal CDF and t quantiles against printed tables', () => {
	// REFERENCES.md "Distribution quantiles": Φ⁻¹(0.975) = 1.959963985, Φ⁻¹(0.95) = 1.644853627,
	// Φ⁻¹(0.995) = 2.575829304 (computed, matched against printed normal tables).
	it.each([
		[1.959963985, 0.975],
		[1.644853627, 0.95],
		[2.575829304, 0.995]
	])('Φ(%f) = %f', (z, p) => {
		expect(normalCdf(z)).toBeCloseTo(p, 9);
		expect(normalCdf(-z)).toBeCloseTo(1 - p, 9);
	});
	it('t₁₀(0.975) = 2.228138852 (REFERENCES.md, printed t tables)', () => {
		expect(tQuantile(0.975, 10)).toBeCloseTo(2.228138852, 8);
		expect(tQuantile(0.025, 10)).toBeCloseTo(-2.228138852, 8);
	});
	it('erfc(1) = 0.157299207050285 (Abramowitz & Stegun 1964, table 7.1: erf(1) = 0.842700792949715)', () => {
		expect(erfc(1)).toBeCloseTo(0.157299207050285, 14);
	});
	it('far tail keeps relative accuracy: Φ(−8) = 6.22096057427178e-16 (from memory; jstat agrees to 2 %)', () => {
		expect(normalCdf(-8) / 6.22096057427178e-16).toBeCloseTo(1, 9);
		expect(normalCdf(-8) / jStat.normal.cdf(-8, 0, 1)).toBeCloseTo(1, 1);
	});
	it('matches jstat studentt.inv across df and p (reference library from npm)', () => {
		for (const df of [1, 2, 5, 30, 200]) for (const p of [0.6, 0.9, 0.975, 0.999]) expect(tQuantile(p, df)).toBeCloseTo(jStat.studentt.inv(p, df), 6);
	});
	it('df = 1 is the Cauchy distribution: quantile tan(π(p − ½)) in closed form', () => {
		for (const p of [0.6, 0.9, 0.975, 0.999]) expect(tQuantile(p, 1) / Math.tan(Math.PI * (p - 0.5))).toBeCloseTo(1, 10);
	});
	it('rejects bad arguments with the field named', () => {
		expect(() => tQuantile(1, 5)).toThrow(/p must be in \(0, 1\)/);
		expect(() => noncentralTCdf(1, 0, 0)).toThrow(/df must be/);
		expect(() => twoSampleTTestPower(1, 0.5)).toThrow(/n must be/);
	});
});

describe('noncentral t CDF against jstat (reference library from npm)', () => {
	// jstat 1.9.6 sums the series of Lenth (1989); agreement to 1e-7 is the library's own accuracy.
	it.each([
		[1.5, 10, 1],
		[2, 20, 2.5],
		[-1, 5, 0.5],
		[3, 60, 3],
		[0.2, 3, -0.4],
		[2.01, 126, 2.8]
	])('F(%f; df %f, δ %f)', (t, df, delta) => {
		expect(noncentralTCdf(t, df, delta)).toBeCloseTo(jStat.noncentralt.cdf(t, df, delta), 7);
	});
	it('δ = 0 gives the central t CDF (jstat studentt.cdf, accurate to a few 1e-9)', () => {
		for (const t of [-3, -0.5, 0, 0.7, 2.5]) expect(noncentralTCdf(t, 7, 0)).toBeCloseTo(jStat.studentt.cdf(t, 7), 8);
		// computed: I_{ν/(t²+ν)}(ν/2, 1/2)/2 with mpmath 1.3.0 at 30 digits (0.316203567844642108…), t = −0.5, ν = 7
		expect(noncentralTCdf(-0.5, 7, 0)).toBeCloseTo(0.3162035678446421, 14);
	});
});

describe('wells per group for a two-sided two-sample t-test, α = 0.05 (Cohen 1988, ch. 2, table 2.4.1)', () => {
	// REFERENCES.md "Power of a two-sample t-test": Cohen's table values (secondary) and the
	// exact noncentral-t solutions (computed, df = 2n−2, δ = d·√(n/2)). Cohen's tables use an
	// approximation, so the whole-number n is allowed ±1 against them.
	const cases: { d: number; power: number; table: number[]; exact: number }[] = [
		{ d: 0.2, power: 0.8, table: [393], exact: 393.41 },
		{ d: 0.5, power: 0.8, table: [64], exact: 63.7656 },
		{ d: 0.8, power: 0.8, table: [26], exact: 25.52 },
		{ d: 0.2, power: 0.9, table: [525, 526], exact: 526.33 },
		{ d: 0.5, power: 0.9, table: [85], exact: 85.03 },
		{ d: 0.8, power: 0.9, table: [34], exact: 33.83 }
	];
	it.each(cases)('d = $d, power $power → table $table, exact $exact', ({ d, power, table, exact }) => {
		const res = replicatesForPower(d, { power });
		expect(res.exactN).not.toBeNull();
		// exact values are printed to 2 (or 4) decimals: compare to that precision
		const decimals = String(exact).split('.')[1].length;
		expect(res.exactN!).toBeCloseTo(exact, decimals - 1);
		const nearest = Math.min(...table.map((t) => Math.abs(res.n! - t)));
		expect(nearest).toBeLessThanOrEqual(1);
		// n is the smallest whole number reaching the power
		expect(res.power!).toBeGreaterThanOrEqual(power);
		expect(twoSampleTTestPower(res.n! - 1, d)).toBeLessThan(power);
		// and the power computed with jstat's noncentral t agrees at n
		const df = 2 * res.n! - 2;
		const tc = jStat.studentt.inv(0.975, df);
		const delta = d * Math.sqrt(res.n! / 2);
		const jPower = 1 - jStat.noncentralt.cdf(tc, df, delta) + jStat.noncentralt.cdf(-tc, df, delta);
		expect(res.power!).toBeCloseTo(jPower, 6);
	});
	it('power at α equals α when d = 0 (size of the test)', () => {
		expect(twoSampleTTestPower(10, 0)).toBeCloseTo(0.05, 10);
	});
	it('larger effects never need more wells; sign of d is irrelevant', () => {
		let prev = Infinity;
		for (const d of [0.3, 0.6, 1, 1.5, 2.5]) {
			const n = replicatesForPower(d).n!;
			expect(n).toBeLessThanOrEqual(prev);
			prev = n;
		}
		expect(replicatesForPower(-0.5).n).toBe(64);
	});
	it('d = 0 has no finite answer', () => {
		expect(replicatesForPower(0)).toEqual({ n: null, exactN: null, power: null });
	});
	it('very large effects bottom out at 2 wells per group', () => {
		expect(replicatesForPower(20).n).toBe(2);
	});
});
