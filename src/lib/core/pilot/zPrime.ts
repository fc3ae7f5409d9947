import { meanVariance } from './robust';

/**
 * Z′ factor of an assay from its positive and negative control values
 * (Zhang, Chung & Oldenburg 1999, J Biomol Screen 4:67–73):
 *   Z′ = 1 − 3(σ₊ + σ₋) / |μ₊ − μ₋|
 * with sample means and sample standard deviations (n − 1 denominator). Needs at least two
 * values on each side; returns NaN when the means are equal. Z′ ≥ 0.5 is read as an excellent
 * separation; Z′ ≤ 0 means the 3-SD bands overlap.
 */
export function zPrime(positives: ArrayLike<number>, negatives: ArrayLike<number>): number {
	if (positives.length < 2 || negatives.length < 2) throw new RangeError(`zPrime needs at least 2 positive and 2 negative control values, got ${positives.length} and ${negatives.length}`);
	const p = meanVariance(positives);
	const n = meanVariance(negatives);
	return zPrimeFromMoments(p.mean, Math.sqrt(p.variance), n.mean, Math.sqrt(n.variance));
}

/** Z′ from control means and standard deviations (same formula; NaN when μ₊ = μ₋). */
export function zPrimeFromMoments(meanPositive: number, sdPositive: number, meanNegative: number, sdNegative: number): number {
	if (!(sdPositive >= 0 && sdNegative >= 0)) throw new RangeError(`standard deviations must be ≥ 0, got ${sdPositive} and ${sdNegative}`);
	const gap = Math.abs(meanPositive - meanNegative);
	if (gap === 0) return NaN;
	return 1 - (3 * (sdPositive + sdNegative)) / gap;
}
