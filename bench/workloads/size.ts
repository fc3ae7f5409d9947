/**
 * `size` workload of BENCHMARK.md: sizing of templates/demo.json with its default goal, seed 1,
 * on one thread (sizePlanSync with the simulation engine). One replicate = seconds to the
 * recommended design, including the frontier, the curve and the per-reagent t-test check.
 */
import { readFileSync } from 'node:fs';
import type { Workload } from '../workload';
import { parsePlan, type Plan } from '../../src/lib/core/plan';
import { sizePlanSync } from '../../src/lib/core/size';

let plan: Plan;

export const workload: Workload = {
	reps: 3,
	setup() {
		plan = parsePlan(readFileSync(new URL('../../templates/demo.json', import.meta.url), 'utf8'));
	},
	run() {
		const result = sizePlanSync(plan, { seed: 1 });
		if (!result.design) throw new Error(`size bench: no design recommended (${result.reason})`);
	}
};
