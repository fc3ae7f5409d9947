import { MAD_TO_SD, mad, median } from './robust';
import { NEGATIVE_CONTROL, type PilotWell } from './types';

export interface NormalisedPilot {
	/** Normalised profiles, row-major wells × p: (x − plate control median) / plate control scale. */
	y: Float64Array;
	/** Pooled within-plate robust SD of the controls per feature (the common scale). */
	scale: Float64Array;
	/**
	 * Between-plate variance of the control means per feature, in units of `scale`, corrected
	 * for the control wells' own scatter (plate means of controls compared within each context),
	 * floored at 0; null with fewer than two plates per context.
	 */
	plateVariances: Float64Array | null;
	/** Mean of `plateVariances` over features (null likewise). */
	plateVariance: number | null;
	/** Features whose scale on some plate fell back to the pooled scale (plate MAD was 0; 'plate' scaling only). */
	fallbacks: number;
}

/**
 * Robust per-plate normalisation on the negative controls: every feature of every well is
 * centred on its plate's control median and divided by a control MAD × 1.4826 (the SD of
 * normal data). `scaling: 'pooled'` (default) divides by the MAD of all controls around their
 * plate medians, the same for every plate; `'plate'` divides by each plate's own control MAD
 * (use it when plates differ in gain; with 16 controls a plate MAD is only good to about ±30%,
 * which distorts the profiles' geometry). Where a MAD is 0 (or below 10⁻⁶ of the robust spread
 * of all wells) the root mean square of the centred controls, then that spread, is used.
 * `x` is row-major wells × p (already restricted to the kept features); it is not modified.
 */
export function normalisePilot(x: Float64Array, wells: readonly PilotWell[], p: number, plates: number, scaling: 'pooled' | 'plate' = 'pooled'): NormalisedPilot {
	if (scaling !== 'pooled' && scaling !== 'plate') throw new RangeError(`scaling must be "pooled" or "plate", got ${JSON.stringify(scaling)}`);
	const n = wells.length;
	const controlRows: number[][] = Array.from({ length: plates }, () => []);
	wells.forEach((w, i) => {
		if (w.reagent === NEGATIVE_CONTROL) controlRows[w.plate].push(i);
	});
	const centre = new Float64Array(plates * p);
	const plateScale = new Float64Array(plates * p);
	const scale = new Float64Array(p);
	let fallbacks = 0;
	const column = (rows: number[], j: number) => Float64Array.from(rows, (i) => x[i * p + j]);
	for (let j = 0; j < p; j++) {
		const deviations: number[] = [];
		const centred: number[] = [];
		for (let q = 0; q < plates; q++) {
			const v = column(controlRows[q], j);
			const m = median(v);
			centre[q * p + j] = m;
			plateScale[q * p + j] = MAD_TO_SD * mad(v, m);
			for (const value of v) {
				deviations.push(Math.abs(value - m));
				centred.push(value - m);
			}
		}
		// Robust spread of all wells around their plate's control median: the fallback when the
		// controls are constant, and the floor (× 1e-6) below which a control scale counts as constant.
		const all: number[] = [];
		for (let i = 0; i < n; i++) all.push(x[i * p + j] - centre[wells[i].plate * p + j]);
		const absAll = all.map(Math.abs);
		const overall = MAD_TO_SD * median(absAll) || rootMeanSquare(all);
		const floor = 1e-6 * overall;
		let s = MAD_TO_SD * median(deviations);
		if (!(s > floor)) s = rootMeanSquare(centred);
		if (!(s > floor)) s = overall;
		if (!(s > 0)) s = 1;
		scale[j] = s;
		let fellBack = false;
		for (let q = 0; q < plates; q++) {
			if (scaling === 'pooled') plateScale[q * p + j] = s;
			else if (!(plateScale[q * p + j] > floor)) {
				plateScale[q * p + j] = s;
				fellBack = true;
			}
		}
		if (fellBack) fallbacks++;
	}
	const y = new Float64Array(n * p);
	for (let i = 0; i < n; i++) {
		const q = wells[i].plate;
		for (let j = 0; j < p; j++) y[i * p + j] = (x[i * p + j] - centre[q * p + j]) / plateScale[q * p + j];
	}
	const plateVariances = perFeaturePlateVariance(x, wells, p, scale);
	const plateVariance = plateVariances === null ? null : plateVariances.reduce((s, v) => s + v, 0) / p;
	return { y, scale, plateVariances, plateVariance, fallbacks };
}

function rootMeanSquare(values: number[]): number {
	let s = 0;
	for (const v of values) s += v * v;
	return values.length ? Math.sqrt(s / values.length) : 0;
}

/**
 * Plate effect variance per feature: within each context, the variance across plates of the
 * plates' control means (feature j scaled by scale[j]) minus the mean of (within-plate control
 * variance / controls); pooled over contexts by degrees of freedom, floored at 0.
 */
function perFeaturePlateVariance(x: Float64Array, wells: readonly PilotWell[], p: number, scale: Float64Array): Float64Array | null {
	const cells = new Map<string, { context: string; rows: number[] }>();
	wells.forEach((w, i) => {
		if (w.reagent !== NEGATIVE_CONTROL) return;
		const key = `${w.context ?? ''}\u0000${w.plate}`;
		let c = cells.get(key);
		if (!c) cells.set(key, (c = { context: w.context ?? '', rows: [] }));
		c.rows.push(i);
	});
	const byContext = new Map<string, number[][]>();
	for (const c of cells.values()) {
		if (c.rows.length < 2) continue;
		const list = byContext.get(c.context) ?? [];
		list.push(c.rows);
		byContext.set(c.context, list);
	}
	let dof = 0;
	for (const list of byContext.values()) if (list.length >= 2) dof += list.length - 1;
	if (dof === 0) return null;
	const out = new Float64Array(p);
	for (let j = 0; j < p; j++) {
		let between = 0;
		let correction = 0;
		for (const list of byContext.values()) {
			if (list.length < 2) continue;
			const means: number[] = [];
			let noise = 0;
			for (const rows of list) {
				let m = 0;
				for (const i of rows) m += x[i * p + j] / scale[j];
				m /= rows.length;
				let v = 0;
				for (const i of rows) v += (x[i * p + j] / scale[j] - m) ** 2;
				v /= rows.length - 1;
				means.push(m);
				noise += v / rows.length;
			}
			const grand = means.reduce((a, b) => a + b, 0) / means.length;
			for (const m of means) between += (m - grand) ** 2;
			// E[Σ(m − m̄)²] = (Q − 1)σ²_plate + (1 − 1/Q)Σ vᵢ/nᵢ
			correction += (noise * (list.length - 1)) / list.length;
		}
		out[j] = Math.max(0, (between - correction) / dof);
	}
	return out;
}
