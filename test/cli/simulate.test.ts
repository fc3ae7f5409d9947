import { describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { effectiveDesign } from '../../src/lib/core/plan';
import { prepareSimulation, runReplicate } from '../../src/lib/core/simulate';
import { runJobsParallel, runReplicatesParallel } from '../../src/cli/pool';
import { template } from '../simulate/helpers';

const run = promisify(execFile);

async function cli(...args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
	try {
		const { stdout, stderr } = await run('node', ['bin/identiplate.mjs', 'simulate', ...args], { maxBuffer: 1 << 24 });
		return { code: 0, stdout, stderr };
	} catch (err) {
		const e = err as { code: number; stdout: string; stderr: string };
		return { code: e.code, stdout: e.stdout, stderr: e.stderr };
	}
}

describe('worker pool', () => {
	it('gives the same replicate results as running them directly, for any thread count', async () => {
		const plan = template('demo');
		const prep = prepareSimulation(plan, effectiveDesign(plan), { seed: 6, blocks: null });
		const reps = [0, 1, 2, 3, 4, 5, 6];
		const direct = reps.map((r) => runReplicate(prep, r));
		expect(await runReplicatesParallel(prep, reps, { threads: 1 })).toEqual(direct);
		const progress: number[] = [];
		expect(await runReplicatesParallel(prep, reps, { threads: 2, onProgress: (done) => progress.push(done) })).toEqual(direct);
		expect(progress[progress.length - 1]).toBe(reps.length);
	});
	it('runs several jobs (designs) in one batch and returns them in order', async () => {
		const plan = template('demo');
		const base = effectiveDesign(plan);
		const a = prepareSimulation(plan, { ...base, replicates: 2 }, { seed: 6, blocks: null });
		const b = prepareSimulation(plan, { ...base, replicates: 6 }, { seed: 6, blocks: null });
		const out = await runJobsParallel(
			[
				{ prep: a, reps: [3, 1] },
				{ prep: b, reps: [0, 2, 4] }
			],
			{ threads: 2 }
		);
		expect(out[0]).toEqual([runReplicate(a, 3), runReplicate(a, 1)]);
		expect(out[1]).toEqual([0, 2, 4].map((r) => runReplicate(b, r)));
	});
});

describe('identiplate simulate', () => {
	it('prints the JSON shape of DESIGN.md, identical for 1 and 2 threads', async () => {
		const one = await cli('templates/demo.json', '--reps', '12', '--seed', '3', '--json', '--threads', '1');
		const two = await cli('templates/demo.json', '--reps', '12', '--seed', '3', '--json', '--threads', '2');
		expect(one.code).toBe(0);
		expect(two.stdout).toBe(one.stdout);
		const out = JSON.parse(one.stdout);
		expect(Object.keys(out)).toEqual(expect.arrayContaining(['reps', 'seed', 'mcc', 'assurance', 'factors', 'estimator', 'route']));
		expect(out.reps).toBe(12);
		expect(out.seed).toBe(3);
		expect(Object.keys(out.mcc).sort()).toEqual(['mean', 'median', 'p10', 'p90']);
		expect(Object.keys(out.assurance).sort()).toEqual(['hi', 'lo', 'p']);
		expect(out.factors.map((f: { id: string }) => f.id)).toEqual(['mem', 'resp', 'cyc', 'auto', 'cyto', 'nuc']);
		expect(out.estimator).toBe('support');
		expect(out.route).toBe('targeted');
		expect(one.stderr).toBe(''); // no progress with --json
	});
	it('prints text with cautions and progress on stderr without --json', async () => {
		const r = await cli('templates/demo.json', '--reps', '4', '--threads', '1');
		expect(r.code).toBe(0);
		expect(r.stdout).toMatch(/recovery score \(MCC\): mean/);
		expect(r.stdout).toMatch(/statistician/);
		expect(r.stderr).toMatch(/simulating: 4\/4 replicates/);
	});
	it('rejects bad input with exit code 2 and a message naming the option', async () => {
		const bad = await cli('templates/demo.json', '--reps', '0');
		expect(bad.code).toBe(2);
		expect(bad.stderr).toMatch(/--reps must be an integer in \[1, 1000000\], got "0"/);
		const est = await cli('templates/demo.json', '--estimator', 'magic');
		expect(est.code).toBe(2);
		expect(est.stderr).toMatch(/--estimator must be one of auto, support/);
		const missing = await cli('no-such-plan.json');
		expect(missing.code).toBe(2);
		expect(missing.stderr).toMatch(/no-such-plan.json: cannot read the plan file/);
	});
});
