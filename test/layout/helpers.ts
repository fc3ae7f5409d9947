/** Shared builders for layout tests: small invented plans (no real reagents or labs). */
import { parsePlan, type Plan, type PlateFormat } from '../../src/lib/core/plan';

export interface PlanSpec {
	format: PlateFormat;
	excludeEdgeWells: boolean;
	controlsPerPlate: number;
	reagents: number;
	replicates: number;
	/** Context levels, one entry per context. */
	contexts: ('plate' | 'well')[];
	/** Stock limit per reagent (undefined = unlimited). */
	maxWells?: (number | undefined)[];
	plates?: number;
}

export function planFromSpec(spec: PlanSpec): Plan {
	const reagents = Array.from({ length: spec.reagents }, (_, i) => ({
		id: `t${i + 1}`,
		name: `Test reagent ${i + 1}`,
		targets: [`f${(i % 3) + 1}`],
		kind: 'shift',
		effect: 1,
		efficacy: 0.9,
		costPerWell: 1,
		...(spec.maxWells?.[i] !== undefined ? { maxWells: spec.maxWells[i] } : {})
	}));
	const contexts = spec.contexts.map((level, i) => ({ id: `e${i + 1}`, name: `Environment ${i + 1}`, level, mean: {}, variance: {} }));
	return parsePlan({
		format: 'identiplate-plan',
		version: 1,
		title: 'Layout test plan (invented)',
		notes: '',
		factors: [1, 2, 3].map((i) => ({ id: `f${i}`, name: `Factor ${i}`, shape: 'laplace' })),
		reagents,
		contexts,
		observation: { features: 10, mixing: 'linear', nonlinearity: 0, cellsPerWell: 0, replicateNoise: 0.5, measurementNoise: 0.2, plateEffect: 0.3 },
		budget: {
			total: 1e6,
			currency: 'EUR',
			plateFormat: spec.format,
			plateCost: 50,
			fixedCost: 0,
			excludeEdgeWells: spec.excludeEdgeWells,
			controlsPerPlate: spec.controlsPerPlate
		},
		goal: { mcc: 0.9, assurance: 0.8, route: 'targeted' },
		design: {
			reagents: reagents.map((r) => r.id),
			replicates: spec.replicates,
			controlsPerPlate: spec.controlsPerPlate,
			contexts: contexts.map((c) => c.id),
			...(spec.plates !== undefined ? { plates: spec.plates } : {})
		}
	});
}
