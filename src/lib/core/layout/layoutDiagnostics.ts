import type { PlateFormat } from '../plan/types';
import { PLATE_GEOMETRY } from '../size/costModel';
import { chiSquareIndependence } from './chiSquareIndependence';
import { kruskalWallis } from './kruskalWallis';
import { edgeDistance } from './plateGeometry';
import type { AssociationStat, LayoutDiagnostics, LayoutPlate } from './types';
import { parseWellName } from './wellName';

/** The parts of a layout the diagnostics read. */
export interface LayoutShape {
	format: PlateFormat;
	excludeEdgeWells: boolean;
	plates: LayoutPlate[];
}

/** Association p-values below this add a warning (common practice: a strict screening level). */
const WARN_P = 0.01;

/**
 * Diagnostics of a layout, computed from its wells alone (so any layout, also one read back
 * from a file, can be checked). `optimiser` and `warnings` from the placement are passed
 * through; warnings about unusual associations are appended.
 */
export function layoutDiagnostics(
	layout: LayoutShape,
	extra: { optimiser?: LayoutDiagnostics['optimiser']; warnings?: string[] } = {}
): LayoutDiagnostics {
	const { rows, columns } = PLATE_GEOMETRY[layout.format];
	const off = layout.excludeEdgeWells ? 1 : 0;
	const groupIndex = new Map<string, number>();
	const groupKeys: { reagent: string; context: string | null; firstPlate: number }[] = [];
	// Per treatment well: group, plate position in the list, row0, col0.
	const tg: number[] = [];
	const tp: number[] = [];
	const tr: number[] = [];
	const tc: number[] = [];
	const counts = { treatment: 0, control: 0, empty: 0, excluded: 0 };
	let ctlRowMin = Infinity;
	let ctlRowMax = -Infinity;
	let ctlColMin = Infinity;
	let ctlColMax = -Infinity;
	layout.plates.forEach((plate, pi) => {
		const ctlRow = new Int32Array(rows);
		const ctlCol = new Int32Array(columns);
		for (const w of plate.wells) {
			const { row0, col0 } = parseWellName(w.well);
			const excluded = off === 1 && (row0 === 0 || col0 === 0 || row0 === rows - 1 || col0 === columns - 1);
			if (w.role === 'empty') {
				counts.empty++;
				if (excluded) counts.excluded++;
				continue;
			}
			if (w.role === 'control') {
				counts.control++;
				ctlRow[row0]++;
				ctlCol[col0]++;
				continue;
			}
			counts.treatment++;
			const key = `${w.reagent}\u0000${w.context ?? ''}`;
			let g = groupIndex.get(key);
			if (g === undefined) {
				g = groupKeys.length;
				groupIndex.set(key, g);
				groupKeys.push({ reagent: w.reagent ?? '', context: w.context, firstPlate: pi });
			}
			tg.push(g);
			tp.push(pi);
			tr.push(row0);
			tc.push(col0);
		}
		for (let r = off; r < rows - off; r++) {
			ctlRowMin = Math.min(ctlRowMin, ctlRow[r]);
			ctlRowMax = Math.max(ctlRowMax, ctlRow[r]);
		}
		for (let c = off; c < columns - off; c++) {
			ctlColMin = Math.min(ctlColMin, ctlCol[c]);
			ctlColMax = Math.max(ctlColMax, ctlCol[c]);
		}
	});
	const nGroups = groupKeys.length;
	const nPlates = layout.plates.length;

	const table = (levels: number, levelOf: (i: number) => number, keep: (i: number) => boolean = () => true) => {
		const t = Array.from({ length: nGroups }, () => new Array<number>(levels).fill(0));
		for (let i = 0; i < tg.length; i++) if (keep(i)) t[tg[i]][levelOf(i)]++;
		return t.filter((row) => row.some((v) => v > 0));
	};
	const nominal = (t: number[][], scope: string | null): AssociationStat => {
		const r = chiSquareIndependence(t);
		return { measure: 'cramersV', value: r.cramersV, corrected: r.cramersVCorrected, test: 'chiSquare', statistic: r.statistic, df: r.df, pValue: r.pValue, scope };
	};

	// Plate: per block of plates sharing a context; keep the largest V.
	let plate: AssociationStat | null = null;
	const blocks = new Map<string, number[]>();
	layout.plates.forEach((p, pi) => {
		const key = p.context ?? '';
		blocks.set(key, [...(blocks.get(key) ?? []), pi]);
	});
	for (const [key, plateList] of blocks) {
		if (plateList.length < 2) continue;
		const pos = new Map(plateList.map((pi, k) => [pi, k]));
		const stat = nominal(
			table(plateList.length, (i) => pos.get(tp[i])!, (i) => pos.has(tp[i])),
			key === '' ? null : key
		);
		if (!plate || stat.value > plate.value) plate = stat;
	}
	const row = nominal(table(rows, (i) => tr[i]), null);
	const column = nominal(table(columns, (i) => tc[i]), null);
	const samples: number[][] = Array.from({ length: nGroups }, () => []);
	for (let i = 0; i < tg.length; i++) samples[tg[i]].push(edgeDistance(layout.format, tr[i], tc[i]));
	const kw = kruskalWallis(samples);
	const edge: AssociationStat = { measure: 'etaSquared', value: kw.etaSquared, corrected: null, test: 'kruskalWallis', statistic: kw.statistic, df: kw.df, pValue: kw.pValue, scope: null };

	// Replicate spread.
	let evenPlates = 0;
	let distinctRows = 0;
	let distinctColumns = 0;
	const perPlate = Array.from({ length: nGroups }, () => new Int32Array(nPlates));
	const rowSeen = Array.from({ length: nGroups }, () => new Set<number>());
	const colSeen = Array.from({ length: nGroups }, () => new Set<number>());
	const rowOk = new Uint8Array(nGroups).fill(1);
	const colOk = new Uint8Array(nGroups).fill(1);
	for (let i = 0; i < tg.length; i++) {
		const g = tg[i];
		perPlate[g][tp[i]]++;
		const rk = tp[i] * rows + tr[i];
		const ck = tp[i] * columns + tc[i];
		if (rowSeen[g].has(rk)) rowOk[g] = 0;
		if (colSeen[g].has(ck)) colOk[g] = 0;
		rowSeen[g].add(rk);
		colSeen[g].add(ck);
	}
	for (let g = 0; g < nGroups; g++) {
		const plateList = blocks.get(layout.plates[groupKeys[g].firstPlate].context ?? '')!;
		const n = plateList.reduce((s, pi) => s + perPlate[g][pi], 0);
		const lo = Math.floor(n / plateList.length);
		const hi = Math.ceil(n / plateList.length);
		if (plateList.every((pi) => perPlate[g][pi] >= lo && perPlate[g][pi] <= hi)) evenPlates++;
		distinctRows += rowOk[g];
		distinctColumns += colOk[g];
	}
	const share = (k: number) => (nGroups > 0 ? k / nGroups : 1);

	const warnings = [...(extra.warnings ?? [])];
	const fmt = (x: number) => (x < 0.001 ? x.toExponential(1) : x.toFixed(3));
	const assoc: [string, AssociationStat | null][] = [
		['plate', plate],
		['row', row],
		['column', column],
		['distance to the edge', edge]
	];
	for (const [name, s] of assoc) {
		if (s && s.df > 0 && s.pValue < WARN_P)
			warnings.push(
				`Treatments are associated with ${name} more than chance would give (${s.measure === 'cramersV' ? `bias-corrected Cramér's V ${(s.corrected ?? s.value).toFixed(3)}` : `η² ${s.value.toFixed(3)}`}, p = ${fmt(s.pValue)}); try another seed or a larger optimiser effort, or check the design's constraints.`
			);
	}
	return {
		maxAssociation: { plate, row, column, edge },
		controlsPerRow: { min: Number.isFinite(ctlRowMin) ? ctlRowMin : 0, max: Number.isFinite(ctlRowMax) ? ctlRowMax : 0 },
		controlsPerColumn: { min: Number.isFinite(ctlColMin) ? ctlColMin : 0, max: Number.isFinite(ctlColMax) ? ctlColMax : 0 },
		replicateSpread: { groups: nGroups, distinctPlates: share(evenPlates), distinctRows: share(distinctRows), distinctColumns: share(distinctColumns) },
		counts,
		optimiser: extra.optimiser ?? null,
		warnings
	};
}
