/** Invented small plans for the sizing tests (no real reagents, labs or data). */
import { parsePlan, type Plan } from '../../src/lib/core/plan';

export interface SmallPlanOptions {
	replicateNoise?: number;
	goalMcc?: number;
	goalAssurance?: number;
	budget?: number;
	reagents?: { id: string; targets: string[] | null; effect?: number; costPerWell?: number; maxWells?: number; kind?: 'shift' | 'clamp' | 'scale'; expectedTargets?: number }[];
	mixing?: 'linear' | 'nonlinear';
	nonlinearity?: number;
	plateFormat?: 96 | 384;
	controlsPerPlate?: number;
}

/** Three Laplace factors, a 96-well plate, one single-target reagent per factor plus two pairs. */
export function smallPlan(o: SmallPlanOptions = {}): Plan {
	const reagents = o.reagents ?? [
		{ id: 'a1', targets: ['f1'], effect: 1.2, costPerWell: 2 },
		{ id: 'a2', targets: ['f2'], effect: 1.0, costPerWell: 1.5 },
		{ id: 'a3', targets: ['f3'], effect: 1.1, costPerWell: 1 },
		{ id: 'p12', targets: ['f1', 'f2'], effect: 0.9, costPerWell: 0.8 },
		{ id: 'p23', targets: ['f2', 'f3'], effect: 0.9, costPerWell: 0.9 }
	];
	return parsePlan({
		format: 'identiplate-plan',
		version: 1,
		title: 'Small sizing test plan (invented)',
		notes: '',
		factors: [
			{ id: 'f1', name: 'Factor one', shape: 'laplace' },
			{ id: 'f2', name: 'Factor two', shape: 'laplace' },
			{ id: 'f3', name: 'Factor three', shape: 'laplace' }
		],
		reagents: reagents.map((r) => ({
			id: r.id,
			name: `Test reagent ${r.id}`,
			targets: r.targets,
			...(r.expectedTargets !== undefined ? { expectedTargets: r.expectedTargets } : {}),
			kind: r.kind ?? 'shift',
			effect: r.effect ?? 1,
			effectCv: 0.2,
			efficacy: 0.9,
			costPerWell: r.costPerWell ?? 1,
			...(r.maxWells !== undefined ? { maxWells: r.maxWells } : {})
		})),
		contexts: [],
		observation: {
			features: 12,
			mixing: o.mixing ?? 'linear',
			nonlinearity: o.nonlinearity ?? 0,
			cellsPerWell: 0,
			replicateNoise: o.replicateNoise ?? 0.5,
			measurementNoise: 0.2,
			plateEffect: 0.2
		},
		budget: {
			total: o.budget ?? 5000,
			currency: 'EUR',
			plateFormat: o.plateFormat ?? 96,
			plateCost: 40,
			fixedCost: 100,
			excludeEdgeWells: false,
			controlsPerPlate: o.controlsPerPlate ?? 8
		},
		goal: { mcc: o.goalMcc ?? 0.9, assurance: o.goalAssurance ?? 0.8, route: 'targeted' },
		design: null
	});
}
