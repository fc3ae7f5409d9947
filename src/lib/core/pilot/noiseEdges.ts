/**
 * Edges of the eigenvalue spectrum of pure noise, used to tell signal from noise.
 */

/**
 * Marchenko–Pastur support (Marchenko & Pastur 1967): the sample covariance of n observations
 * of p independent variables with variance σ² has, for p, n → ∞ with γ = p/n, its non-zero
 * eigenvalues in [σ²(1 − √γ)², σ²(1 + √γ)²].
 */
export function marchenkoPasturEdges(gamma: number, variance = 1): { lower: number; upper: number } {
	if (!(gamma > 0 && Number.isFinite(gamma))) throw new RangeError(`gamma must be a positive number, got ${gamma}`);
	if (!(variance >= 0 && Number.isFinite(variance))) throw new RangeError(`variance must be ≥ 0, got ${variance}`);
	const r = Math.sqrt(gamma);
	return { lower: variance * (1 - r) ** 2, upper: variance * (1 + r) ** 2 };
}

/**
 * Upper edge of the limiting spectrum of the F-matrix S₁·S₂⁻¹, where S₁ = W₁/n₁ and S₂ = W₂/n₂
 * are independent p-dimensional Wishart covariances with the same population covariance
 * (Wachter 1980; Bai & Silverstein 2010, Spectral Analysis of Large Dimensional Random
 * Matrices, §4.4): with y₁ = p/n₁, y₂ = p/n₂ < 1 and h = √(y₁ + y₂ − y₁y₂),
 *   b = ((1 + h) / (1 − y₂))².
 * It is the Marchenko–Pastur edge (1 + √y₁)² when y₂ → 0 (S₂ known exactly). Here S₁ is the
 * between-group covariance of the group means and S₂ the within-group (replicate) covariance,
 * so b is the noise edge of the noise-whitened group means.
 */
export function fMatrixUpperEdge(y1: number, y2: number): number {
	if (!(y1 > 0 && Number.isFinite(y1))) throw new RangeError(`y1 must be a positive number, got ${y1}`);
	if (!(y2 >= 0 && y2 < 1)) throw new RangeError(`y2 must be in [0, 1), got ${y2}`);
	const h = Math.sqrt(y1 + y2 - y1 * y2);
	return ((1 + h) / (1 - y2)) ** 2;
}

/** Upper 5% point of the Tracy–Widom TW₁ law (from memory of the published tables: 0.9793). */
export const TRACY_WIDOM_1_95 = 0.9793;
/** Upper 1% point of the Tracy–Widom TW₁ law (from memory of the published tables: 2.0234). */
export const TRACY_WIDOM_1_99 = 2.0234;

/**
 * Centring and scale of the largest eigenvalue of XᵀX for an n × p matrix X of independent
 * N(0, 1) entries (Johnstone 2001, Ann Stat 29:295–327): μ = (√(n−1) + √p)²,
 * σ = (√(n−1) + √p)(1/√(n−1) + 1/√p)^{1/3}; (ℓ₁ − μ)/σ → TW₁.
 */
export function johnstoneCentringScale(n: number, p: number): { centre: number; scale: number } {
	if (!(n >= 2 && p >= 1)) throw new RangeError(`johnstoneCentringScale needs n ≥ 2 and p ≥ 1, got n = ${n}, p = ${p}`);
	const a = Math.sqrt(n - 1);
	const b = Math.sqrt(p);
	return { centre: (a + b) ** 2, scale: (a + b) * Math.cbrt(1 / a + 1 / b) };
}

/**
 * Largest eigenvalue a noise-only sample covariance (variance σ², p variables, ν degrees of
 * freedom, eigenvalues of XᵀX/ν) stays below with about 95% probability: the Johnstone centring
 * plus the TW₁ 95% point times the scale, with ν in the role of n − 1.
 */
export function noiseSpikeThreshold(degreesOfFreedom: number, p: number, variance: number): number {
	const { centre, scale } = johnstoneCentringScale(degreesOfFreedom + 1, p);
	return (variance * (centre + TRACY_WIDOM_1_95 * scale)) / degreesOfFreedom;
}

/**
 * Upper edge of the limiting eigenvalue spectrum of a sample covariance (n observations, γ = p/n)
 * whose population covariance has eigenvalues t₁…t_p, e.g. measurement noise of unequal
 * variance per feature (Silverstein & Choi 1995, J Multivariate Anal 54:295–309): with
 *   z(m) = −1/m + γ·(1/p)·Σⱼ tⱼ/(1 + tⱼm),   m ∈ (−1/t_max, 0),
 * z is convex there and the edge is its minimum. Equal tⱼ = σ² give the Marchenko–Pastur edge
 * σ²(1 + √γ)². Found by golden-section search; 0 when every tⱼ is 0.
 */
export function spectrumUpperEdge(variances: ArrayLike<number>, gamma: number): number {
	if (!(gamma > 0 && Number.isFinite(gamma))) throw new RangeError(`gamma must be a positive number, got ${gamma}`);
	let tMax = 0;
	for (let j = 0; j < variances.length; j++) {
		const t = variances[j];
		if (!(t >= 0 && Number.isFinite(t))) throw new RangeError(`variances must be finite numbers ≥ 0, got ${t} at ${j}`);
		if (t > tMax) tMax = t;
	}
	if (tMax === 0) return 0;
	const p = variances.length;
	const z = (s: number) => {
		const m = -s / tMax;
		let sum = 0;
		for (let j = 0; j < p; j++) sum += variances[j] / (1 + variances[j] * m);
		return -1 / m + (gamma * sum) / p;
	};
	const ratio = (Math.sqrt(5) - 1) / 2;
	let lo = 0;
	let hi = 1;
	let a = hi - ratio * (hi - lo);
	let b = lo + ratio * (hi - lo);
	let za = z(a);
	let zb = z(b);
	for (let i = 0; i < 200 && hi - lo > 1e-15; i++) {
		if (za < zb) {
			hi = b;
			b = a;
			zb = za;
			a = hi - ratio * (hi - lo);
			za = z(a);
		} else {
			lo = a;
			a = b;
			za = zb;
			b = lo + ratio * (hi - lo);
			zb = z(b);
		}
	}
	return Math.min(za, zb);
}
