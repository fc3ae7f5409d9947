import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import fc from 'fast-check';
import { createPilotReader, parsePilotCsvText, PilotError, parseWellName, simulatePilotRows } from '../../src/lib/core/pilot';
import { demoPlan, recoveryOptions, recoveryPlan, tinyDemoCsv, toCsv } from './fixtures';

const plan = demoPlan();

function errorOf(text: string, kind: 'auto' | 'wells' | 'cells' = 'auto'): PilotError {
	try {
		parsePilotCsvText(plan, text, { kind });
	} catch (err) {
		expect(err).toBeInstanceOf(PilotError);
		return err as PilotError;
	}
	throw new Error('expected a PilotError');
}

const replace = (text: string, line: number, content: string) => {
	const lines = text.split('\n');
	lines[line - 1] = content;
	return lines.join('\n');
};

describe('parseWellName (ANSI/SLAS 4-2004 well names)', () => {
	it('accepts and canonicalises names of the plate format', () => {
		expect(parseWellName('b03', 384)).toBe('B3');
		expect(parseWellName('P24', 384)).toBe('P24');
		expect(parseWellName('AF48', 1536)).toBe('AF48'); // rows A…Z then AA…AF: common convention (REFERENCES.md)
		expect(parseWellName('H12', 96)).toBe('H12');
	});
	it('rejects names outside the format', () => {
		expect(parseWellName('Q1', 384)).toBeNull();
		expect(parseWellName('A25', 384)).toBeNull();
		expect(parseWellName('I1', 96)).toBeNull();
		expect(parseWellName('AG1', 1536)).toBeNull();
		expect(parseWellName('BA1', 1536)).toBeNull();
		expect(parseWellName('A0', 96)).toBeNull();
		expect(parseWellName('', 96)).toBeNull();
	});
});

describe('createPilotReader: a valid wells file', () => {
	it('reads wells, plates, features and well means in file order', () => {
		const t = parsePilotCsvText(plan, tinyDemoCsv());
		expect(t.kind).toBe('wells');
		expect(t.features).toEqual(['f1', 'f2', 'f3']);
		expect(t.plates).toEqual(['P1']);
		expect(t.wells).toHaveLength(11);
		expect(t.wells[0]).toEqual({ plate: 0, well: 'B2', reagent: 'control', context: null, rows: 1, line: 2 });
		expect(Array.from(t.values.subarray(0, 3))).toEqual([1.0, 2.0, 3.1]);
		expect(t.rows).toBe(11);
	});
	it('accepts key columns in any case and order, a BOM, blank lines and quoted fields', () => {
		const text = '\uFEFFF1,Reagent,WELL,Plate,f2\n"1.5",control,B2,P1,1\n\n2,control,B3,P1,1\n3,control,B4,P1,2\n4,kb101,C2,P1,3\n5,kb101,C3,P1,4\n';
		const t = parsePilotCsvText(plan, text);
		expect(t.features).toEqual(['F1', 'f2']);
		expect(t.wells.map((w) => w.line)).toEqual([2, 4, 5, 6, 7]);
		expect(t.values[0]).toBe(1.5);
	});
	it('gives the same table for records (header mode) as for raw rows', () => {
		const text = tinyDemoCsv();
		const records = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true }).data;
		const reader = createPilotReader(plan);
		reader.push(records);
		expect(reader.finish()).toEqual(parsePilotCsvText(plan, text));
	});
	it('any chunking of the rows gives the same table (property, 200 cases)', () => {
		const text = tinyDemoCsv();
		const rows = Papa.parse<string[]>(text, { delimiter: ',' }).data;
		const whole = parsePilotCsvText(plan, text);
		fc.assert(
			fc.property(fc.array(fc.integer({ min: 1, max: rows.length }), { maxLength: 6 }), (cuts) => {
				const points = [...new Set(cuts)].sort((a, b) => a - b);
				const reader = createPilotReader(plan);
				let start = 0;
				for (const end of [...points, rows.length]) {
					if (end > start) reader.push(rows.slice(start, end), start + 1);
					start = end;
				}
				expect(reader.finish()).toEqual(whole);
			}),
			{ numRuns: 200 }
		);
	});
});

