/**
 * Wilson score interval for a binomial proportion (Wilson 1927, JASA 22:209–212):
 * [p̂ + z²/2n ± z·√(p̂(1−p̂)/n + z²/4n²)] / (1 + z²/n). Default z = Φ⁻¹(0.975), a 95 % interval.
 * n = 0 has the documented answer p = NaN, interval [0, 1] (nothing is known).
 */
export interface Proportion {
	p: number;
	lo: number;
	hi: number;
}

export const Z_95 = 1.959963985;

export function wilson(successes: number, n: number, z = Z_95): Proportion {
	if (!Number.isInteger(n) || n < 0) throw new RangeError(`wilson: n must be an integer ≥ 0, got ${n}`);
	if (!Number.isInteger(successes) || successes < 0 || successes > n) throw new RangeError(`wilson: successes must be an integer in [0, ${n}], got ${successes}`);
	if (!(z > 0)) throw new RangeError(`wilson: z must be > 0, got ${z}`);
	if (n === 0) return { p: NaN, lo: 0, hi: 1 };
	const p = successes / n;
	const z2 = z * z;
	const denom = 1 + z2 / n;
	const centre = p + z2 / (2 * n);
	const half = z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
	// At p̂ = 0 (or 1) the lower (upper) bound is exactly 0 (1); set it so rounding cannot move it.
	return { p, lo: successes === 0 ? 0 : Math.max(0, (centre - half) / denom), hi: successes === n ? 1 : Math.min(1, (centre + half) / denom) };
}
