import { readFileSync } from 'node:fs';
import { parsePlan, type Plan } from '../../src/lib/core/plan';

/** A template plan (invented demo data) parsed fresh for each test. */
export function template(name: string): Plan {
	return parsePlan(readFileSync(`templates/${name}.json`, 'utf8'));
}

/** A small invented plan: d factors, one single-target shift reagent per factor plus extras. */
export function smallPlan(over: Partial<Plan['observation']> = {}, d = 3): Plan {
	const factors = Array.from({ length: d }, (_, j) => ({ id: `f${j + 1}`, name: `factor ${j + 1}`, shape: 'laplace' as const }));
	const reagents = factors.map((f, j) => ({ id: `r${j + 1}`, name: `reagent ${j + 1}`, targets: [f.id], kind: 'shift' as const, effect: 1.2, effectCv: 0.2, efficacy: 0.9, costPerWell: 1 }));
	return {
		format: 'identiplate-plan',
		version: 1,
		title: 'small test plan',
		notes: '',
		factors,
		reagents,
		contexts: [],
		observation: { features: 12, mixing: 'linear', nonlinearity: 0, cellsPerWell: 0, replicateNoise: 0.5, measurementNoise: 0.2, plateEffect: 0.3, ...over },
		budget: { total: 1e6, currency: 'EUR', plateFormat: 96, plateCost: 50, fixedCost: 0, excludeEdgeWells: false, controlsPerPlate: 8 },
		goal: { mcc: 0.9, assurance: 0.8, route: 'targeted' },
		design: null
	};
}

/** Mean and standard error. */
export function meanSe(xs: number[]): { mean: number; se: number } {
	const n = xs.length;
	const mean = xs.reduce((s, v) => s + v, 0) / n;
	const v = xs.reduce((s, x) => s + (x - mean) ** 2, 0) / (n - 1);
	return { mean, se: Math.sqrt(v / n) };
}
