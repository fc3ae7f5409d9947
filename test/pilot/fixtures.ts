/** Invented plans and CSV helpers shared by the pilot tests. */
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { parsePlan, type Plan } from '../../src/lib/core/plan';
import { simulatePilotRows, type SimulatePilotOptions } from '../../src/lib/core/pilot';

export const demoPlan = (): Plan => parsePlan(readFileSync('templates/demo.json', 'utf8'));

/**
 * A small invented plan for recovery tests: 4 factors, 6 reagents with well-separated effect
 * norms (0.5, 0.78, 1.1, 1.56, 2.0, 2.6), efficacy 1, 30 features, 384-well plates.
 */
export function recoveryPlan(overrides: { cellsPerWell?: number } = {}): Plan {
	return parsePlan({
		format: 'identiplate-plan',
		version: 1,
		title: 'Recovery test plan (invented)',
		notes: 'Invented for tests.',
		factors: ['a', 'b', 'c', 'd'].map((id) => ({ id, name: `Factor ${id}`, shape: 'laplace' })),
		reagents: [
			{ id: 'r1', name: 'R1', targets: ['a'], kind: 'shift', effect: 0.5, efficacy: 1, costPerWell: 1 },
			{ id: 'r6', name: 'R6', targets: ['c', 'd'], kind: 'shift', effect: { c: 0.55, d: 0.55 }, efficacy: 1, costPerWell: 1 },
			{ id: 'r2', name: 'R2', targets: ['b'], kind: 'shift', effect: 1.1, efficacy: 1, costPerWell: 1 },
			{ id: 'r5', name: 'R5', targets: ['a', 'b'], kind: 'shift', effect: { a: 1.1, b: 1.1 }, efficacy: 1, costPerWell: 1 },
			{ id: 'r3', name: 'R3', targets: ['c'], kind: 'shift', effect: 2.0, efficacy: 1, costPerWell: 1 },
			{ id: 'r4', name: 'R4', targets: ['d'], kind: 'shift', effect: -2.6, efficacy: 1, costPerWell: 1 }
		],
		contexts: [],
		observation: { features: 30, mixing: 'linear', nonlinearity: 0, cellsPerWell: overrides.cellsPerWell ?? 0, replicateNoise: 0.5, measurementNoise: 0.2, plateEffect: 0.2 },
		budget: { total: 10000, currency: 'EUR', plateFormat: 384, plateCost: 100, fixedCost: 0, excludeEdgeWells: true, controlsPerPlate: 16 },
		goal: { mcc: 0.9, assurance: 0.8, route: 'targeted' },
		design: null
	});
}

export function recoveryOptions(seed: number, overrides: Partial<SimulatePilotOptions> = {}): SimulatePilotOptions {
	return {
		seed,
		reagents: ['r1', 'r2', 'r3', 'r4', 'r5', 'r6'],
		plates: 3,
		replicatesPerPlate: 8,
		controlsPerPlate: 16,
		positivesPerPlate: 0,
		cellsPerWell: 0,
		truth: { replicateNoise: 0.3, measurementNoise: 0.25, plateEffect: 0.4, positive: {} },
		...overrides
	};
}

export const toCsv = (rows: string[][]) => Papa.unparse(rows, { newline: '\n' }) + '\n';

export function simulatedCsv(plan: Plan, options: SimulatePilotOptions): string {
	return toCsv([...simulatePilotRows(plan, options)]);
}

/** A tiny valid wells CSV for the demo plan: one plate, 4 controls, 2 positives, 3 + 2 reagent wells, 3 features. */
export function tinyDemoCsv(): string {
	return [
		'plate,well,reagent,f1,f2,f3',
		'P1,B2,control,1.0,2.0,3.1',
		'P1,B3,control,1.2,2.1,2.9',
		'P1,B4,control,0.9,1.8,3.0',
		'P1,B5,control,1.1,2.2,3.3',
		'P1,C2,positive,5.0,2.0,1.0',
		'P1,C3,positive,5.4,2.3,0.8',
		'P1,D2,kb101,2.0,2.5,3.0',
		'P1,D3,kb101,2.2,2.4,3.2',
		'P1,D4,kb101,1.9,2.6,2.8',
		'P1,E2,kb201,1.0,4.0,3.0',
		'P1,E3,kb201,1.1,4.3,3.1',
		''
	].join('\n');
}
