/**
 * `npm run bench [-- --json] [-- --only NAME]`: the workloads of BENCHMARK.md, single thread,
 * one warm-up replicate each. With --json prints one JSON object
 * `{ "<name>": { reps, seconds, reps_per_s, mcc_mean? } }`.
 */
import type { Workload } from './workload';

const workloads: Record<string, () => Promise<{ workload: Workload }>> = {
	targeted: () => import('./workloads/targeted'),
	ica: () => import('./workloads/ica'),
	checks: () => import('./workloads/checks'),
	layout: () => import('./workloads/layout'),
	size: () => import('./workloads/size')
};

const argv = process.argv.slice(2);
const json = argv.includes('--json');
const onlyIdx = argv.indexOf('--only');
const only = onlyIdx >= 0 ? argv[onlyIdx + 1]?.split(',') : undefined;

const out: Record<string, { reps: number; seconds: number; reps_per_s: number; mcc_mean?: number }> = {};
for (const [name, load] of Object.entries(workloads)) {
	if (only && !only.includes(name)) continue;
	const { workload } = await load();
	await workload.setup?.();
	await workload.run(0); // warm-up replicate
	const mccs: number[] = [];
	const t0 = performance.now();
	for (let i = 1; i <= workload.reps; i++) {
		const r = await workload.run(i);
		if (typeof r === 'number') mccs.push(r);
	}
	const seconds = (performance.now() - t0) / 1000;
	out[name] = { reps: workload.reps, seconds: round(seconds, 4), reps_per_s: round(workload.reps / seconds, 2) };
	if (mccs.length) out[name].mcc_mean = round(mccs.reduce((a, b) => a + b, 0) / mccs.length, 4);
	if (!json) console.log(`${name.padEnd(10)} ${workload.reps} reps  ${seconds.toFixed(3)} s  ${out[name].reps_per_s} reps/s${out[name].mcc_mean !== undefined ? `  mcc_mean ${out[name].mcc_mean}` : ''}`);
}
if (json) console.log(JSON.stringify(out));

function round(x: number, digits: number) {
	const f = 10 ** digits;
	return Math.round(x * f) / f;
}
