import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

let dir: string;
beforeAll(() => {
	dir = mkdtempSync(join(tmpdir(), 'identiplate-check-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(...args: string[]) {
	const res = spawnSync(process.execPath, ['bin/identiplate.mjs', 'check', ...args], { encoding: 'utf8', timeout: 60_000 });
	return { code: res.status, stdout: res.stdout, stderr: res.stderr };
}

function planFile(name: string, mutate: (p: any) => void = () => {}) {
	const p = JSON.parse(readFileSync('templates/demo.json', 'utf8'));
	mutate(p);
	const file = join(dir, name);
	writeFileSync(file, JSON.stringify(p));
	return file;
}

describe('identiplate check', () => {
	it('--json prints { route, checks, factors } and exits 0', () => {
		const { code, stdout, stderr } = run(planFile('demo.json'), '--json');
		expect(stderr).toBe('');
		expect(code).toBe(0);
		const out = JSON.parse(stdout);
		expect(Object.keys(out).sort()).toEqual(['checks', 'factors', 'route']);
		expect(out.route).toBe('targeted');
		for (const c of out.checks) {
			expect(typeof c.id).toBe('string');
			expect(['pass', 'warn', 'fail']).toContain(c.status);
			expect(c.message.length).toBeGreaterThan(0);
			expect(c.source.length).toBeGreaterThan(0);
			if ('fix' in c) expect(typeof c.fix.text).toBe('string');
		}
		expect(out.factors.map((f: any) => f.id)).toEqual(['mem', 'resp', 'cyc', 'auto', 'cyto', 'nuc']);
		for (const f of out.factors) {
			expect(f.verdict).toBe('individual');
			expect(f.block).toEqual([f.id]);
		}
	});

	it('exits 0 when verdicts fail (the check ran), with the failing check and its fix', () => {
		const file = planFile('triangle.json', (p) => {
			p.factors = p.factors.slice(0, 3);
			p.reagents = [
				{ id: 't12', name: 'T12', targets: ['mem', 'resp'], kind: 'shift', effect: 1, efficacy: 0.9, costPerWell: 1 },
				{ id: 't23', name: 'T23', targets: ['resp', 'cyc'], kind: 'shift', effect: 1, efficacy: 0.9, costPerWell: 1 },
				{ id: 't13', name: 'T13', targets: ['mem', 'cyc'], kind: 'shift', effect: 1, efficacy: 0.9, costPerWell: 1 }
			];
		});
		const { code, stdout } = run(file, '--json');
		expect(code).toBe(0);
		const out = JSON.parse(stdout);
		expect(out.factors.map((f: any) => f.verdict)).toEqual(['block', 'block', 'block']);
		expect(out.factors[0].block).toEqual(['mem', 'resp', 'cyc']);
		const rank = out.checks.find((c: any) => c.id === 'targeted.rank');
		expect(rank.status).toBe('fail');
		expect(rank.fix.text).toMatch(/without/);
	});

	it('prints a verdict table and the checks with sources and fixes without --json', () => {
		const { code, stdout } = run(planFile('demo-text.json'));
		expect(code).toBe(0);
		expect(stdout).toMatch(/^factor\s+name\s+verdict\s+block\s+route$/m);
		expect(stdout).toMatch(/^mem\s+Membrane stress\s+individual\s+targeted$/m);
		expect(stdout).toMatch(/source: Squires, Seigal, Bhate & Uhler 2023/);
		expect(stdout).toMatch(/cautions:/);
	});

	it('exits 2 on an invalid plan, naming the file and the JSON path', () => {
		const file = planFile('bad.json', (p) => (p.reagents[3].targets = ['resp', 'f9']));
		const { code, stdout, stderr } = run(file, '--json');
		expect(code).toBe(2);
		expect(stdout).toBe('');
		expect(stderr).toContain(file);
		expect(stderr).toMatch(/reagents\[3\]\.targets\[1\]: unknown factor "f9"/);
	});

	it('exits 2 on a missing file, a missing argument and an unknown option', () => {
		const missing = run(join(dir, 'nope.json'));
		expect(missing.code).toBe(2);
		expect(missing.stderr).toMatch(/nope\.json: cannot read the plan file \(ENOENT\)/);
		expect(run().code).toBe(2);
		const flag = run(planFile('ok.json'), '--fast');
		expect(flag.code).toBe(2);
		expect(flag.stderr).toMatch(/unknown option --fast/);
	});
});
