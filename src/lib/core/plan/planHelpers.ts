import type { Design, Plan, Reagent } from './types';

/** Effect of `reagent` on factor `factorId` (0 when not a known target). */
export function effectOn(reagent: Reagent, factorId: string): number {
	if (!reagent.targets || !reagent.targets.includes(factorId)) return 0;
	return typeof reagent.effect === 'number' ? reagent.effect : (reagent.effect[factorId] ?? 0);
}

/** Default replicate wells per (reagent, context) when the plan fixes no design. */
export const DEFAULT_REPLICATES = 4;

/**
 * The design to evaluate: the plan's fixed design, or every reagent and context with
 * `DEFAULT_REPLICATES` replicates and the budget's controls per plate.
 */
export function effectiveDesign(plan: Plan): Design {
	if (plan.design) return plan.design;
	return {
		reagents: plan.reagents.map((r) => r.id),
		replicates: DEFAULT_REPLICATES,
		controlsPerPlate: plan.budget.controlsPerPlate,
		contexts: plan.contexts.map((c) => c.id)
	};
}

/** Cells per well used by a design (design override, else the observation setting). */
export function cellsPerWell(plan: Plan, design: Design): number {
	return design.cellsPerWell ?? plan.observation.cellsPerWell;
}

/** Fresh id not in `taken`, of the form `${prefix}${n}`. */
export function nextId(prefix: string, taken: Iterable<string>): string {
	const set = new Set(taken);
	let n = 1;
	while (set.has(`${prefix}${n}`)) n++;
	return `${prefix}${n}`;
}