describe('createPilotReader: a cells file is averaged per well', () => {
	it('auto-detects cells and averages each well’s rows (equals the wells file of the means)', () => {
		const rp = recoveryPlan();
		const options = recoveryOptions(3, { plates: 1, replicatesPerPlate: 2, controlsPerPlate: 4, cellsPerWell: 5 });
		const rows = [...simulatePilotRows(rp, options)];
		const cells = parsePilotCsvText(rp, toCsv(rows));
		expect(cells.kind).toBe('cells');
		expect(cells.rows).toBe(rows.length - 1);
		expect(cells.wells.every((w) => w.rows === 5)).toBe(true);
		// Means by hand, then as a wells file.
		const header = rows[0].filter((h) => h !== 'cell');
		const byWell = new Map<string, { first: string[]; sums: number[]; n: number }>();
		for (const r of rows.slice(1)) {
			const key = `${r[0]}|${r[1]}`;
			const values = r.slice(4).map(Number);
			const e = byWell.get(key);
			if (e) {
				e.sums = e.sums.map((s, j) => s + values[j]);
				e.n++;
			} else byWell.set(key, { first: r.slice(0, 3), sums: values, n: 1 });
		}
		const meansCsv = toCsv([header, ...[...byWell.values()].map((e) => [...e.first, ...e.sums.map((s) => String(s / e.n))])]);
		const wells = parsePilotCsvText(rp, meansCsv);
		expect(wells.kind).toBe('wells');
		expect(Array.from(cells.values).map((v, i) => v - wells.values[i]).every((d) => Math.abs(d) < 1e-9)).toBe(true);
	});
	it('a cells file without a cell column is detected when most wells repeat; kind "wells" refuses it', () => {
		const text = 'plate,well,reagent,f1\n' + ['control', 'control', 'control', 'kb101', 'kb101'].flatMap((r, i) => [`P1,B${i + 2},${r},${i}`, `P1,B${i + 2},${r},${i + 0.5}`]).join('\n');
		expect(parsePilotCsvText(plan, text).kind).toBe('cells');
		const e = errorOf(text, 'wells');
		expect(e.line).toBe(3);
		expect(e.column).toBe('well');
		expect(e.message).toMatch(/^line 3: column "well": expected one row per well in a wells file \(plate "P1" well B2 is also on line 2\)/);
	});
});

