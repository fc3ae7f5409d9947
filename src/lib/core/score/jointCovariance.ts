/**
 * Joint covariance of recovered components y (k of them) and true factors z (d of them),
 * the one input every recovery score is computed from. Layout: row-major (k + d) × (k + d),
 * indices 0…k−1 are the components, k…k+d−1 the factors.
 */

/**
 * Sample joint covariance from n paired samples; y is row-major n × k, z row-major n × d.
 * With `ranks: true` every column is first replaced by its ranks (ties get their average
 * rank), so correlations computed from the result are Spearman's rank correlations
 * (Spearman 1904) instead of Pearson's.
 */
export function jointCovariance(y: Float64Array, z: Float64Array, n: number, k: number, d: number, opts: { ranks?: boolean } = {}): Float64Array {
	if (n < 2) throw new RangeError(`jointCovariance: need at least 2 samples, got ${n}`);
	if (y.length < n * k || z.length < n * d) throw new RangeError(`jointCovariance: y needs ${n * k} and z ${n * d} entries, got ${y.length} and ${z.length}`);
	const q = k + d;
	const cols: Float64Array[] = [];
	for (let c = 0; c < q; c++) {
		const col = new Float64Array(n);
		if (c < k) for (let i = 0; i < n; i++) col[i] = y[i * k + c];
		else for (let i = 0; i < n; i++) col[i] = z[i * d + c - k];
		if (opts.ranks) ranksInPlace(col);
		let mean = 0;
		for (let i = 0; i < n; i++) mean += col[i];
		mean /= n;
		for (let i = 0; i < n; i++) col[i] -= mean;
		cols.push(col);
	}
	const out = new Float64Array(q * q);
	for (let a = 0; a < q; a++)
		for (let b = 0; b <= a; b++) {
			const ca = cols[a];
			const cb = cols[b];
			let s = 0;
			for (let i = 0; i < n; i++) s += ca[i] * cb[i];
			s /= n - 1;
			out[a * q + b] = s;
			out[b * q + a] = s;
		}
	return out;
}

/** Replaces values by their 1-based ranks; tied values get the mean of their ranks. */
export function ranksInPlace(col: Float64Array): Float64Array {
	const n = col.length;
	const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => col[a] - col[b]);
	const ranks = new Float64Array(n);
	let i = 0;
	while (i < n) {
		let j = i;
		while (j + 1 < n && col[order[j + 1]] === col[order[i]]) j++;
		const r = (i + j) / 2 + 1;
		for (let t = i; t <= j; t++) ranks[order[t]] = r;
		i = j + 1;
	}
	col.set(ranks);
	return col;
}

/**
 * Exact population joint covariance for a linear unmixing W (k × p) of x = A·z + ε with
 * independent unit-variance factors (Σ_z = I) and isotropic noise ε ~ N(0, noiseVar·I_p):
 * Cov(y) = (WA)(WA)ᵀ + noiseVar·WWᵀ, Cov(y, z) = WA, Cov(z) = I.
 */
export function populationJointCovariance(w: Float64Array, a: Float64Array, k: number, p: number, d: number, noiseVar: number, out = new Float64Array((k + d) * (k + d))): Float64Array {
	const q = k + d;
	out.fill(0, 0, q * q);
	const wa = new Float64Array(k * d);
	for (let i = 0; i < k; i++)
		for (let t = 0; t < p; t++) {
			const wit = w[i * p + t];
			if (wit === 0) continue;
			for (let j = 0; j < d; j++) wa[i * d + j] += wit * a[t * d + j];
		}
	for (let i = 0; i < k; i++) {
		for (let l = 0; l <= i; l++) {
			let s = 0;
			for (let j = 0; j < d; j++) s += wa[i * d + j] * wa[l * d + j];
			let ww = 0;
			for (let t = 0; t < p; t++) ww += w[i * p + t] * w[l * p + t];
			s += noiseVar * ww;
			out[i * q + l] = s;
			out[l * q + i] = s;
		}
		for (let j = 0; j < d; j++) {
			out[i * q + k + j] = wa[i * d + j];
			out[(k + j) * q + i] = wa[i * d + j];
		}
	}
	for (let j = 0; j < d; j++) out[(k + j) * q + k + j] = 1;
	return out;
}
