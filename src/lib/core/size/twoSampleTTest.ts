/**
 * Power of the two-sided two-sample t-test with equal group sizes, and the group size needed
 * for a given power (the classic per-reagent check shown beside the Monte Carlo sizing).
 *
 * Model: two groups of n wells each, equal variance, standardised mean difference d (Cohen's d).
 * The test statistic T follows a noncentral t distribution with df = 2n − 2 and noncentrality
 * δ = d·√(n/2) (Cohen 1988, Statistical Power Analysis, 2nd ed., ch. 2). Power at two-sided level α:
 *   power = P(|T| > t_{1−α/2, df}) = 1 − F(t_c; df, δ) + F(−t_c; df, δ).
 *
 * F is evaluated by numerical integration, with no series truncation to tune:
 *   T = (Z + δ) / S,  S = √(χ²_ν / ν)  ⇒  F(t; ν, δ) = E_S[Φ(t·S − δ)].
 * Substituting u = ln S, the density of u is ∝ exp(g(u)), g(u) = ν·u − ν·(e^{2u} − 1)/2, whose peak
 * is at u = 0 with curvature −2ν. The integral is taken over the range where g > −60 with
 * composite 16-point Gauss–Legendre panels (24, or 64 when ν < 8) and normalised by the same quadrature of the weight,
 * so the normalising constant (a gamma function) cancels.
 */

/** Two-sided level and power used throughout unless given: α = 0.05, power 0.8 (Cohen 1988). */
export const DEFAULT_ALPHA = 0.05;
export const DEFAULT_POWER = 0.8;

// ---------------------------------------------------------------------------------------------
// Standard normal CDF via erfc (series for |x| ≤ 2, continued fraction beyond), ~1e-15 accurate.

const SQRT_PI = Math.sqrt(Math.PI);

/** Complementary error function erfc(x) = 1 − erf(x). */
export function erfc(x: number): number {
	if (Number.isNaN(x)) return NaN;
	if (x < 0) return 2 - erfc(-x);
	if (x <= 2) {
		// erf(x) = 2/√π Σ (−1)^k x^{2k+1} / (k! (2k+1))
		const x2 = x * x;
		let term = x;
		let sum = x;
		for (let k = 1; k < 200; k++) {
			term *= -x2 / k;
			const add = term / (2 * k + 1);
			sum += add;
			if (Math.abs(add) < 1e-17 * Math.abs(sum)) break;
		}
		return 1 - (2 / SQRT_PI) * sum;
	}
	if (x > 27) return 0;
	// erfc(x) = e^{−x²}/√π · 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + 2/(x + …))))), modified Lentz.
	const tiny = 1e-300;
	let f = x;
	let c = x;
	let dd = 0;
	for (let k = 1; k < 500; k++) {
		const a = k / 2;
		dd = x + a * dd;
		dd = Math.abs(dd) < tiny ? tiny : dd;
		c = x + a / c;
		c = Math.abs(c) < tiny ? tiny : c;
		dd = 1 / dd;
		const delta = c * dd;
		f *= delta;
		if (Math.abs(delta - 1) < 1e-16) break;
	}
	return Math.exp(-x * x) / (SQRT_PI * f);
}

/** Standard normal cumulative distribution Φ(z). */
export function normalCdf(z: number): number {
	return 0.5 * erfc(-z / Math.SQRT2);
}

// ---------------------------------------------------------------------------------------------
// Gauss–Legendre nodes on [−1, 1] (Newton iteration on the Legendre recurrence).

const GL_ORDER = 16;
const { nodes: GL_X, weights: GL_W } = gaussLegendre(GL_ORDER);

function gaussLegendre(n: number): { nodes: Float64Array; weights: Float64Array } {
	const nodes = new Float64Array(n);
	const weights = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
		let dp = 0;
		for (let it = 0; it < 100; it++) {
			let p0 = 1;
			let p1 = x;
			for (let k = 2; k <= n; k++) {
				const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
				p0 = p1;
				p1 = p2;
			}
			dp = (n * (x * p1 - p0)) / (x * x - 1);
			const dx = p1 / dp;
			x -= dx;
			if (Math.abs(dx) < 1e-16) break;
		}
		nodes[i] = x;
		weights[i] = 2 / ((1 - x * x) * dp * dp);
	}
	return { nodes, weights };
}

