/**
 * Ledoit–Wolf shrinkage intensity (Ledoit & Wolf 2004, "A well-conditioned estimator for
 * large-dimensional covariance matrices", J Multivariate Anal 88:365–411, Lemma 3.2 and
 * Theorem 3.4) for shrinking the sample covariance S = XᵀX/n of n mean-zero rows of X (n × p,
 * row-major) towards μI, μ = tr(S)/p, with the norm ‖A‖² = tr(AAᵀ)/p:
 *   δ² = ‖S − μI‖²,  β̄² = (1/n²) Σₖ ‖xₖxₖᵀ − S‖²,  β² = min(β̄², δ²),  ρ = β²/δ².
 * The estimate is ρμI + (1 − ρ)S. Returns ρ = 1 when S is already a multiple of I (δ² = 0)
 * and ρ = 0 for no rows or no columns.
 *
 * Uses p·‖xₖxₖᵀ − S‖² = ‖xₖ‖⁴ − 2xₖᵀSxₖ + ‖S‖²_F, computed from S (p × p) when p ≤ n and
 * from the Gram matrix G = XXᵀ (n × n) otherwise (xₖᵀSxₖ = Σₘ G²ₘₖ / n, ‖S‖²_F = ‖G‖²_F / n²),
 * so the cost is n·p·min(n, p). `via` forces one path (for tests).
 */
export function ledoitWolfShrinkage(x: Float64Array, n: number, p: number, via: 'auto' | 'covariance' | 'gram' = 'auto'): { shrinkage: number; mu: number } {
	if (x.length < n * p) throw new RangeError(`ledoitWolfShrinkage: matrix needs ${n * p} entries, got ${x.length}`);
	if (n < 1 || p === 0) return { shrinkage: 0, mu: 0 };
	const norms = new Float64Array(n);
	const quad = new Float64Array(n);
	let trace = 0;
	let frob = 0;
	if (via === 'covariance' || (via === 'auto' && p <= n)) {
		const s = new Float64Array(p * p);
		for (let k = 0; k < n; k++) {
			const r = k * p;
			for (let i = 0; i < p; i++) {
				const v = x[r + i];
				if (v === 0) continue;
				for (let j = 0; j <= i; j++) s[i * p + j] += v * x[r + j];
			}
		}
		for (let i = 0; i < p; i++) for (let j = 0; j <= i; j++) s[j * p + i] = s[i * p + j] /= n;
		for (let i = 0; i < p; i++) trace += s[i * p + i];
		for (let i = 0; i < p * p; i++) frob += s[i] * s[i];
		for (let k = 0; k < n; k++) {
			const r = k * p;
			let q = 0;
			let nn = 0;
			for (let i = 0; i < p; i++) {
				let t = 0;
				for (let j = 0; j < p; j++) t += s[i * p + j] * x[r + j];
				q += x[r + i] * t;
				nn += x[r + i] * x[r + i];
			}
			quad[k] = q;
			norms[k] = nn;
		}
	} else {
		const g = new Float64Array(n * n);
		for (let a = 0; a < n; a++) {
			for (let b = 0; b <= a; b++) {
				let t = 0;
				for (let j = 0; j < p; j++) t += x[a * p + j] * x[b * p + j];
				g[a * n + b] = t;
				g[b * n + a] = t;
			}
		}
		for (let k = 0; k < n; k++) {
			norms[k] = g[k * n + k];
			trace += norms[k];
			let q = 0;
			for (let m = 0; m < n; m++) q += g[m * n + k] * g[m * n + k];
			quad[k] = q / n;
			frob += q;
		}
		trace /= n;
		frob /= n * n;
	}
	const mu = trace / p;
	const delta2 = frob / p - mu * mu;
	if (!(delta2 > 1e-14 * Math.max(mu * mu, 1e-300))) return { shrinkage: 1, mu };
	let beta = 0;
	for (let k = 0; k < n; k++) beta += (norms[k] * norms[k] - 2 * quad[k] + frob) / p;
	beta /= n * n;
	return { shrinkage: Math.min(beta, delta2) / delta2, mu };
}
