import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import { analysePilot, parsePilotCsvText, PilotError, type PilotEstimates } from '../../src/lib/core/pilot';
import { demoPlan, tinyDemoCsv } from './fixtures';

const plan = demoPlan();

/** Every number in a plain-data result is finite (NaN or ±Infinity would be a bug). */
function allFinite(value: unknown): boolean {
	if (typeof value === 'number') return Number.isFinite(value);
	if (Array.isArray(value)) return value.every(allFinite);
	if (value && typeof value === 'object') return Object.values(value).every(allFinite);
	return true;
}

function checkEstimates(e: PilotEstimates) {
	expect(allFinite(e)).toBe(true);
	expect(e.wells).toBeGreaterThan(0);
	expect(Number.isInteger(e.signalDimension)).toBe(true);
	expect(e.signalDimension).toBeGreaterThanOrEqual(0);
	expect(e.signalDimension).toBeLessThanOrEqual(Math.max(0, e.signal.groups - 1));
	for (const v of [e.replicateNoise, e.measurementNoise, e.plateEffect]) if (v !== null) expect(v).toBeGreaterThanOrEqual(0);
	const ids = new Set(plan.reagents.map((r) => r.id));
	for (const r of e.reagents) {
		expect(ids.has(r.id)).toBe(true);
		expect(r.distance).toBeGreaterThanOrEqual(0);
		if (r.effect !== null) expect(r.effect).toBeGreaterThanOrEqual(0);
	}
}

/** Parses and analyses; returns 'ok' or the PilotError (anything else fails the test). */
function attempt(text: string): 'ok' | PilotError {
	try {
		const table = parsePilotCsvText(plan, text);
		checkEstimates(analysePilot(plan, table, { permutations: 5, seed: 1 }));
		return 'ok';
	} catch (err) {
		if (!(err instanceof PilotError)) throw err;
		const lines = text.split(/\r\n|\n|\r/).length;
		expect(Number.isInteger(err.line)).toBe(true);
		expect(err.line).toBeGreaterThanOrEqual(1);
		expect(err.line).toBeLessThanOrEqual(lines + 1);
		expect(err.expected.trim().length).toBeGreaterThan(3);
		expect(err.message.startsWith(`line ${err.line}: `)).toBe(true);
		if (err.column !== null) expect(err.message).toContain(`column ${JSON.stringify(err.column)}: expected`);
		return err;
	}
}

const field = fc.oneof(
	fc.constantFrom('P1', 'P2', 'B2', 'B3', 'C4', 'D5', 'P24', 'Q9', 'A0', 'control', 'positive', 'kb101', 'kb201', 'kb999', '', ' ', 'NaN', '1e999', '-0', '1,5', '"'),
	fc.double({ noNaN: false, noDefaultInfinity: false }).map(String),
	fc.integer({ min: -5, max: 50 }).map(String),
	fc.string({ maxLength: 6 })
);
const headerName = fc.oneof(fc.constantFrom('plate', 'well', 'reagent', 'context', 'cell', 'f1', 'f2', 'f3', 'F1', ''), fc.string({ maxLength: 4 }));

describe('fuzzed pilot CSVs never crash: a precise error or a valid result', () => {
	it('arbitrary headers and rows (3,000 cases)', () => {
		const csv = fc
			.tuple(fc.array(headerName, { minLength: 1, maxLength: 7 }), fc.array(fc.array(field, { minLength: 0, maxLength: 8 }), { maxLength: 25 }))
			.map(([header, rows]) => [header, ...rows].map((r) => r.join(',')).join('\n'));
		fc.assert(fc.property(csv, (text) => void attempt(text)), { numRuns: 3000 });
	});

	it('well-formed files with random reagents and values (1,000 cases)', () => {
		const row = fc.tuple(fc.constantFrom('control', 'control', 'control', 'positive', 'kb101', 'kb201', 'kb301'), fc.array(fc.double({ min: -100, max: 100, noNaN: true }), { minLength: 3, maxLength: 3 }));
		// Well names are unique per row (B2, B3, …), so duplicates do not hide the other checks; the
		// first 20 rows are on plate P1, the rest on P2.
		const csv = fc.array(row, { minLength: 1, maxLength: 40, size: 'max' }).map((rows) => ['plate,well,reagent,f1,f2,f3', ...rows.map(([r, v], i) => [i < 20 ? 'P1' : 'P2', `${'BC'[Math.floor(i / 20)]}${2 + (i % 20)}`, r, ...v.map(String)].join(','))].join('\n'));
		let ok = 0;
		fc.assert(
			fc.property(csv, (text) => {
				if (attempt(text) === 'ok') ok++;
			}),
			{ numRuns: 1000 }
		);
		expect(ok).toBeGreaterThan(0); // some generated files are valid and analysed
	});

	it('one cell of a valid file replaced by anything: valid, or an error at exactly that line and column (2,000 cases)', () => {
		const rows = Papa.parse<string[]>(tinyDemoCsv(), { delimiter: ',' }).data.filter((r) => r.length > 1);
		const header = rows[0];
		fc.assert(
			fc.property(fc.integer({ min: 1, max: rows.length - 1 }), fc.integer({ min: 0, max: header.length - 1 }), fc.oneof(field, fc.string({ maxLength: 10 })), (r, c, value) => {
				const copy = rows.map((x) => x.slice());
				copy[r][c] = value;
				const text = Papa.unparse(copy, { newline: '\n' });
				const result = attempt(text);
				if (result === 'ok') return;
				const isNumber = /^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*$/.test(value) && Number.isFinite(Number(value));
				if (c >= 3 && !isNumber) {
					expect(result.line).toBe(r + 1);
					expect(result.column).toBe(header[c]);
				} else if (c < 3 && result.column === header[c] && result.expected.startsWith('a ')) {
					expect(result.line).toBe(r + 1);
				}
			}),
			{ numRuns: 2000 }
		);
	});

	it('regression: an extreme value (found by the fuzzer) is an input error naming its line and column, not NaN output', () => {
		const text = tinyDemoCsv().replace('P1,B3,control,1.2,2.1,2.9', 'P1,B3,control,1.2,3.162641357714374e+153,2.9');
		const result = attempt(text);
		expect(result).toBeInstanceOf(PilotError);
		expect((result as PilotError).message).toBe(`line 3: column "f2": expected a value within 10¹² control SDs of its plate's control median (an extreme outlier or a unit error), got 3.162641357714374e+153`);
	});
});
