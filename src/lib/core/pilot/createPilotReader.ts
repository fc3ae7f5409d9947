import type { Plan, PlateFormat } from '../plan/types';
import { PilotError, showCell } from './PilotError';
import { lastWellName, parseWellName } from './wellName';
import { NEGATIVE_CONTROL, POSITIVE_CONTROL, type PilotKind, type PilotReaderOptions, type PilotTable, type PilotWell } from './types';

/** A row as papaparse gives it without a header (string[]) or with one (field → value). */
export type PilotRow = string[] | Record<string, string | undefined>;

/**
 * Incremental pilot CSV reader: feed it rows in any chunking, then call `finish()`.
 * Only one running sum per well is kept, so a cells file of any length needs memory for its
 * wells, not its rows.
 */
export interface PilotReader {
	/**
	 * Adds rows. Arrays are raw CSV records and the first one ever pushed is the header;
	 * objects are records keyed by column name (the header is taken from the first one's keys).
	 * `firstLine` is the line of `rows[0]` (header = line 1); by default the line after the
	 * last row pushed. A blank line (one empty field) is skipped but counted. Throws
	 * `PilotError` on the first bad value; unknown reagent ids are collected over the whole
	 * push and reported together.
	 */
	push(rows: readonly PilotRow[], firstLine?: number): void;
	/** Validates the whole file (replicates, controls, duplicates) and returns the table. */
	finish(): PilotTable;
	/** Lines seen so far (header included). */
	readonly lines: number;
}

const KEY_COLUMNS = ['plate', 'well', 'reagent', 'context', 'cell'] as const;
type KeyColumn = (typeof KEY_COLUMNS)[number];
const NUMBER = /^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*$/;

interface WellAccumulator {
	info: PilotWell;
	sums: Float64Array;
	/** Line of the first repeated row of this well (0 when none). */
	repeatLine: number;
}

/**
 * Reader of a pilot CSV `plate, well, reagent, [context], feature…` (optionally a `cell` column),
 * one row per well or per cell. Key column names are matched case-insensitively; every other
 * column is a numeric feature. `reagent` must be a plan reagent id, `control` or `positive`;
 * `context` a plan context id or empty (baseline).
 */
