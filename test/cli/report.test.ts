import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';
import { simulatePilotRows } from '../../src/lib/core/pilot';
import { parsePlan } from '../../src/lib/core/plan';

let dir: string;
beforeAll(() => {
	dir = mkdtempSync(join(tmpdir(), 'identiplate-report-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(...args: string[]) {
	const res = spawnSync(process.execPath, ['bin/identiplate.mjs', 'report', ...args], { encoding: 'utf8', timeout: 170_000 });
	return { code: res.status, stdout: res.stdout, stderr: res.stderr };
}

/** The demo template with a fixed design (invented demo data), written to a file. */
function fixedPlanFile(name: string): string {
	const p = JSON.parse(readFileSync('templates/demo.json', 'utf8'));
	p.design = { reagents: ['kb101', 'kb201', 'kb301', 'kb401', 'kb501', 'kb601', 'kb701', 'kb704'], replicates: 6, controlsPerPlate: 16, contexts: [] };
	const file = join(dir, name);
	writeFileSync(file, JSON.stringify(p, null, 2));
	return file;
}

const sha = (bytes: Buffer | string) => createHash('sha256').update(bytes).digest('hex');

describe('identiplate report', () => {
	it('writes one HTML file and prints { out, sections, bytes, sha256 } with --json', () => {
		const plan = fixedPlanFile('fixed.json');
		const out = join(dir, 'fixed.html');
		const { code, stdout, stderr } = run(plan, '--out', out, '--reps', '20', '--seed', '3', '--threads', '1', '--json');
		expect(stderr).toBe('');
		expect(code).toBe(0);
		const res = JSON.parse(stdout);
		expect(res.out).toBe(out);
		const bytes = readFileSync(out);
		expect(res.bytes).toBe(statSync(out).size);
		expect(res.sha256).toBe(sha(bytes));
		expect(res.planSha256).toBe(sha(readFileSync(plan)));
		expect(res.sections.map((s: { id: string }) => s.id)).toEqual(['question', 'inputs', 'verdicts', 'simulation', 'sizing', 'design', 'layout', 'pilot', 'revisions', 'cautions', 'reproducibility']);
		const has = Object.fromEntries(res.sections.map((s: { id: string; hasResults: boolean }) => [s.id, s.hasResults]));
		expect(has).toMatchObject({ simulation: true, sizing: false, design: true, layout: true, pilot: false, revisions: false });
		const html = bytes.toString('utf8');
		expect(html).toContain('identiplate report fixed.json --seed 3 --reps 20');
		expect(html).toContain(`Plan file SHA-256</dt><dd>${res.planSha256}</dd>`);
		expect(html).toContain('<figure class="rp-plate"><svg');
		expect(html).toContain('Seeds</dt><dd>simulation 3; layout 3</dd>');
	}, 180_000);

	it('gives the same report for the same plan and seed, apart from the generation date', () => {
		const plan = fixedPlanFile('again.json');
		const a = join(dir, 'a.html');
		const b = join(dir, 'b.html');
		expect(run(plan, '--out', a, '--reps', '10', '--threads', '1').code).toBe(0);
		expect(run(plan, '--out', b, '--reps', '10', '--threads', '2').code).toBe(0);
		const strip = (f: string) => readFileSync(f, 'utf8').replace(/\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}\.\d{3}Z)?( UTC)?/g, 'DATE');
		expect(strip(a)).toBe(strip(b));
	}, 180_000);

	it('includes pilot findings from --pilot DATA.csv', () => {
		const planFile = fixedPlanFile('pilot.json');
		const plan = parsePlan(readFileSync(planFile, 'utf8'));
		const rows = [
			...simulatePilotRows(plan, {
				seed: 4,
				reagents: plan.design!.reagents,
				plates: 2,
				replicatesPerPlate: 3,
				controlsPerPlate: 12,
				positivesPerPlate: 4,
				cellsPerWell: 0,
				truth: { replicateNoise: 0.6, measurementNoise: 0.3, plateEffect: 0.3, positive: { mem: 3 } }
			})
		];
		const csv = join(dir, 'pilot.csv');
		writeFileSync(csv, Papa.unparse(rows, { newline: '\n' }) + '\n');
		const out = join(dir, 'pilot.html');
		const { code, stdout, stderr } = run(planFile, '--pilot', csv, '--out', out, '--reps', '10', '--threads', '1', '--json');
		expect(stderr).toBe('');
		expect(code).toBe(0);
		const res = JSON.parse(stdout);
		expect(res.sections.find((s: { id: string }) => s.id === 'pilot').hasResults).toBe(true);
		const html = readFileSync(out, 'utf8');
		expect(html).toContain('Plan assumptions against pilot estimates');
		expect(html).toContain('--pilot pilot.csv');
	}, 180_000);

	it('sizes a plan without a fixed design and reports the recommended design (or why there is none)', () => {
		const out = join(dir, 'demo.html');
		const { code, stdout } = run('templates/demo.json', '--out', out, '--reps', '10', '--threads', '1', '--json');
		expect(code).toBe(0);
		const res = JSON.parse(stdout);
		const has = Object.fromEntries(res.sections.map((s: { id: string; hasResults: boolean }) => [s.id, s.hasResults]));
		expect(has.sizing).toBe(true);
		const html = readFileSync(out, 'utf8');
		expect(html).toMatch(/Recommended design|Best design the budget buys|no design fits the budget/);
		// A layout that cannot be made is explained, never silently missing.
		if (!has.layout) expect(html).toContain(`Why: ${res.unavailable.layout.slice(0, 40)}`);
	}, 180_000);

	it('exits 2 with a clear message for bad input', () => {
		const plan = fixedPlanFile('bad.json');
		const noOut = run(plan);
		expect(noOut.code).toBe(2);
		expect(noOut.stderr).toContain('--out FILE.html is required');
		const missing = run(join(dir, 'nope.json'), '--out', join(dir, 'x.html'));
		expect(missing.code).toBe(2);
		expect(missing.stderr).toContain('nope.json: cannot read the plan file');
		const badCsv = join(dir, 'bad.csv');
		writeFileSync(badCsv, 'plate,well,reagent,f1\nP1,Z99,control,1\n');
		const bad = run(plan, '--pilot', badCsv, '--out', join(dir, 'y.html'));
		expect(bad.code).toBe(2);
		expect(bad.stderr).toMatch(/bad\.csv: line 2/);
		expect(existsSync(join(dir, 'y.html'))).toBe(false);
		const flag = run(plan, '--out', join(dir, 'z.html'), '--bogus');
		expect(flag.code).toBe(2);
		expect(flag.stderr).toContain('unknown option --bogus');
		const reps = run(plan, '--out', join(dir, 'z.html'), '--reps', '0');
		expect(reps.code).toBe(2);
	}, 180_000);
});
