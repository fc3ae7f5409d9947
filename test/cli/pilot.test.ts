import { afterAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parsePlan } from '../../src/lib/core/plan';

const dir = mkdtempSync(join(tmpdir(), 'identiplate-pilot-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(...args: string[]) {
	const r = spawnSync(process.execPath, ['bin/identiplate.mjs', 'pilot', ...args], { encoding: 'utf8' });
	return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

// Each run starts node with the TypeScript loader (a few seconds on a busy machine).
describe('identiplate pilot', { timeout: 180_000 }, () => {
	it('prints the estimates as JSON for the demo pilot', () => {
		const r = run('templates/demo.json', 'static/demo-pilot.csv', '--json');
		expect(r.stderr).toBe('');
		expect(r.code).toBe(0);
		const out = JSON.parse(r.stdout);
		expect(Object.keys(out).slice(0, 6)).toEqual(['wells', 'replicateNoise', 'plateEffect', 'signalDimension', 'zPrime', 'reagents']);
		expect(out.wells).toBe(208);
		expect(out.signalDimension).toBe(7);
		expect(typeof out.zPrime).toBe('number');
		expect(out.reagents).toHaveLength(10);
		expect(Object.keys(out.reagents[0]).slice(0, 2)).toEqual(['id', 'effect']);
		expect(out.units.replicateNoise).toBe('factor SD units');
		expect(out.out).toBeNull();
	});

	it('prints readable text with cautions by default', () => {
		const r = run('templates/demo.json', 'static/demo-pilot.csv');
		expect(r.code).toBe(0);
		expect(r.stdout).toMatch(/^pilot: 208 wells on 2 plates, 48 of 48 features kept/);
		expect(r.stdout).toMatch(/signal dimension {2}7 {2}\(plan: 6 factors/);
		expect(r.stdout).toMatch(/reviewed by a statistician/);
	});

	it('--out writes a valid re-planned plan and refuses to overwrite it without --force', () => {
		const out = join(dir, 'next.json');
		const first = run('templates/demo.json', 'static/demo-pilot.csv', '--out', out, '--json');
		expect(first.code).toBe(0);
		expect(JSON.parse(first.stdout).out).toBe(out);
		const next = parsePlan(readFileSync(out, 'utf8'));
		expect(next.sectionNotes?.pilot).toMatch(/^Pilot applied: 208 wells/);
		expect(next.observation.replicateNoise).toBe(Number(JSON.parse(first.stdout).replicateNoise.toPrecision(3)));
		const before = readFileSync(out, 'utf8');
		const again = run('templates/demo.json', 'static/demo-pilot.csv', '--out', out);
		expect(again.code).toBe(2);
		expect(again.stderr).toMatch(/next\.json exists; refusing to overwrite it \(add --force to replace it\)/);
		expect(readFileSync(out, 'utf8')).toBe(before);
		writeFileSync(out, 'old');
		const forced = run('templates/demo.json', 'static/demo-pilot.csv', '--out', out, '--force');
		expect(forced.code).toBe(0);
		expect(readFileSync(out, 'utf8')).toBe(before);
	});

	it('bad CSV input exits 2 with DATA.csv:LINE: column "x": expected …', () => {
		const lines = readFileSync('static/demo-pilot.csv', 'utf8').split('\n');
		const cells = lines[4].split(',');
		cells[5] = 'n/a';
		lines[4] = cells.join(',');
		const bad = join(dir, 'bad.csv');
		writeFileSync(bad, lines.join('\n'));
		const r = run('templates/demo.json', bad);
		expect(r.code).toBe(2);
		expect(r.stdout).toBe('');
		expect(r.stderr).toBe(`identiplate pilot: ${bad}:5: column "nucleus_texture_a": expected a finite number (decimal point, optional exponent), got "n/a"\n`);
	});

	it('unknown reagents are listed; a missing file and usage mistakes exit 2', () => {
		const bad = join(dir, 'unknown.csv');
		writeFileSync(bad, 'plate,well,reagent,f1\nP1,B2,control,1\nP1,B3,kb000,2\nP1,B4,mystery,3\n');
		const r = run('templates/demo.json', bad);
		expect(r.code).toBe(2);
		expect(r.stderr).toMatch(/unknown\.csv:3: column "reagent": expected a plan reagent id .*unknown ids: "kb000" \(line 3\), "mystery" \(line 4\)/);
		const missing = run('templates/demo.json', join(dir, 'nope.csv'));
		expect(missing.code).toBe(2);
		expect(missing.stderr).toMatch(/nope\.csv: cannot read the pilot CSV \(ENOENT\)/);
		expect(run('templates/demo.json').code).toBe(2);
		expect(run('templates/demo.json', 'static/demo-pilot.csv', '--kind').stderr).toMatch(/--kind needs a value/);
		expect(run('templates/demo.json', 'static/demo-pilot.csv', '--colour').stderr).toMatch(/unknown option --colour/);
		expect(existsSync(join(dir, 'nope.csv'))).toBe(false);
	});

	it('--zprime-feature uses one feature; an unknown one is an input error', () => {
		const r = run('templates/demo.json', 'static/demo-pilot.csv', '--json', '--zprime-feature=membrane_mean_intensity');
		expect(r.code).toBe(0);
		expect(JSON.parse(r.stdout).zPrimeMethod).toMatch(/membrane_mean_intensity/);
		const bad = run('templates/demo.json', 'static/demo-pilot.csv', '--zprime-feature=nope');
		expect(bad.code).toBe(2);
		expect(bad.stderr).toMatch(/demo-pilot\.csv:1: column "nope": expected a feature column of the file for Z′/);
	});
});