// ---------------------------------------------------------------------------------------------
// Quadrature grid over u = ln S for a given ν, cached (ν takes few distinct values in practice).

interface ScaleGrid {
	/** S = e^u at every node. */
	s: Float64Array;
	/** Normalised weights (sum 1). */
	w: Float64Array;
}

/** Panels: the weight of small ν has long tails in u, so they get more panels. */
const panelsFor = (nu: number) => (nu < 8 ? 64 : 24);
const gridCache = new Map<number, ScaleGrid>();

function scaleGrid(nu: number): ScaleGrid {
	const cached = gridCache.get(nu);
	if (cached) return cached;
	const g = (u: number) => nu * u - (nu * (Math.exp(2 * u) - 1)) / 2;
	const cut = -60;
	// g is increasing on (−∞, 0] and decreasing on [0, ∞): bisect each side for g = cut.
	const solve = (lo: number, hi: number) => {
		for (let i = 0; i < 200; i++) {
			const mid = (lo + hi) / 2;
			if ((g(mid) > cut) === (g(lo) > cut)) lo = mid;
			else hi = mid;
		}
		return (lo + hi) / 2;
	};
	let left = -1;
	while (g(left) > cut) left *= 2;
	let right = 1;
	while (g(right) > cut) right *= 2;
	const uL = solve(left, 0);
	const uR = solve(0, right);
	const panels = panelsFor(nu);
	const n = panels * GL_ORDER;
	const s = new Float64Array(n);
	const w = new Float64Array(n);
	const h = (uR - uL) / panels;
	let total = 0;
	for (let p = 0; p < panels; p++) {
		const mid = uL + (p + 0.5) * h;
		for (let k = 0; k < GL_ORDER; k++) {
			const u = mid + (h / 2) * GL_X[k];
			const i = p * GL_ORDER + k;
			s[i] = Math.exp(u);
			w[i] = GL_W[k] * Math.exp(g(u));
			total += w[i];
		}
	}
	for (let i = 0; i < n; i++) w[i] /= total;
	const grid = { s, w };
	if (gridCache.size > 4096) gridCache.clear();
	gridCache.set(nu, grid);
	return grid;
}

function checkDf(df: number) {
	if (!(df > 0) || !Number.isFinite(df)) throw new RangeError(`df must be a finite number > 0, got ${df}`);
}

/** CDF of the noncentral t distribution with `df` degrees of freedom and noncentrality `delta`. */
export function noncentralTCdf(t: number, df: number, delta = 0): number {
	checkDf(df);
	if (!Number.isFinite(delta)) throw new RangeError(`delta must be finite, got ${delta}`);
	if (t === Infinity) return 1;
	if (t === -Infinity) return 0;
	const { s, w } = scaleGrid(df);
	let sum = 0;
	for (let i = 0; i < s.length; i++) sum += w[i] * normalCdf(t * s[i] - delta);
	return Math.min(1, Math.max(0, sum));
}

/** Density of the central t distribution (derivative of `noncentralTCdf` at delta = 0). */
function centralTDensity(t: number, df: number): number {
	const { s, w } = scaleGrid(df);
	let sum = 0;
	for (let i = 0; i < s.length; i++) sum += w[i] * s[i] * Math.exp(-0.5 * t * t * s[i] * s[i]);
	return sum / Math.sqrt(2 * Math.PI);
}