export function createPilotReader(plan: Plan, options: PilotReaderOptions = {}): PilotReader {
	const kindOption = options.kind ?? 'auto';
	if (!['auto', 'wells', 'cells'].includes(kindOption)) throw new RangeError(`kind must be "auto", "wells" or "cells", got ${JSON.stringify(kindOption)}`);
	const format: PlateFormat = options.plateFormat ?? plan.budget.plateFormat;
	if (![96, 384, 1536].includes(format)) throw new RangeError(`plateFormat must be 96, 384 or 1536, got ${format}`);
	const minControls = options.minControlsPerPlate ?? 3;
	const minReplicates = options.minReplicates ?? 2;
	if (!(Number.isInteger(minControls) && minControls >= 1)) throw new RangeError(`minControlsPerPlate must be an integer ≥ 1, got ${minControls}`);
	if (!(Number.isInteger(minReplicates) && minReplicates >= 1)) throw new RangeError(`minReplicates must be an integer ≥ 1, got ${minReplicates}`);

	const reagentIds = new Set(plan.reagents.map((r) => r.id));
	const contextIds = new Set(plan.contexts.map((c) => c.id));
	const wellsText = `a well name A1–${lastWellName(format)} of a ${format}-well plate`;

	let header: string[] | null = null;
	let headerLine = 1;
	let recordKeys: string[] | null = null;
	const keyIndex: Partial<Record<KeyColumn, number>> = {};
	let featureIndex: number[] = [];
	let features: string[] = [];
	let line = 0;
	let rows = 0;
	let finished = false;
	const plates: string[] = [];
	const plateIndex = new Map<string, number>();
	const wells = new Map<string, WellAccumulator>();
	const order: WellAccumulator[] = [];

	const columnName = (i: number) => (header && header[i].trim() !== '' ? header[i].trim() : `#${i + 1}`);

	function readHeader(cells: string[], at: number) {
		const names = cells.map((c, i) => (i === 0 ? c.replace(/^\uFEFF/, '') : c).trim());
		const seen = new Map<string, number>();
		names.forEach((name, i) => {
			if (name === '') throw new PilotError(at, `#${i + 1}`, 'a column name in every header cell', 'an empty header cell');
			const key = name.toLowerCase();
			const prev = seen.get(key);
			if (prev !== undefined) throw new PilotError(at, name, `unique column names (also column ${prev + 1})`, 'a repeated name');
			seen.set(key, i);
			if ((KEY_COLUMNS as readonly string[]).includes(key)) keyIndex[key as KeyColumn] = i;
		});
		for (const need of ['plate', 'well', 'reagent'] as const) {
			if (keyIndex[need] === undefined) {
				const hint = names.length === 1 && /[;\t|]/.test(names[0]) ? ' (comma-separated; this header uses another separator)' : '';
				throw new PilotError(at, need, `a header row with the columns plate, well, reagent, [context], then feature columns${hint}`, `no "${need}" column`);
			}
		}
		header = names;
		headerLine = at;
		featureIndex = names.map((_, i) => i).filter((i) => !(KEY_COLUMNS as readonly string[]).includes(names[i].toLowerCase()));
		features = featureIndex.map((i) => names[i]);
		if (features.length === 0) throw new PilotError(at, null, 'at least one feature column after plate, well, reagent and context', 'none');
	}

	function addRow(cells: string[], at: number, unknown: Map<string, number>) {
		const h = header!;
		if (cells.length !== h.length) throw new PilotError(at, null, `${h.length} fields as in the header`, `${cells.length}`);
		rows++;
		const plateText = cells[keyIndex.plate!].trim();
		if (plateText === '') throw new PilotError(at, columnName(keyIndex.plate!), 'a plate label', 'an empty value');
		const wellText = cells[keyIndex.well!];
		const well = parseWellName(wellText, format);
		if (well === null) throw new PilotError(at, columnName(keyIndex.well!), wellsText, showCell(wellText));
		const reagent = cells[keyIndex.reagent!].trim();
		if (reagent !== NEGATIVE_CONTROL && reagent !== POSITIVE_CONTROL && !reagentIds.has(reagent)) {
			if (reagent === '') throw new PilotError(at, columnName(keyIndex.reagent!), `a plan reagent id, "${NEGATIVE_CONTROL}" or "${POSITIVE_CONTROL}"`, 'an empty value');
			if (!unknown.has(reagent)) unknown.set(reagent, at);
			return;
		}
		let context: string | null = null;
		if (keyIndex.context !== undefined) {
			const c = cells[keyIndex.context].trim();
			if (c !== '') {
				if (!contextIds.has(c)) {
					const list = [...contextIds].map((x) => JSON.stringify(x)).join(', ');
					throw new PilotError(at, columnName(keyIndex.context), list ? `a plan context id (${list}) or an empty value for the baseline` : 'an empty value (the plan has no contexts)', showCell(c));
				}
				context = c;
			}
		}
		let plate = plateIndex.get(plateText);
		if (plate === undefined) {
			plate = plates.length;
			plates.push(plateText);
			plateIndex.set(plateText, plate);
		}
		const key = `${plate}\u0000${well}`;
		let acc = wells.get(key);
		if (acc === undefined) {
			acc = { info: { plate, well, reagent, context, rows: 0, line: at }, sums: new Float64Array(features.length), repeatLine: 0 };
			wells.set(key, acc);
			order.push(acc);
		} else {
			if (kindOption === 'wells') throw new PilotError(at, columnName(keyIndex.well!), `one row per well in a wells file (plate ${JSON.stringify(plateText)} well ${well} is also on line ${acc.info.line})`, 'a repeated well');
			if (acc.info.reagent !== reagent) throw new PilotError(at, columnName(keyIndex.reagent!), `${JSON.stringify(acc.info.reagent)} as on line ${acc.info.line} (one reagent per well)`, showCell(reagent));
			if (acc.info.context !== context) throw new PilotError(at, columnName(keyIndex.context!), `${acc.info.context === null ? 'an empty value' : JSON.stringify(acc.info.context)} as on line ${acc.info.line} (one context per well)`, showCell(context ?? ''));
			if (acc.repeatLine === 0) acc.repeatLine = at;
		}
		const sums = acc.sums;
		for (let j = 0; j < featureIndex.length; j++) {
			const text = cells[featureIndex[j]];
			if (!NUMBER.test(text)) throw new PilotError(at, features[j], 'a finite number (decimal point, optional exponent)', showCell(text));
			const v = Number(text);
			if (!Number.isFinite(v)) throw new PilotError(at, features[j], 'a finite number', showCell(text));
			sums[j] += v;
		}
		acc.info.rows++;
	}

	function toCells(row: PilotRow, at: number): string[] | null {
		if (Array.isArray(row)) {
			if (row.some((c) => typeof c !== 'string')) throw new PilotError(at, null, 'text fields', 'a non-text field');
			return row as string[];
		}
		if (typeof row !== 'object' || row === null) throw new PilotError(at, null, 'a row of fields', String(row));
		if (recordKeys === null) {
			recordKeys = Object.keys(row);
			readHeader(recordKeys, 1);
		}
		return recordKeys.map((k) => {
			const v = row[k];
			if (v === undefined || v === null) return '';
			if (typeof v !== 'string') throw new PilotError(at, k, 'text fields', 'a non-text field');
			return v;
		});
	}

	return {
		get lines() {
			return line;
		},
		push(batch, firstLine) {
			if (finished) throw new Error('createPilotReader: push() after finish()');
			if (!Array.isArray(batch)) throw new TypeError('push: rows must be an array of rows');
			if (firstLine !== undefined) {
				if (!Number.isInteger(firstLine) || firstLine < 1) throw new RangeError(`push: firstLine must be an integer ≥ 1, got ${firstLine}`);
				line = firstLine - 1;
			}
			const unknown = new Map<string, number>();
			for (const row of batch) {
				line++;
				if (header === null && Array.isArray(row)) {
					if (row.length === 1 && row[0].trim() === '') continue;
					readHeader(row as string[], line);
					continue;
				}
				if (header === null && !Array.isArray(row) && recordKeys === null) line = Math.max(line, 2);
				const cells = toCells(row, line);
				if (cells === null) continue;
				if (cells.length === 1 && cells[0].trim() === '' && header!.length > 1) continue;
				addRow(cells, line, unknown);
			}
			if (unknown.size > 0) {
				const list = [...unknown].slice(0, 20).map(([id, at]) => `${JSON.stringify(id)} (line ${at})`);
				const [firstId, firstAt] = [...unknown][0];
				const known = plan.reagents.map((r) => r.id);
				throw new PilotError(
					firstAt,
					columnName(keyIndex.reagent!),
					`a plan reagent id (${known.slice(0, 12).join(', ')}${known.length > 12 ? ', …' : ''}), "${NEGATIVE_CONTROL}" or "${POSITIVE_CONTROL}"; unknown ids: ${list.join(', ')}${unknown.size > 20 ? `, and ${unknown.size - 20} more` : ''}`,
					showCell(firstId)
				);
			}
		},
		finish() {
			if (finished) throw new Error('createPilotReader: finish() called twice');
			finished = true;
			if (header === null) throw new PilotError(Math.max(1, line), null, 'a header row with the columns plate, well, reagent, [context], then feature columns', 'an empty file');
			if (order.length === 0) throw new PilotError(headerLine + 1, null, 'at least one data row after the header', 'none');
			const repeated = order.filter((w) => w.info.rows > 1);
			let kind: PilotKind;
			if (kindOption === 'auto') kind = keyIndex.cell !== undefined || repeated.length * 2 > order.length ? 'cells' : 'wells';
			else kind = kindOption;
			if (kind === 'wells' && repeated.length > 0) {
				const first = repeated.reduce((a, b) => (b.repeatLine < a.repeatLine ? b : a));
				throw new PilotError(first.repeatLine, columnName(keyIndex.well!), `one row per well in a wells file (plate ${JSON.stringify(plates[first.info.plate])} well ${first.info.well} is also on line ${first.info.line}); for one row per cell add a "cell" column or choose the cells kind`, 'a repeated well');
			}
			validateCounts(order, plates, minControls, minReplicates, columnName(keyIndex.reagent!));
			const p = features.length;
			const values = new Float64Array(order.length * p);
			order.forEach((w, i) => {
				for (let j = 0; j < p; j++) values[i * p + j] = w.sums[j] / w.info.rows;
			});
			return { kind, features: [...features], plates: [...plates], wells: order.map((w) => ({ ...w.info })), values, rows };
		}
	};
}

