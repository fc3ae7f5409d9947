import { contextKey, STREAM } from './keys';
import { rngFor, type Rng } from './rng';
import type { WellData } from './simulateWells';
import type { PreparedSimulation } from './types';
import { CLAMP_SPREAD, meanOf, sdOf, type World } from './world';

/**
 * Plate-corrected reagent effects Δ (row-major R × p, R = design reagents): for every well of
 * reagent r, its profile minus the mean of the control wells on its plate (or, without controls,
 * the mean of all treatment wells on that plate), averaged over the reagent's wells.
 */
export function effectsFromWells(prep: PreparedSimulation, data: WellData): Float64Array {
	const { p, nWells, profiles, reagent, plate } = data;
	const R = prep.reagentCatalogue.length;
	const P = prep.plates;
	const useControls = prep.controlPlate.length > 0;
	const baseline = new Float64Array(P * p);
	const count = new Float64Array(P);
	for (let w = 0; w < nWells; w++) {
		if (useControls !== reagent[w] < 0) continue;
		const q = plate[w];
		count[q]++;
		for (let i = 0; i < p; i++) baseline[q * p + i] += profiles[w * p + i];
	}
	for (let q = 0; q < P; q++) if (count[q] > 0) for (let i = 0; i < p; i++) baseline[q * p + i] /= count[q];
	const delta = new Float64Array(R * p);
	const n = new Float64Array(R);
	for (let w = 0; w < nWells; w++) {
		const k = reagent[w];
		if (k < 0) continue;
		const q = plate[w];
		n[k]++;
		for (let i = 0; i < p; i++) delta[k * p + i] += profiles[w * p + i] - baseline[q * p + i];
	}
	for (let k = 0; k < R; k++) if (n[k] > 0) for (let i = 0; i < p; i++) delta[k * p + i] /= n[k];
	return delta;
}

/**
 * Fast path: draws Δ from its exact sampling distribution instead of simulating every well.
 * Exact when mixing is linear, every plate has controls, and the simulation is at well level
 * (or all factors are Gaussian, so cell means are exactly Gaussian). With linear mixing the
 * plate offset cancels in (well − plate control mean), and
 *   Δ_r = A·(Σ_e (n_e/N_r)·z̄_{r,e} − Σ_q (n_{r,q}/N_r)·z̄_q) + (Σ_e (n_e/N_r)·ε̄_{r,e} − Σ_q (n_{r,q}/N_r)·ε̄_q)
 * where z̄_{r,e} is the factor-space mean of r's n_e wells in context e: with K ~ Binomial(n_e,
 * efficacy) responding wells, z̄ ~ N((K·μ_resp + (n_e−K)·m_e)/n_e, (K·v_resp + (n_e−K)·v_non)/n_e²)
 * per factor, ε̄_{r,e} ~ N(0, σ_w²/n_e·I_p), and z̄_q, ε̄_q are the same for plate q's controls.
 * Well-level variances: v_non = τ² + s_e²/n_cells (0 at well level), clamp targets τ² + CLAMP_SPREAD²/n_cells,
 * scale targets τ² + (s_e·(1+δ))²/n_cells; σ_w² = σ²/max(1, n_cells).
 */
