import type { WellData } from './simulateWells';
import type { PreparedSimulation } from './types';

/**
 * Per-plate baselines (row-major plates × p): the mean profile of the plate's control wells, or
 * of all its treatment wells when the design has no controls.
 */
export function plateBaselines(prep: PreparedSimulation, data: WellData): Float64Array {
	const { p, nWells, profiles, reagent, plate } = data;
	const P = prep.plates;
	const useControls = prep.controlPlate.length > 0;
	const base = new Float64Array(P * p);
	const count = new Float64Array(P);
	for (let w = 0; w < nWells; w++) {
		if (useControls !== reagent[w] < 0) continue;
		count[plate[w]]++;
		for (let i = 0; i < p; i++) base[plate[w] * p + i] += profiles[w * p + i];
	}
	for (let q = 0; q < P; q++) if (count[q] > 0) for (let i = 0; i < p; i++) base[q * p + i] /= count[q];
	return base;
}

/** Wells whose within-well distribution is the context's own: controls and `shift` reagents. */
function usable(prep: PreparedSimulation, data: WellData, w: number): boolean {
	const k = data.reagent[w];
	return k < 0 || prep.plan.reagents[prep.reagentCatalogue[k]].kind === 'shift';
}

/**
 * Samples for the distribution-learning estimators (FastICA, joint diagonalisation), with their
 * context group (design context index; 0 when the design has none). With cells: the kept cells
 * of control and shift wells, each minus its well's mean profile (within-well spread, which
 * carries the factors' shapes and context variances and is free of plate offsets and reagent
 * shifts). At well level: those wells' profiles minus their plate baseline.
 */
export function learningSamples(prep: PreparedSimulation, data: WellData): { x: Float64Array; n: number; groups: Int32Array; groupCount: number } {
	const { p } = data;
	const groupCount = Math.max(1, prep.contextCatalogue.length);
	const groupOf = (w: number) => Math.max(0, data.context[w]);
	if (data.nCells > 0) {
		const rows: number[] = [];
		for (let c = 0; c < data.nCells; c++) if (usable(prep, data, data.cellWell[c])) rows.push(c);
		const x = new Float64Array(rows.length * p);
		const groups = new Int32Array(rows.length);
		rows.forEach((c, t) => {
			const w = data.cellWell[c];
			for (let i = 0; i < p; i++) x[t * p + i] = data.cells[c * p + i] - data.profiles[w * p + i];
			groups[t] = groupOf(w);
		});
		return { x, n: rows.length, groups, groupCount };
	}
	const base = plateBaselines(prep, data);
	const rows: number[] = [];
	for (let w = 0; w < data.nWells; w++) if (usable(prep, data, w)) rows.push(w);
	const x = new Float64Array(rows.length * p);
	const groups = new Int32Array(rows.length);
	rows.forEach((w, t) => {
		const q = data.plate[w];
		for (let i = 0; i < p; i++) x[t * p + i] = data.profiles[w * p + i] - base[q * p + i];
		groups[t] = groupOf(w);
	});
	return { x, n: rows.length, groups, groupCount };
}
