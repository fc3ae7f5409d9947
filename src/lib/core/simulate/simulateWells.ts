import { applyMixing } from './mixing';
import { fillFactor } from './factorShape';
import { contextKey, STREAM } from './keys';
import { rngFor, type Rng } from './rng';
import type { PreparedSimulation } from './types';
import { CLAMP_SPREAD, meanOf, sdOf, type World } from './world';

/**
 * The full simulation of one replicate's plates (DESIGN.md "Generative model"): every well and,
 * when cellsPerWell > 0, every cell.
 * Cell c of well w (reagent r, context e, plate q): z_c = base_c + η_w with base_c = m_e + s_e ⊙ u_c
 * (u_c from each factor's shape); a responding well (probability = efficacy) changes r's targets:
 * shift adds δ, clamp sets base to δ + CLAMP_SPREAD·N(0,1), scale multiplies s_e by max(0, 1 + δ);
 * η_w ~ N(0, τ²I) is replicate noise. x_c = g(z_c) + β_q + ε_c, β_q ~ N(0, σ_q²I), ε_c ~ N(0, σ²I).
 * Well profile = mean of its cells (each well's cells are drawn factor by factor, then mixed).
 * At well level (cellsPerWell = 0) the well's latent state is
 * its cell mean m_e (+ the reagent's change) + η_w and x_w = g(z_w) + β_q + ε_w.
 *
 * Layout: rows 0…T−1 are the treatment wells in prep order, rows T… the controls in prep order.
 */
export interface WellData {
	p: number;
	d: number;
	nWells: number;
	/** Row-major nWells × p well profiles (plate offsets included). */
	profiles: Float64Array;
	/** Design reagent of each row (−1 = control), design context (−1 = baseline), plate. */
	reagent: Int32Array;
	context: Int32Array;
	plate: Int32Array;
	/** Kept cells (row-major nCells × p) and the row of their well; empty at well level. */
	nCells: number;
	cells: Float64Array;
	cellWell: Int32Array;
	/** Plate offsets β_q (row-major plates × p), kept so scores can use plate 0's population. */
	offsets: Float64Array;
}

export function simulateWells(prep: PreparedSimulation, world: World, rep: number): WellData {
	const { plan, seed } = prep;
	const obs = plan.observation;
	const d = prep.factorIds.length;
	const p = obs.features;
	const T = prep.wellReagent.length;
	const C = prep.controlPlate.length;
	const nWells = T + C;
	const cells = prep.cellsPerWell;
	const keep = cells > 0 ? Math.min(cells, Math.max(1, Math.ceil(prep.maxCells / Math.max(nWells, 1)))) : 0;
	const profiles = new Float64Array(nWells * p);
	const reagent = new Int32Array(nWells);
	const context = new Int32Array(nWells);
	const plate = new Int32Array(nWells);
	const nCells = keep * nWells;
	const cellData = new Float64Array(nCells * p);
	const cellWell = new Int32Array(nCells);
	const shapes = plan.factors.map((f) => f.shape);
	const tau = obs.replicateNoise;
	const sigma = obs.measurementNoise;

	const offsets: Float64Array[] = [];
	for (let q = 0; q < prep.plates; q++) {
		const r = rngFor(seed, rep, STREAM.PLATE, q);
		const b = new Float64Array(p);
		if (obs.plateEffect > 0) r.fillNormal(b, 0, p, obs.plateEffect);
		offsets.push(b);
	}

	const z = new Float64Array(d);
	const base = new Float64Array(d);
	const spread = new Float64Array(d);
	const clamped = new Uint8Array(d);
	const eta = new Float64Array(d);
	const x = new Float64Array(p);
	const eps = new Float64Array(p);
	const scratch = new Float64Array(2 * d);
	let cellRow = 0;
	const linearMix = world.mixing.lambda === 0;
	const a = world.mixing.a;
	const zCells = new Float64Array(cells * d);
	const xCells = new Float64Array(cells * p);
	const zc = new Float64Array(cells);
	const scratchCol = new Float64Array(cells);

	for (let w = 0; w < nWells; w++) {
		const isControl = w >= T;
		const k = isControl ? -1 : prep.wellReagent[w];
		const c = isControl ? prep.controlContext[w - T] : prep.wellContext[w];
		const q = isControl ? prep.controlPlate[w - T] : prep.wellPlate[w];
		reagent[w] = k;
		context[w] = c;
		plate[w] = q;
		const rng: Rng = isControl
			? rngFor(seed, rep, STREAM.CONTROL, q, prep.controlIndex[w - T])
			: rngFor(seed, rep, STREAM.WELL, prep.reagentCatalogue[k], contextKey(c < 0 ? -1 : prep.contextCatalogue[c]), prep.wellReplicate[w]);
		const m = meanOf(world, c, d);
		const s = sdOf(world, c, d);
		base.set(m);
		spread.set(s);
		clamped.fill(0);
		const responds = rng.next();
		if (k >= 0) {
			const rr = world.reagents[k];
			if (responds < rr.efficacy)
				for (const j of rr.targets) {
					if (rr.kind === 'shift') base[j] += rr.effect[j];
					else if (rr.kind === 'clamp') {
						base[j] = rr.effect[j];
						spread[j] = CLAMP_SPREAD;
						clamped[j] = 1;
					} else spread[j] = s[j] * Math.max(0, 1 + rr.effect[j]);
				}
		}
		rng.fillNormal(eta, 0, d, tau);
		const off = offsets[q];
		const row = w * p;
		if (cells === 0) {
			for (let j = 0; j < d; j++) z[j] = base[j] + eta[j];
			applyMixing(world.mixing, z, 0, x, 0, scratch);
			rng.fillNormal(eps, 0, p, sigma);
			for (let i = 0; i < p; i++) profiles[row + i] = x[i] + off[i] + eps[i];
		} else {
			// All cells of the well at once: factor columns, then x = g(z) + β_q + ε row by row.
			for (let j = 0; j < d; j++) {
				if (clamped[j]) rng.fillNormal(zc, 0, cells, spread[j]);
				else {
					fillFactor(shapes[j], rng, zc, 0, 1, cells, scratchCol);
					for (let t = 0; t < cells; t++) zc[t] *= spread[j];
				}
				const shift = base[j] + eta[j];
				for (let t = 0; t < cells; t++) zCells[t * d + j] = zc[t] + shift;
			}
			rng.fillNormal(xCells, 0, cells * p, sigma);
			for (let t = 0; t < cells; t++) {
				const xr = t * p;
				if (linearMix) {
					const zr = t * d;
					for (let i = 0; i < p; i++) {
						let v = xCells[xr + i] + off[i];
						const ai = i * d;
						for (let j = 0; j < d; j++) v += a[ai + j] * zCells[zr + j];
						xCells[xr + i] = v;
					}
				} else {
					applyMixing(world.mixing, zCells, t * d, x, 0, scratch);
					for (let i = 0; i < p; i++) xCells[xr + i] += x[i] + off[i];
				}
				for (let i = 0; i < p; i++) profiles[row + i] += xCells[xr + i];
			}
			if (keep > 0) {
				cellData.set(xCells.subarray(0, keep * p), cellRow * p);
				cellWell.fill(w, cellRow, cellRow + keep);
				cellRow += keep;
			}
			for (let i = 0; i < p; i++) profiles[row + i] /= cells;
		}
	}
	const offsetData = new Float64Array(prep.plates * p);
	offsets.forEach((b, q) => offsetData.set(b, q * p));
	return { p, d, nWells, profiles, reagent, context, plate, nCells, cells: cellData, cellWell, offsets: offsetData };
}