export function drawEffectStatistics(prep: PreparedSimulation, world: World, rep: number): Float64Array {
	const { plan, seed } = prep;
	const obs = plan.observation;
	const d = prep.factorIds.length;
	const p = obs.features;
	const R = prep.reagentCatalogue.length;
	const P = prep.plates;
	const cells = prep.cellsPerWell;
	const tau2 = obs.replicateNoise * obs.replicateNoise;
	const sw = obs.measurementNoise / Math.sqrt(Math.max(1, cells));

	// Plate control means: factor part (P × d) and feature noise part (P × p).
	const ctrlZ = new Float64Array(P * d);
	const ctrlE = new Float64Array(P * p);
	for (let q = 0; q < P; q++) {
		const groups = prep.plateControls[q];
		let C = 0;
		for (let g = 1; g < groups.length; g += 2) C += groups[g];
		if (C === 0) continue;
		const rng = rngFor(seed, rep, STREAM.CONTROL_STATS, q);
		for (let g = 0; g < groups.length; g += 2) {
			const c = groups[g];
			const nc = groups[g + 1];
			const m = meanOf(world, c, d);
			const s = sdOf(world, c, d);
			for (let j = 0; j < d; j++) {
				const v = tau2 + (cells > 0 ? (s[j] * s[j]) / cells : 0);
				// Σ over the nc controls of this context, divided by C: mean nc·m/C, variance nc·v/C².
				ctrlZ[q * d + j] += (nc * m[j] + Math.sqrt(nc * v) * rng.normal()) / C;
			}
		}
		rng.fillNormal(ctrlE, q * p, p, sw / Math.sqrt(C));
	}

	// Per reagent: accumulate factor-space mean (zAcc) and feature-space noise (eAcc), then map.
	// The numeric loops live in small functions of typed arrays and numbers only, so V8 compiles
	// each of them early and once (one big function took several slow recompilations).
	const delta = new Float64Array(R * p);
	const zAcc = new Float64Array(d);
	const eAcc = new Float64Array(p);
	const noise = new Float64Array(p);
	const muResp = new Float64Array(d);
	const vResp = new Float64Array(d);
	for (let k = 0; k < R; k++) {
		const groups = prep.reagentGroups[k];
		let N = 0;
		for (let g = 1; g < groups.length; g += 2) N += groups[g];
		zAcc.fill(0);
		eAcc.fill(0);
		const rr = world.reagents[k];
		const targets = rr.targets;
		for (let g = 0; g < groups.length; g += 2) {
			const c = groups[g];
			const n = groups[g + 1];
			const rng = rngFor(seed, rep, STREAM.GROUP_STATS, prep.reagentCatalogue[k], contextKey(c < 0 ? -1 : prep.contextCatalogue[c]));
			let K = 0;
			if (rr.efficacy >= 1) K = n;
			else for (let i = 0; i < n; i++) if (rng.next() < rr.efficacy) K++;
			const m = meanOf(world, c, d);
			const s = sdOf(world, c, d);
			baselineMoments(muResp, vResp, m, s, tau2, cells, d);
			for (let t = 0; t < targets.length; t++) {
				const j = targets[t];
				if (rr.kind === 'shift') muResp[j] = m[j] + rr.effect[j];
				else if (rr.kind === 'clamp') {
					muResp[j] = rr.effect[j];
					vResp[j] = tau2 + (cells > 0 ? (CLAMP_SPREAD * CLAMP_SPREAD) / cells : 0);
				} else {
					const sc = s[j] * Math.max(0, 1 + rr.effect[j]);
					vResp[j] = tau2 + (cells > 0 ? (sc * sc) / cells : 0);
				}
			}
			const wgt = n / N;
			addGroupMean(zAcc, muResp, vResp, m, s, K, n, wgt, tau2, cells, d, rng);
			rng.fillNormal(noise, 0, p, (wgt * sw) / Math.sqrt(n));
			addInto(eAcc, noise, p);
		}
		const plates = prep.reagentPlates[k];
		for (let t = 0; t < plates.length; t += 2) subtractControls(zAcc, eAcc, ctrlZ, ctrlE, plates[t], plates[t + 1], d, p);
		mapRow(delta, k * p, world.mixing.a, zAcc, eAcc, p, d);
	}
	return delta;
}

/** Means and variances of non-responding wells (the responding ones start from these). */
function baselineMoments(muResp: Float64Array, vResp: Float64Array, m: Float64Array, s: Float64Array, tau2: number, cells: number, d: number): void {
	for (let j = 0; j < d; j++) {
		muResp[j] = m[j];
		vResp[j] = tau2 + (cells > 0 ? (s[j] * s[j]) / cells : 0);
	}
}

/** zAcc += wgt · (mean of a group of n wells, K of them responding), one normal draw per factor. */
function addGroupMean(zAcc: Float64Array, muResp: Float64Array, vResp: Float64Array, m: Float64Array, s: Float64Array, K: number, n: number, wgt: number, tau2: number, cells: number, d: number, rng: Rng): void {
	for (let j = 0; j < d; j++) {
		const vNon = tau2 + (cells > 0 ? (s[j] * s[j]) / cells : 0);
		const mean = (K * muResp[j] + (n - K) * m[j]) / n;
		const sd = Math.sqrt(K * vResp[j] + (n - K) * vNon) / n;
		zAcc[j] += wgt * (mean + sd * rng.normal());
	}
}

function addInto(acc: Float64Array, x: Float64Array, p: number): void {
	for (let i = 0; i < p; i++) acc[i] += x[i];
}

/** Removes share wq of plate q's control means (factor part ctrlZ, noise part ctrlE). */
function subtractControls(zAcc: Float64Array, eAcc: Float64Array, ctrlZ: Float64Array, ctrlE: Float64Array, q: number, wq: number, d: number, p: number): void {
	for (let j = 0; j < d; j++) zAcc[j] -= wq * ctrlZ[q * d + j];
	for (let i = 0; i < p; i++) eAcc[i] -= wq * ctrlE[q * p + i];
}

/** delta[row + i] = eAcc[i] + (A·zAcc)[i], A row-major p × d. */
function mapRow(delta: Float64Array, row: number, a: Float64Array, zAcc: Float64Array, eAcc: Float64Array, p: number, d: number): void {
	for (let i = 0; i < p; i++) {
		let v = eAcc[i];
		const ai = i * d;
		for (let j = 0; j < d; j++) v += a[ai + j] * zAcc[j];
		delta[row + i] = v;
	}
}
