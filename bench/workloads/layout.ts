/**
 * `layout` workload of BENCHMARK.md: 40 plates of 384 wells with the edge excluded, 16 controls
 * per plate, 60 reagents × 4 contexts × 48 replicates (48 is the replicate count that fills 40
 * plates: 292 treatment wells per plate). Two contexts are plate-level (10 plates each), two are
 * well-level and share 20 plates. One replicate = one full layout with its diagnostics.
 */
import type { Workload } from '../workload';
import { parsePlan, type Plan } from '../../src/lib/core/plan';
import { layoutDesign } from '../../src/lib/core/layout';
import { designCost } from '../../src/lib/core/size/costModel';

/** Invented bench plan (no real reagents). */
export function layoutBenchPlan(): Plan {
	const reagents = Array.from({ length: 60 }, (_, i) => ({
		id: `q${String(i + 1).padStart(2, '0')}`,
		name: `Bench reagent ${i + 1}`,
		targets: [`f${(i % 6) + 1}`],
		kind: 'shift',
		effect: 1,
		efficacy: 0.9,
		costPerWell: 1
	}));
	return parsePlan({
		format: 'identiplate-plan',
		version: 1,
		title: 'Layout benchmark (invented)',
		notes: '',
		factors: Array.from({ length: 6 }, (_, i) => ({ id: `f${i + 1}`, name: `Factor ${i + 1}`, shape: 'laplace' })),
		reagents,
		contexts: [
			{ id: 'warm', name: 'Warm incubation', level: 'plate', mean: {}, variance: {} },
			{ id: 'cool', name: 'Cool incubation', level: 'plate', mean: {}, variance: {} },
			{ id: 'dyeA', name: 'Medium A', level: 'well', mean: {}, variance: {} },
			{ id: 'dyeB', name: 'Medium B', level: 'well', mean: {}, variance: {} }
		],
		observation: { features: 20, mixing: 'linear', nonlinearity: 0, cellsPerWell: 0, replicateNoise: 0.5, measurementNoise: 0.2, plateEffect: 0.3 },
		budget: { total: 1e6, currency: 'EUR', plateFormat: 384, plateCost: 100, fixedCost: 0, excludeEdgeWells: true, controlsPerPlate: 16 },
		goal: { mcc: 0.9, assurance: 0.8, route: 'targeted' },
		design: { reagents: reagents.map((r) => r.id), replicates: 48, controlsPerPlate: 16, contexts: ['warm', 'cool', 'dyeA', 'dyeB'] }
	});
}

let plan: Plan;

export const workload: Workload = {
	reps: 3,
	setup() {
		plan = layoutBenchPlan();
		const plates = designCost(plan, plan.design!).plates;
		if (plates !== 40) throw new Error(`layout bench plan should need 40 plates, needs ${plates}`);
	},
	run(rep) {
		const layout = layoutDesign(plan, plan.design, { seed: rep + 1 });
		if (layout.plates.length !== 40) throw new Error(`expected 40 plates, got ${layout.plates.length}`);
	}
};
