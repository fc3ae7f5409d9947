import { symEigen } from '../linalg/symEigen';
import { jointDiagonalise } from './jointDiagonalise';
import type { Unmixing } from './types';
import { covarianceAbout } from './whiten';

/**
 * Joint diagonalisation of per-context covariances (the contexts route; Pham & Cardoso 2001
 * for non-stationary variances). Samples x (row-major n × p) carry a group label (context);
 * each group's covariance C_g is taken about its own mean, the pooled covariance C̄ (equal
 * weights) is whitened to its top-k directions, K = diag(λ^(−1/2))·Eᵀ, and the whitened
 * K·C_g·Kᵀ are jointly diagonalised by Jacobi rotations V (Cardoso & Souloumiac 1996).
 * Unmixing W = Vᵀ·K (k × p). Factors whose variance profiles across groups are proportional
 * cannot be separated (they form a block); this shows up as a low score, not an error.
 */
export interface JointDiagInput {
	x: Float64Array;
	n: number;
	p: number;
	groups: Int32Array;
	groupCount: number;
	components: number;
}

export function jointDiagUnmixing(input: JointDiagInput): Unmixing {
	const { x, n, p, groups, groupCount: G, components: k } = input;
	if (k < 1 || k > p) throw new RangeError(`jointDiagUnmixing: components must be in [1, ${p}], got ${k}`);
	const warnings: string[] = [];
	const covs: Float64Array[] = [];
	for (let g = 0; g < G; g++) {
		let count = 0;
		for (let s = 0; s < n; s++) if (groups[s] === g) count++;
		if (count < 2) {
			warnings.push(`context group ${g + 1} has fewer than 2 samples and is left out of the joint diagonalisation`);
			continue;
		}
		const sub = new Float64Array(count * p);
		let t = 0;
		for (let s = 0; s < n; s++) if (groups[s] === g) sub.set(x.subarray(s * p, s * p + p), p * t++);
		const mean = new Float64Array(p);
		for (let s = 0; s < count; s++) for (let i = 0; i < p; i++) mean[i] += sub[s * p + i] / count;
		covs.push(covarianceAbout(sub, count, p, mean));
	}
	if (covs.length === 0) throw new RangeError('jointDiagUnmixing: no group has at least 2 samples');
	if (covs.length < 2) warnings.push('only one context has data: joint diagonalisation cannot separate the factors');
	const pooled = new Float64Array(p * p);
	for (const c of covs) for (let i = 0; i < p * p; i++) pooled[i] += c[i] / covs.length;
	const eig = symEigen(pooled, p);
	const lmax = Math.max(eig.values[p - 1], 1e-300);
	const K = new Float64Array(k * p);
	for (let t = 0; t < k; t++) {
		const src = p - 1 - t;
		const l = Math.max(eig.values[src], 1e-12 * lmax);
		for (let i = 0; i < p; i++) K[t * p + i] = eig.vectors[i * p + src] / Math.sqrt(l);
	}
	const whitened = covs.map((c) => {
		const kc = new Float64Array(k * p);
		for (let a = 0; a < k; a++)
			for (let i = 0; i < p; i++) {
				let v = 0;
				for (let j = 0; j < p; j++) v += K[a * p + j] * c[j * p + i];
				kc[a * p + i] = v;
			}
		const m = new Float64Array(k * k);
		for (let a = 0; a < k; a++)
			for (let b = 0; b < k; b++) {
				let v = 0;
				for (let i = 0; i < p; i++) v += kc[a * p + i] * K[b * p + i];
				m[a * k + b] = v;
			}
		return m;
	});
	const jd = jointDiagonalise(whitened, k);
	if (!jd.converged) warnings.push(`joint diagonalisation did not converge within ${jd.sweeps} sweeps`);
	const w = new Float64Array(k * p);
	for (let a = 0; a < k; a++)
		for (let b = 0; b < k; b++) {
			const vba = jd.v[b * k + a]; // (Vᵀ)[a][b]
			for (let i = 0; i < p; i++) w[a * p + i] += vba * K[b * p + i];
		}
	return { k, p, w, converged: jd.converged && eig.converged, iterations: jd.sweeps, warnings };
}
