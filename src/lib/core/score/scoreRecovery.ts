import { cholesky, choleskySolve } from '../linalg/cholesky';
import { solveRowsLeqCols } from './hungarian';

/**
 * Recovery scores from a joint covariance of k recovered components and d true factors (see
 * jointCovariance.ts for the layout).
 * - MCC: mean over true factors of |correlation| with the component matched to it by an
 *   optimal one-to-one assignment (Hungarian algorithm maximising the summed |correlation|),
 *   the standard measure of Khemakhem et al. (2020, §5.1). With k < d, unmatched factors count 0.
 * - block R²: for each factor j in a block B (indices of true factors), the share of z_j's
 *   variance explained by the components matched to the factors of B (linear regression);
 *   a singleton block gives the squared matched correlation.
 * A component or factor with zero variance has correlation 0 with everything (documented answer).
 */
export interface RecoveryScore {
	mcc: number;
	/** |correlation| of each true factor with its matched component (0 when unmatched). */
	factorCorr: number[];
	/** Component matched to each true factor (−1 when unmatched). */
	matched: number[];
	/** Block R² per true factor, when blocks were given. */
	blockR2: number[] | null;
	/** |correlation| matrix, row-major k × d. */
	absCorr: Float64Array;
}

export function scoreRecovery(cov: Float64Array, k: number, d: number, blocks?: readonly (readonly number[])[] | null): RecoveryScore {
	const q = k + d;
	if (cov.length < q * q) throw new RangeError(`scoreRecovery: covariance needs ${q * q} entries, got ${cov.length}`);
	const absCorr = new Float64Array(k * d);
	for (let i = 0; i < k; i++) {
		const vy = cov[i * q + i];
		for (let j = 0; j < d; j++) {
			const vz = cov[(k + j) * q + k + j];
			const c = vy > 0 && vz > 0 ? Math.abs(cov[i * q + k + j]) / Math.sqrt(vy * vz) : 0;
			absCorr[i * d + j] = Number.isFinite(c) ? Math.min(c, 1) : 0;
		}
	}
	const matched = new Array<number>(d).fill(-1);
	if (k > 0) {
		if (d <= k) {
			// rows = factors, columns = components
			const rowOfCol = solveRowsLeqCols(d, k, (j, i) => -absCorr[i * d + j]);
			for (let i = 0; i < k; i++) if (rowOfCol[i] >= 0) matched[rowOfCol[i]] = i;
		} else {
			const rowOfCol = solveRowsLeqCols(k, d, (i, j) => -absCorr[i * d + j]);
			for (let j = 0; j < d; j++) if (rowOfCol[j] >= 0) matched[j] = rowOfCol[j];
		}
	}
	// A plain loop: the matched correlations mix 0 and fractions, and map/reduce over them gave
	// V8 arrays of changing element kinds (deoptimising this function every few replicates).
	const factorCorr: number[] = [];
	let sum = 0;
	for (let j = 0; j < d; j++) {
		const v = matched[j] >= 0 ? absCorr[matched[j] * d + j] : 0;
		factorCorr.push(v);
		sum += v;
	}
	const mcc = d === 0 ? NaN : sum / d;
	let blockR2: number[] | null = null;
	if (blocks) {
		blockR2 = new Array<number>(d).fill(NaN);
		for (const block of blocks) {
			const comps = block.map((j) => matched[j]).filter((i) => i >= 0);
			for (const j of block) blockR2[j] = regressionR2(cov, q, comps, k + j);
		}
		for (let j = 0; j < d; j++) if (Number.isNaN(blockR2[j])) blockR2[j] = factorCorr[j] ** 2;
	}
	return { mcc, factorCorr, matched, blockR2, absCorr };
}

/** R² of variable `target` regressed on variables `preds` (indices into a q × q covariance). */
function regressionR2(cov: Float64Array, q: number, preds: number[], target: number): number {
	const vt = cov[target * q + target];
	const b = preds.length;
	if (b === 0 || !(vt > 0)) return 0;
	const cpp = new Float64Array(b * b);
	const cpt = new Float64Array(b);
	for (let a = 0; a < b; a++) {
		for (let c = 0; c < b; c++) cpp[a * b + c] = cov[preds[a] * q + preds[c]];
		cpt[a] = cov[preds[a] * q + target];
	}
	const beta = choleskySolve(cholesky(cpp, b), cpt);
	let explained = 0;
	for (let a = 0; a < b; a++) explained += beta[a] * cpt[a];
	const r2 = explained / vt;
	return Number.isFinite(r2) ? Math.min(Math.max(r2, 0), 1) : 0;
}
