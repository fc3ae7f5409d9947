/**
 * `checks` workload of BENCHMARK.md: symbolic verdicts at scale. Each replicate is an invented
 * plan with d = 40 factors and R = 400 reagents, each targeting 1–3 factors drawn uniformly
 * without replacement, effects Uniform(0.5, 2) on every target; one replicate = the full
 * `checkPlan` (structural rank by matching, exact rank modulo two primes, blocks, all routes
 * with goal.route "auto", practical checks). Plans are built in setup so only the verdicts are timed.
 */
import type { Workload } from '../workload';
import { parsePlan, type Plan } from '../../src/lib/core/plan';
import { checkPlan } from '../../src/lib/core/identify';
import { rngFor } from '../../src/lib/core/simulate/rng';

export const CHECKS_FACTORS = 40;
export const CHECKS_REAGENTS = 400;

/** Invented bench plan for replicate `rep` (seeded; no real reagents). */
export function checksBenchPlan(rep: number, d = CHECKS_FACTORS, R = CHECKS_REAGENTS): Plan {
	const rng = rngFor(2024, rep);
	const factors = Array.from({ length: d }, (_, i) => ({ id: `f${i + 1}`, name: `Factor ${i + 1}`, shape: 'laplace' }));
	const reagents = Array.from({ length: R }, (_, r) => {
		const k = 1 + rng.int(3);
		const pool = factors.map((f) => f.id);
		const targets: string[] = [];
		for (let t = 0; t < k; t++) targets.push(pool.splice(rng.int(pool.length), 1)[0]);
		const effect = Object.fromEntries(targets.map((t) => [t, 0.5 + 1.5 * rng.next()]));
		return { id: `b${r + 1}`, name: `Bench reagent ${r + 1}`, targets, kind: 'shift', effect, efficacy: 0.9, costPerWell: 1 };
	});
	return parsePlan({
		format: 'identiplate-plan',
		version: 1,
		title: 'Checks benchmark (invented)',
		notes: '',
		factors,
		reagents,
		contexts: [],
		observation: { features: 100, mixing: 'linear', nonlinearity: 0, cellsPerWell: 0, replicateNoise: 0.5, measurementNoise: 0.2, plateEffect: 0.3 },
		budget: { total: 1e7, currency: 'EUR', plateFormat: 384, plateCost: 100, fixedCost: 0, excludeEdgeWells: true, controlsPerPlate: 16 },
		goal: { mcc: 0.9, assurance: 0.8, route: 'auto' },
		design: null
	});
}

const plans: Plan[] = [];

export const workload: Workload = {
	reps: 10,
	setup() {
		for (let rep = 0; rep <= 10; rep++) plans[rep] = checksBenchPlan(rep);
	},
	run(rep) {
		const result = checkPlan(plans[rep]);
		if (result.factors.length !== CHECKS_FACTORS) throw new Error('checks workload: wrong number of verdicts');
	}
};
