/** Small invented plans for the identify tests, validated by the same schema as plan files. */
import { parsePlan, type Plan } from '../../src/lib/core/plan';

export interface ReagentSpec {
	id: string;
	targets: string[] | null;
	kind?: 'shift' | 'clamp' | 'scale';
	effect?: number | Record<string, number>;
	cost?: number;
	maxWells?: number;
}

export interface ContextSpec {
	id: string;
	mean?: Record<string, number>;
	variance?: Record<string, number>;
	level?: 'plate' | 'well';
}

export interface PlanSpec {
	/** Factor ids (shape laplace) or [id, shape] pairs. */
	factors: (string | [string, string])[];
	reagents?: ReagentSpec[];
	contexts?: ContextSpec[];
	mixing?: 'linear' | 'nonlinear';
	nonlinearity?: number;
	route?: 'auto' | 'targeted' | 'contexts' | 'observational';
	design?: { reagents: string[]; replicates?: number; controlsPerPlate?: number; contexts?: string[] } | null;
	budget?: Partial<Plan['budget']>;
}

export function makePlan(spec: PlanSpec): Plan {
	const factors = spec.factors.map((f) => (typeof f === 'string' ? { id: f, name: `Factor ${f}`, shape: 'laplace' } : { id: f[0], name: `Factor ${f[0]}`, shape: f[1] }));
	const reagents = (spec.reagents ?? []).map((r) => ({
		id: r.id,
		name: `Reagent ${r.id}`,
		targets: r.targets,
		...(r.targets === null ? { expectedTargets: 1 } : {}),
		kind: r.kind ?? 'shift',
		effect: r.effect ?? 1,
		efficacy: 0.9,
		costPerWell: r.cost ?? 1,
		...(r.maxWells !== undefined ? { maxWells: r.maxWells } : {})
	}));
	const contexts = (spec.contexts ?? []).map((c) => ({ id: c.id, name: `Context ${c.id}`, level: c.level ?? 'well', mean: c.mean ?? {}, variance: c.variance ?? {} }));
	return parsePlan({
		format: 'identiplate-plan',
		version: 1,
		title: 'Identify test plan (invented)',
		notes: '',
		factors,
		reagents,
		contexts,
		observation: { features: 30, mixing: spec.mixing ?? 'linear', nonlinearity: spec.nonlinearity ?? (spec.mixing === 'nonlinear' ? 0.5 : 0), cellsPerWell: 0, replicateNoise: 0.5, measurementNoise: 0.2, plateEffect: 0.2 },
		budget: { total: 100000, currency: 'EUR', plateFormat: 384, plateCost: 100, fixedCost: 0, excludeEdgeWells: true, controlsPerPlate: 16, ...spec.budget },
		goal: { mcc: 0.9, assurance: 0.8, route: spec.route ?? 'auto' },
		design:
			spec.design === undefined || spec.design === null
				? null
				: { reagents: spec.design.reagents, replicates: spec.design.replicates ?? 4, controlsPerPlate: spec.design.controlsPerPlate ?? 16, contexts: spec.design.contexts ?? [] }
	});
}
