import { afterAll, describe, expect, it } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Papa from 'papaparse';

const dir = mkdtempSync(join(tmpdir(), 'identiplate-layout-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(...args: string[]) {
	const r = spawnSync(process.execPath, ['bin/identiplate.mjs', 'layout', ...args], { encoding: 'utf8' });
	return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('identiplate layout', () => {
	it('writes the CSV and prints exactly { plates, wells, diagnostics } with --json', () => {
		const csv = join(dir, 'demo.csv');
		const r = run('templates/demo.json', '--csv', csv, '--seed', '4', '--json');
		expect(r.stderr).toBe('');
		expect(r.code).toBe(0);
		const out = JSON.parse(r.stdout);
		expect(Object.keys(out)).toEqual(['plates', 'wells', 'diagnostics']);
		// Demo default design: 20 reagents × 4 replicates + 16 controls on one 384-well plate.
		expect(out.plates).toBe(1);
		expect(out.wells).toBe(96);
		expect(Object.keys(out.diagnostics.maxAssociation)).toEqual(['plate', 'row', 'column', 'edge']);
		const rows = Papa.parse<Record<string, string>>(readFileSync(csv, 'utf8'), { header: true, skipEmptyLines: true }).data;
		expect(rows).toHaveLength(384);
		expect(rows.filter((x) => x.role === 'treatment')).toHaveLength(80);
	});

	it('is reproducible: the same seed writes the same CSV and prints the same JSON', () => {
		const a = join(dir, 'a.csv');
		const b = join(dir, 'b.csv');
		const ra = run('templates/multi-context.json', '--csv', a, '--seed', '9', '--json');
		const rb = run('templates/multi-context.json', '--csv', b, '--seed=9', '--json');
		expect(ra.code).toBe(0);
		expect(readFileSync(a, 'utf8')).toBe(readFileSync(b, 'utf8'));
		expect(ra.stdout).toBe(rb.stdout);
	});

	it('writes one SVG per plate with --svg and a printable page with --out; prints text without --json', () => {
		const svgDir = join(dir, 'maps');
		const html = join(dir, 'sheets.html');
		const r = run('templates/multi-context.json', '--csv', join(dir, 'm.csv'), '--svg', svgDir, '--out', html);
		expect(r.code).toBe(0);
		const files = readdirSync(svgDir).sort();
		expect(files.length).toBeGreaterThan(1);
		expect(files[0]).toBe('plate-1.svg');
		expect(readFileSync(join(svgDir, files[0]), 'utf8')).toMatch(/^<svg xmlns/);
		expect(readFileSync(html, 'utf8')).toMatch(/^<!doctype html>/);
		expect(r.stdout).toMatch(/association of treatment with position/);
		expect(r.stdout).toMatch(/caution:/);
	});

	it('exits 2 with a reason: missing --csv, unknown option, capacity or stock problems', () => {
		const noCsv = run('templates/demo.json');
		expect(noCsv.code).toBe(2);
		expect(noCsv.stderr).toMatch(/--csv FILE is required/);
		const bad = run('templates/demo.json', '--csv', join(dir, 'x.csv'), '--colour');
		expect(bad.code).toBe(2);
		expect(bad.stderr).toMatch(/unknown option --colour/);
		const plan = JSON.parse(readFileSync('templates/demo.json', 'utf8'));
		plan.design = { reagents: ['kb201', 'kb101'], replicates: 20, controlsPerPlate: 16, contexts: [] };
		const stockFile = join(dir, 'stock.json');
		writeFileSync(stockFile, JSON.stringify(plan));
		const stock = run(stockFile, '--csv', join(dir, 's.csv'), '--json');
		// kb201 has maxWells 96 in the demo: 20 replicates fit the stock but not the 14 usable rows of one
		// plate, so the cost model gives ceil(20 / 14) = 2 plates and the layout succeeds.
		expect(stock.code).toBe(0);
		expect(JSON.parse(stock.stdout).plates).toBe(2);
		plan.reagents.find((r: { id: string }) => r.id === 'kb201').maxWells = 10;
		writeFileSync(stockFile, JSON.stringify(plan));
		const stock2 = run(stockFile, '--csv', join(dir, 's.csv'));
		expect(stock2.code).toBe(2);
		expect(stock2.stderr).toMatch(/"kb201" \(KB-201 uncoupler\) needs 20 wells .* stock covers 10/);
	});

	it('is listed in the command registry', () => {
		const help = execFileSync(process.execPath, ['bin/identiplate.mjs', '--help'], { encoding: 'utf8' });
		expect(help).toMatch(/commands: .*layout/);
	});
});
