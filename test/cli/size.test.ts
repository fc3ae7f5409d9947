import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { smallPlan } from '../size/smallPlan';
import { createSizePool } from '../../src/cli/sizePool';
import { directEvaluator, sizePlan } from '../../src/lib/core/size';

let dir: string;
beforeAll(() => {
	dir = mkdtempSync(join(tmpdir(), 'identiplate-size-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(...args: string[]) {
	const res = spawnSync(process.execPath, ['bin/identiplate.mjs', 'size', ...args], { encoding: 'utf8', timeout: 120_000 });
	return { code: res.status, stdout: res.stdout, stderr: res.stderr };
}

function planFile(name: string, plan: unknown) {
	const file = join(dir, name);
	writeFileSync(file, JSON.stringify(plan));
	return file;
}

describe('identiplate size', () => {
	const small = () => JSON.parse(JSON.stringify(smallPlan({ goalMcc: 0.85 })));

	it('--json prints the DESIGN.md shape plus budgetNeeded and exits 0; any thread count gives the same answer', () => {
		const file = planFile('small.json', small());
		const one = run(file, '--json', '--seed', '2', '--threads', '1');
		expect(one.stderr).toBe('');
		expect(one.code).toBe(0);
		const out = JSON.parse(one.stdout);
		for (const key of ['feasible', 'design', 'assurance', 'frontier', 'budgetNeeded']) expect(out).toHaveProperty(key);
		expect(out.feasible).toBe(true);
		expect(out.budgetNeeded).toBeNull();
		expect(Object.keys(out.design)).toEqual(expect.arrayContaining(['reagents', 'replicates', 'controlsPerPlate', 'contexts', 'plates', 'wells', 'cost']));
		expect(out.design.replicates).toBeGreaterThanOrEqual(2);
		expect(out.assurance.lo).toBeLessThanOrEqual(out.assurance.p);
		expect(out.assurance.hi).toBeGreaterThanOrEqual(out.assurance.p);
		expect(out.assurance.p).toBeGreaterThanOrEqual(0.8);
		for (const f of out.frontier) {
			expect(typeof f.cost).toBe('number');
			expect(typeof f.assurance).toBe('number');
		}
		expect(out.seed).toBe(2);
		expect(out.tTest.length).toBe(out.design.reagents.length);
		expect(out.cautions.join(' ')).toMatch(/pilot/);
		const two = run(file, '--json', '--seed', '2', '--threads', '2');
		expect(two.code).toBe(0);
		expect(JSON.parse(two.stdout)).toEqual(out);
	});

	it('a tiny budget: feasible false, the best design it buys, and budgetNeeded', () => {
		const p = small();
		// 155 EUR buys the three single-target reagents at 2 replicates (149 EUR) and little more
		p.budget.total = 155;
		const { code, stdout } = run(planFile('tight.json', p), '--json', '--threads', '1');
		expect(code).toBe(0);
		const out = JSON.parse(stdout);
		expect(out.feasible).toBe(false);
		expect(out.design.cost).toBeLessThanOrEqual(155);
		expect(out.assurance.p).toBeLessThan(0.8);
		expect(out.budgetNeeded).toBeGreaterThan(155);
	});

	it('block-only reagents: infeasible with budgetNeeded null and the reason', () => {
		const p = small();
		p.reagents = [
			{ ...p.reagents[0], id: 'p12', targets: ['f1', 'f2'] },
			{ ...p.reagents[0], id: 'p23', targets: ['f2', 'f3'] },
			{ ...p.reagents[0], id: 'p13', targets: ['f1', 'f3'] }
		];
		const { code, stdout } = run(planFile('blocks.json', p), '--json', '--threads', '1');
		expect(code).toBe(0);
		const out = JSON.parse(stdout);
		expect(out.feasible).toBe(false);
		expect(out.budgetNeeded).toBeNull();
		expect(out.reason).toMatch(/f1, f2, f3 individually/);
		expect(out.unreachable.map((u: { id: string }) => u.id)).toEqual(['f1', 'f2', 'f3']);
	});

	it('text output names the recommended design, the frontier, the curve and the cautions', () => {
		const { code, stdout } = run(planFile('small-text.json', small()), '--threads', '1');
		expect(code).toBe(0);
		expect(stdout).toMatch(/^FEASIBLE: /m);
		expect(stdout).toMatch(/recommended design:/);
		expect(stdout).toMatch(/frontier \(cost against assurance\):/);
		expect(stdout).toMatch(/MCC against replicates/);
		expect(stdout).toMatch(/two-sided t-test/);
		expect(stdout).toMatch(/statistician/);
	});

	it('bad input exits 2 naming the file and the field path', () => {
		const p = small();
		p.goal.assurance = 1.5;
		const { code, stderr, stdout } = run(planFile('bad.json', p), '--json');
		expect(code).toBe(2);
		expect(stdout).toBe('');
		expect(stderr).toMatch(/bad\.json/);
		expect(stderr).toMatch(/goal\.assurance/);
	});

	it('bad options exit 2', () => {
		const file = planFile('ok.json', small());
		expect(run(file, '--seed', 'x').code).toBe(2);
		expect(run(file, '--threads', '0').code).toBe(2);
		const unknown = run(file, '--reps', '5');
		expect(unknown.code).toBe(2);
		expect(unknown.stderr).toMatch(/unknown option --reps/);
		expect(run().code).toBe(2);
		expect(run(join(dir, 'missing.json')).stderr).toMatch(/missing\.json: cannot read/);
	});
});

describe('size worker pool', () => {
	it('worker threads give exactly the single-thread result (every batch forced onto the workers)', async () => {
		const plan = smallPlan({ goalMcc: 0.85 });
		const opts = { seed: 5, maxReplicates: 8, maxSets: 1, controls: [8], maxReps: 50 };
		const pool = await createSizePool(plan, 2, { minParallelMs: 0 });
		try {
			const parallel = await sizePlan(plan, opts, pool.evaluate);
			const single = await sizePlan(plan, opts, directEvaluator(plan));
			expect(parallel).toEqual(single);
		} finally {
			await pool.close();
		}
	});
});
