/**
 * The pilot worker's tasks (src/lib/ui/pilot/pilotTasks.ts, streamPilot.ts): chunked reading
 * gives exactly the table of a whole-text parse wherever the chunks cut the lines, a bad value
 * comes back as data with its line and column (counted independently from the file's text
 * here), reading stops at the first bad value, and `apply` re-plans without touching its input.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parsePlan } from '../../src/lib/core/plan';
import { analysePilot, parsePilotCsvText } from '../../src/lib/core/pilot';
import { streamPilot } from '../../src/lib/ui/pilot/streamPilot';
import { analysePilotTask, pilotHandlers, ESTIMATING, READING } from '../../src/lib/ui/pilot/pilotTasks';
import type { Progress } from '../../src/lib/workers/protocol';

const plan = parsePlan(readFileSync('templates/demo.json', 'utf8'));
const csv = readFileSync('static/demo-pilot.csv', 'utf8');

/** The same CSV with the value of `column` on file line `line` (header = 1) replaced by `value`. */
function withCell(text: string, line: number, column: string, value: string): string {
	const lines = text.split('\n');
	const header = lines[0].split(',');
	const j = header.indexOf(column);
	const cells = lines[line - 1].split(',');
	cells[j] = value;
	lines[line - 1] = cells.join(',');
	return lines.join('\n');
}

describe('streamPilot', () => {
	it('gives the whole-text table for any chunk size, including chunks that cut lines and numbers', async () => {
		const whole = parsePilotCsvText(plan, csv);
		for (const chunkSize of [97, 1000, 4096, csv.length + 10]) {
			const seen: number[] = [];
			const table = await streamPilot(plan, csv, { chunkSize }, (p) => seen.push(p.read));
			expect(table.wells).toEqual(whole.wells);
			expect(Array.from(table.values)).toEqual(Array.from(whole.values));
			expect(table.features).toEqual(whole.features);
			expect(table.rows).toBe(whole.rows);
			// Progress rises to the input size and never beyond it.
			expect(seen.at(-1)).toBe(csv.length);
			for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
			if (chunkSize < 1000) expect(seen.length).toBeGreaterThan(csv.length / chunkSize / 2);
		}
	});

	it('refuses input that is neither a Blob nor text, and a bad chunk size', () => {
		// (papaparse reads a Blob with FileReader, which Node lacks: the browser test reads Files.)
		expect(() => streamPilot(plan, 42 as unknown as string)).toThrow(/Blob \(or File\) or a string/);
		expect(() => streamPilot(plan, csv, { chunkSize: 0 })).toThrow(/chunkSize must be an integer ≥ 1, got 0/);
	});

	it('stops at the first bad value and names its line and column', async () => {
		// Line 150 of the file (header = line 1); the file has no quoted line breaks, so the
		// record number equals the file line.
		const bad = withCell(csv, 150, 'nucleus_area', 'n/a');
		const seen: number[] = [];
		await expect(streamPilot(plan, bad, { chunkSize: 500 }, (p) => seen.push(p.read))).rejects.toMatchObject({
			name: 'PilotError',
			line: 150,
			column: 'nucleus_area',
			got: '"n/a"'
		});
		// Nothing after the chunk holding line 150 was read.
		expect(Math.max(...seen)).toBeLessThan(bad.length);
	});
});

describe('pilot worker tasks', () => {
	it('analyse: streams, reports progress and estimates exactly as the core does from the whole text', async () => {
		const progress: Progress[] = [];
		const result = await analysePilotTask({ plan, input: csv, seed: 5, chunkSize: 2000 }, (p) => progress.push(p));
		expect(result.ok).toBe(true);
		if (!result.ok) return;
		const direct = analysePilot(plan, parsePilotCsvText(plan, csv), { seed: 5 });
		expect(result.estimates).toEqual(direct);
		expect(result.seed).toBe(5);
		// Every record papaparse yields is counted, the empty one after the final line break included.
		expect(result.lines).toBe(csv.split('\n').length);
		expect(progress.filter((p) => p.note === READING).length).toBeGreaterThan(5);
		expect(progress.at(-1)!.note).toBe(ESTIMATING);
	});

	it('analyse: a bad file comes back as data with line, column, expectation and a message', async () => {
		const bad = withCell(csv, 12, 'reagent', 'kb999');
		const result = await pilotHandlers.analyse({ plan, input: bad }, () => {});
		expect(result).toMatchObject({ ok: false, problem: { line: 12, column: 'reagent', got: '"kb999"' } });
		if (result.ok) return;
		expect(result.problem.expected).toMatch(/a plan reagent id/);
		expect(result.problem.message).toMatch(/^line 12: column "reagent": expected a plan reagent id/);

		const empty = await pilotHandlers.analyse({ plan, input: '' }, () => {});
		expect(empty).toMatchObject({ ok: false, problem: { line: 1, expected: expect.stringMatching(/header row/) } });
	});

	it('apply: returns a re-planned copy and leaves the plan as it was', async () => {
		const result = await analysePilotTask({ plan, input: csv });
		if (!result.ok) throw new Error(result.problem.message);
		const before = JSON.stringify(plan);
		const next = pilotHandlers.apply({ plan, estimates: result.estimates });
		expect(JSON.stringify(plan)).toBe(before);
		expect(next).not.toBe(plan);
		expect(next.observation.replicateNoise).toBe(Number(result.estimates.replicateNoise!.toPrecision(3)));
		expect(next.sectionNotes?.pilot).toMatch(/^Pilot applied: 208 wells/);
	});
});
