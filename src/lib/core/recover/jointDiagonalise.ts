/**
 * Approximate joint diagonalisation of m real symmetric k × k matrices by Jacobi rotations
 * (Cardoso & Souloumiac 1996, "Jacobi angles for simultaneous diagonalization", SIAM J. Matrix
 * Anal. Appl. 17:161–164): sweeps over all pairs (p, q), each rotation angle maximising the
 * summed squared diagonal, θ = ½·atan2(t_off, t_on + √(t_on² + t_off²)) with
 * t_on = Σ (M_pp − M_qq)² − (2M_pq)², t_off = 2·Σ (M_pp − M_qq)(2M_pq); stops when a sweep
 * makes no rotation with |sin θ| > tol. Matrices are row-major and not modified.
 * Result: orthogonal V (row-major k × k) with Vᵀ M_i V nearly diagonal; the rows of Vᵀ are the
 * joint eigenvectors.
 */
export interface JointDiagonalisation {
	k: number;
	v: Float64Array;
	converged: boolean;
	sweeps: number;
	/** Σ off-diagonal² / Σ all² of the rotated matrices (0 = exactly diagonal). */
	offDiagonalShare: number;
}

export function jointDiagonalise(mats: readonly Float64Array[], k: number, opts: { tol?: number; maxSweeps?: number } = {}): JointDiagonalisation {
	const tol = opts.tol ?? 1e-10;
	const maxSweeps = opts.maxSweeps ?? 100;
	const m = mats.length;
	const a = mats.map((x) => {
		if (x.length < k * k) throw new RangeError(`jointDiagonalise: every matrix needs ${k * k} entries`);
		return Float64Array.from(x.subarray(0, k * k));
	});
	const v = new Float64Array(k * k);
	for (let i = 0; i < k; i++) v[i * k + i] = 1;
	let converged = false;
	let sweeps = 0;
	while (sweeps < maxSweeps) {
		sweeps++;
		let rotated = false;
		for (let p = 0; p < k - 1; p++)
			for (let q = p + 1; q < k; q++) {
				let ton = 0;
				let toff = 0;
				for (let i = 0; i < m; i++) {
					const g1 = a[i][p * k + p] - a[i][q * k + q];
					const g2 = a[i][p * k + q] + a[i][q * k + p];
					ton += g1 * g1 - g2 * g2;
					toff += 2 * g1 * g2;
				}
				const theta = 0.5 * Math.atan2(toff, ton + Math.sqrt(ton * ton + toff * toff));
				const c = Math.cos(theta);
				const s = Math.sin(theta);
				if (Math.abs(s) <= tol) continue;
				rotated = true;
				for (let i = 0; i < m; i++) {
					const x = a[i];
					// columns p, q
					for (let r = 0; r < k; r++) {
						const xp = x[r * k + p];
						const xq = x[r * k + q];
						x[r * k + p] = c * xp + s * xq;
						x[r * k + q] = c * xq - s * xp;
					}
					// rows p, q
					for (let col = 0; col < k; col++) {
						const xp = x[p * k + col];
						const xq = x[q * k + col];
						x[p * k + col] = c * xp + s * xq;
						x[q * k + col] = c * xq - s * xp;
					}
				}
				for (let r = 0; r < k; r++) {
					const vp = v[r * k + p];
					const vq = v[r * k + q];
					v[r * k + p] = c * vp + s * vq;
					v[r * k + q] = c * vq - s * vp;
				}
			}
		if (!rotated) {
			converged = true;
			break;
		}
	}
	let off = 0;
	let all = 0;
	for (const x of a)
		for (let i = 0; i < k; i++)
			for (let j = 0; j < k; j++) {
				const e = x[i * k + j] * x[i * k + j];
				all += e;
				if (i !== j) off += e;
			}
	return { k, v, converged, sweeps, offDiagonalShare: all > 0 ? off / all : 0 };
}