describe('createPilotReader: every error names the line, the column and what was expected', () => {
	const base = tinyDemoCsv();
	it.each([
		['missing reagent column', replace(base, 1, 'plate,well,agent,f1,f2,f3'), 1, 'reagent', /expected a header row with the columns plate, well, reagent/],
		['semicolon file', 'plate;well;reagent;f1\nP1;B2;control;1\n', 1, 'plate', /comma-separated/],
		['empty header cell', replace(base, 1, 'plate,well,reagent,f1,,f3'), 1, '#5', /a column name in every header cell, got an empty header cell/],
		['repeated column', replace(base, 1, 'plate,well,reagent,f1,F1,f3'), 1, 'F1', /unique column names \(also column 4\)/],
		['no feature column', 'plate,well,reagent\nP1,B2,control\n', 1, null, /at least one feature column/],
		['non-numeric value', replace(base, 5, 'P1,B5,control,1.1,abc,3.3'), 5, 'f2', /expected a finite number \(decimal point, optional exponent\), got "abc"/],
		['empty value', replace(base, 5, 'P1,B5,control,1.1,,3.3'), 5, 'f2', /got an empty value/],
		['decimal comma', replace(base, 5, 'P1,B5,control,1.1,"2,5",3.3'), 5, 'f2', /got "2,5"/],
		['infinite value', replace(base, 5, 'P1,B5,control,1.1,1e999,3.3'), 5, 'f2', /expected a finite number, got "1e999"/],
		['bad well', replace(base, 5, 'P1,Q5,control,1.1,2,3.3'), 5, 'well', /a well name A1–P24 of a 384-well plate, got "Q5"/],
		['empty plate', replace(base, 5, ',B5,control,1.1,2,3.3'), 5, 'plate', /a plate label, got an empty value/],
		['empty reagent', replace(base, 5, 'P1,B5,,1.1,2,3.3'), 5, 'reagent', /a plan reagent id, "control" or "positive", got an empty value/],
		['too few fields', replace(base, 5, 'P1,B5,control,1.1,2'), 5, null, /expected 6 fields as in the header, got 5/],
		['duplicate well', replace(base, 5, 'P1,B2,control,1.1,2,3.3'), 5, 'well', /one row per well in a wells file/],
		['too few controls', replace(replace(base, 4, 'P1,F2,positive,5,2,1'), 5, 'P1,F3,positive,5,2,1'), 2, 'reagent', /at least 3 negative-control wells \("control"\) on plate "P1" for its median and MAD, got 2/],
		['one replicate', replace(base, 11, ''), 12, 'reagent', /at least 2 replicate wells of reagent "kb201", got 1/],
		['only controls', 'plate,well,reagent,f1\nP1,B2,control,1\nP1,B3,control,2\nP1,B4,control,3\n', 2, 'reagent', /wells of at least one plan reagent/],
		['no data', 'plate,well,reagent,f1\n', 2, null, /at least one data row after the header/],
		['empty file', '', 1, null, /a header row/]
	])('%s', (_, text, line, column, pattern) => {
		const e = errorOf(text as string);
		expect(e.line).toBe(line);
		expect(e.column).toBe(column);
		expect(e.message).toMatch(pattern as RegExp);
		expect(e.message.startsWith(`line ${line}: `)).toBe(true);
		expect(e.expected.length).toBeGreaterThan(3);
	});

	it('lists every unknown reagent id of the chunk with its first line', () => {
		const text = replace(replace(replace(base, 8, 'P1,D2,kb999,2.2,2.4,3.2'), 9, 'P1,D3,zz1,1.9,2.6,2.8'), 10, 'P1,D4,kb999,1.0,4.0,3.0');
		const e = errorOf(text);
		expect(e.line).toBe(8);
		expect(e.column).toBe('reagent');
		expect(e.message).toMatch(/unknown ids: "kb999" \(line 8\), "zz1" \(line 9\), got "kb999"/);
		expect(e.message).toMatch(/a plan reagent id \(kb101, kb102, /);
	});

	it('a context must be a plan context id or empty', () => {
		const text = 'plate,well,reagent,context,f1\nP1,B2,control,,1\nP1,B3,control,,2\nP1,B4,control,hot,3\n';
		const e = errorOf(text);
		expect(e.line).toBe(4);
		expect(e.column).toBe('context');
		expect(e.message).toMatch(/expected an empty value \(the plan has no contexts\), got "hot"/);
	});

	it('cells of one well must share reagent and context', () => {
		const text = 'plate,well,reagent,cell,f1\nP1,B2,control,1,1\nP1,B2,kb101,2,2\n';
		const e = errorOf(text);
		expect(e.line).toBe(3);
		expect(e.message).toMatch(/column "reagent": expected "control" as on line 2 \(one reagent per well\), got "kb101"/);
	});

	it('caller mistakes throw at once (not PilotError)', () => {
		expect(() => createPilotReader(plan, { kind: 'rows' as 'wells' })).toThrow(/kind must be/);
		const r = createPilotReader(plan);
		expect(() => r.push([['plate']], 0)).toThrow(/firstLine/);
		r.push(Papa.parse<string[]>(tinyDemoCsv()).data);
		r.finish();
		expect(() => r.finish()).toThrow(/twice/);
		expect(() => r.push([])).toThrow(/after finish/);
	});
});