/** Controls per plate, replicates per (reagent, context), controls in every context that has reagents. */
function validateCounts(order: WellAccumulator[], plates: string[], minControls: number, minReplicates: number, reagentColumn: string) {
	const controlsPerPlate = new Map<number, number>();
	const firstLineOfPlate = new Map<number, number>();
	const groups = new Map<string, { count: number; line: number; reagent: string; context: string | null }>();
	const controlContexts = new Map<string, number>();
	for (const { info } of order) {
		if (!firstLineOfPlate.has(info.plate)) firstLineOfPlate.set(info.plate, info.line);
		if (info.reagent === NEGATIVE_CONTROL) {
			controlsPerPlate.set(info.plate, (controlsPerPlate.get(info.plate) ?? 0) + 1);
			controlContexts.set(info.context ?? '', (controlContexts.get(info.context ?? '') ?? 0) + 1);
		} else if (info.reagent !== POSITIVE_CONTROL) {
			const key = `${info.reagent}\u0000${info.context ?? ''}`;
			const g = groups.get(key);
			if (g) g.count++;
			else groups.set(key, { count: 1, line: info.line, reagent: info.reagent, context: info.context });
		}
	}
	for (let q = 0; q < plates.length; q++) {
		const n = controlsPerPlate.get(q) ?? 0;
		if (n < minControls) {
			throw new PilotError(firstLineOfPlate.get(q)!, reagentColumn, `at least ${minControls} negative-control wells ("${NEGATIVE_CONTROL}") on plate ${JSON.stringify(plates[q])} for its median and MAD`, `${n}`);
		}
	}
	if (groups.size === 0) throw new PilotError(order[0].info.line, reagentColumn, 'wells of at least one plan reagent (only controls were found)', 'none');
	for (const g of groups.values()) {
		const where = g.context === null ? '' : ` in context ${JSON.stringify(g.context)}`;
		if (g.count < minReplicates) {
			throw new PilotError(g.line, reagentColumn, `at least ${minReplicates} replicate wells of reagent ${JSON.stringify(g.reagent)}${where}`, `${g.count}`);
		}
		const controls = controlContexts.get(g.context ?? '') ?? 0;
		if (controls < 2) {
			throw new PilotError(g.line, reagentColumn, `negative-control wells in the context of reagent ${JSON.stringify(g.reagent)}${g.context === null ? ' (the baseline)' : where} to compare it with`, `${controls}`);
		}
	}
}
