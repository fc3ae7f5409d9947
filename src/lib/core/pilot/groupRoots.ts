import { cholesky, symEigen } from '../linalg';

/**
 * Roots of the one-way multivariate analysis of variance: the eigenvalues of
 * S₂^{-1/2} S₁ S₂^{-1/2}, where S₁ = H/(G − 1) is the between-group covariance of the group
 * means and S₂ = W/ν the within-group (replicate) covariance, ν = N − G.
 *
 * `z` is row-major N × q and must be centred (column means 0), `total` its scatter ZᵀZ
 * (q × q; it does not change when labels are permuted). `labels[i]` in [0, G) is the group of
 * row i. H = Σ_g s_g s_gᵀ / n_g with s_g the group sums; W = ZᵀZ − H. The non-zero roots
 * equal the eigenvalues of the G × G matrix M W⁻¹ Mᵀ · ν/(G − 1), M's rows s_g/√n_g, or of the
 * q × q matrix L⁻¹MᵀML⁻ᵀ (W = LLᵀ), whichever is smaller; that is how they are computed.
 * Returns the roots descending (length min(q, G − 1)) and
 * whether W was numerically positive definite.
 */
export function groupRoots(z: Float64Array, n: number, q: number, total: Float64Array, labels: Int32Array | number[], groups: number): { roots: Float64Array; positiveDefinite: boolean } {
	const g = groups;
	const sums = new Float64Array(g * q);
	const counts = new Float64Array(g);
	for (let i = 0; i < n; i++) {
		const l = labels[i];
		counts[l]++;
		const zi = i * q;
		const si = l * q;
		for (let j = 0; j < q; j++) sums[si + j] += z[zi + j];
	}
	const m = new Float64Array(g * q);
	for (let a = 0; a < g; a++) {
		const w = counts[a] > 0 ? 1 / Math.sqrt(counts[a]) : 0;
		for (let j = 0; j < q; j++) m[a * q + j] = sums[a * q + j] * w;
	}
	// W = total − MᵀM
	const within = Float64Array.from(total);
	for (let a = 0; a < g; a++) {
		const ma = a * q;
		for (let i = 0; i < q; i++) {
			const v = m[ma + i];
			if (v === 0) continue;
			for (let j = 0; j <= i; j++) within[i * q + j] -= v * m[ma + j];
		}
	}
	for (let i = 0; i < q; i++) for (let j = 0; j < i; j++) within[j * q + i] = within[i * q + j];
	const ch = cholesky(within, q);
	// B = L⁻¹ Mᵀ (q × G), then M W⁻¹ Mᵀ = BᵀB.
	const b = new Float64Array(q * g);
	const l = ch.l;
	for (let a = 0; a < g; a++) {
		for (let i = 0; i < q; i++) {
			let s = m[a * q + i];
			for (let k = 0; k < i; k++) s -= l[i * q + k] * b[k * g + a];
			b[i * g + a] = s / l[i * q + i];
		}
	}
	// BᵀB (G × G) and BBᵀ = L⁻¹HL⁻ᵀ (q × q) share their non-zero eigenvalues: decompose the smaller.
	const size = Math.min(g, q);
	const gram = new Float64Array(size * size);
	if (g <= q) {
		for (let a = 0; a < g; a++) {
			for (let c = 0; c <= a; c++) {
				let s = 0;
				for (let i = 0; i < q; i++) s += b[i * g + a] * b[i * g + c];
				gram[a * g + c] = s;
				gram[c * g + a] = s;
			}
		}
	} else {
		for (let i = 0; i < q; i++) {
			for (let k = 0; k <= i; k++) {
				let s = 0;
				for (let a = 0; a < g; a++) s += b[i * g + a] * b[k * g + a];
				gram[i * q + k] = s;
				gram[k * q + i] = s;
			}
		}
	}
	const eig = symEigen(gram, size);
	const nu = n - g;
	const count = Math.max(0, Math.min(q, g - 1));
	const roots = new Float64Array(count);
	for (let k = 0; k < count; k++) roots[k] = Math.max(0, eig.values[size - 1 - k]) * (nu / (g - 1));
	return { roots, positiveDefinite: ch.positiveDefinite };
}