/** Quantile of the central t distribution: the t with P(T ≤ t) = p, p in (0, 1). */
export function tQuantile(p: number, df: number): number {
	checkDf(df);
	if (!(p > 0 && p < 1)) throw new RangeError(`p must be in (0, 1), got ${p}`);
	if (p === 0.5) return 0;
	if (p < 0.5) return -tQuantile(1 - p, df);
	// Newton on a bracket [0, hi] with bisection fallback.
	let lo = 0;
	let hi = 1;
	while (noncentralTCdf(hi, df) < p) hi *= 2;
	let t = Math.min(hi, 2);
	for (let it = 0; it < 100; it++) {
		const f = noncentralTCdf(t, df) - p;
		if (f > 0) hi = t;
		else lo = t;
		if (Math.abs(f) < 1e-15) break;
		let next = t - f / centralTDensity(t, df);
		if (!(next > lo && next < hi)) next = (lo + hi) / 2;
		if (Math.abs(next - t) < 1e-13 * Math.max(1, t)) {
			t = next;
			break;
		}
		t = next;
	}
	return t;
}

/**
 * Power of the two-sided two-sample t-test with `n` wells per group (n may be fractional for
 * the continuous solution, n > 1), standardised effect `d`, level `alpha`.
 */
export function twoSampleTTestPower(n: number, d: number, alpha = DEFAULT_ALPHA): number {
	if (!(n > 1) || !Number.isFinite(n)) throw new RangeError(`n must be a finite number > 1, got ${n}`);
	if (!Number.isFinite(d)) throw new RangeError(`d must be finite, got ${d}`);
	if (!(alpha > 0 && alpha < 1)) throw new RangeError(`alpha must be in (0, 1), got ${alpha}`);
	const df = 2 * n - 2;
	const delta = Math.abs(d) * Math.sqrt(n / 2);
	const tc = tQuantile(1 - alpha / 2, df);
	const { s, w } = scaleGrid(df);
	let sum = 0;
	for (let i = 0; i < s.length; i++) sum += w[i] * (normalCdf(-tc * s[i] - delta) + 1 - normalCdf(tc * s[i] - delta));
	return Math.min(1, Math.max(0, sum));
}

export interface ReplicatesForPower {
	/** Smallest whole number of wells per group reaching the power (≥ 2); null when d = 0 or beyond `maxN`. */
	n: number | null;
	/** Continuous solution of power(n) = target (the "exact" n of power tables); null as above. */
	exactN: number | null;
	/** Power reached at `n`. */
	power: number | null;
}

/**
 * Wells per group needed for a two-sided two-sample t-test to reach `power` at level `alpha`
 * for a standardised effect `d` (df = 2n − 2, δ = d·√(n/2)). Searches n up to `maxN`.
 */
export function replicatesForPower(d: number, opts: { power?: number; alpha?: number; maxN?: number } = {}): ReplicatesForPower {
	const power = opts.power ?? DEFAULT_POWER;
	const alpha = opts.alpha ?? DEFAULT_ALPHA;
	const maxN = opts.maxN ?? 1e6;
	if (!Number.isFinite(d)) throw new RangeError(`d must be finite, got ${d}`);
	if (!(power > 0 && power < 1)) throw new RangeError(`power must be in (0, 1), got ${power}`);
	if (!(alpha > 0 && alpha < 1)) throw new RangeError(`alpha must be in (0, 1), got ${alpha}`);
	if (power <= alpha) throw new RangeError(`power must exceed alpha (${alpha}), got ${power}`);
	if (d === 0) return { n: null, exactN: null, power: null };
	const pw = (n: number) => twoSampleTTestPower(n, d, alpha);
	// Power increases with n: whole numbers first (doubling, then bisection), then the
	// continuous solution inside (n − 1, n] by bisection on the reals.
	let lo = 1;
	let hi = 2;
	let pHi = pw(hi);
	while (pHi < power) {
		lo = hi;
		hi *= 2;
		if (hi > maxN) return { n: null, exactN: null, power: null };
		pHi = pw(hi);
	}
	while (hi - lo > 1) {
		const mid = Math.floor((lo + hi) / 2);
		const pm = pw(mid);
		if (pm < power) lo = mid;
		else {
			hi = mid;
			pHi = pm;
		}
	}
	const n = hi;
	let a = Math.max(lo, 1 + 1e-9);
	let b = hi;
	while (b - a > 1e-6 * b) {
		const mid = (a + b) / 2;
		if (pw(mid) < power) a = mid;
		else b = mid;
	}
	const exactN = (a + b) / 2;
	return { n, exactN, power: pHi };
}
