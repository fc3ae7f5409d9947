import type { Design, Plan, PlateFormat } from '../plan/types';

/** Rows × columns of the ANSI/SLAS 4-2004 plate formats. */
export const PLATE_GEOMETRY: Record<PlateFormat, { rows: number; columns: number }> = {
	96: { rows: 8, columns: 12 },
	384: { rows: 16, columns: 24 },
	1536: { rows: 32, columns: 48 }
};

/** Wells in the outer ring of a plate (first/last row and column). */
export function edgeWellCount(format: PlateFormat): number {
	const { rows, columns } = PLATE_GEOMETRY[format];
	return 2 * columns + 2 * (rows - 2);
}

/** Wells of one plate available for treatments after edge exclusion and controls (may be ≤ 0). */
export function usableWellsPerPlate(format: PlateFormat, excludeEdgeWells: boolean, controlsPerPlate: number): number {
	return format - (excludeEdgeWells ? edgeWellCount(format) : 0) - controlsPerPlate;
}

/**
 * The most replicate wells of one (reagent, context) group that one plate can hold when they
 * must sit on distinct rows and distinct columns: min(usable rows, usable columns).
 */
export function maxReplicatesPerPlate(format: PlateFormat, excludeEdgeWells: boolean): number {
	const { rows, columns } = PLATE_GEOMETRY[format];
	const trim = excludeEdgeWells ? 2 : 0;
	return Math.min(rows - trim, columns - trim);
}

export interface PlateGroup {
	/** Context id for a plate-level context; null for the shared plates (baseline and well-level contexts). */
	context: string | null;
	treatmentWells: number;
	plates: number;
}

export interface DesignCost {
	usableWellsPerPlate: number;
	groups: PlateGroup[];
	plates: number;
	treatmentWells: number;
	controlWells: number;
	/** treatment + control wells. */
	wells: number;
	perReagent: { id: string; wells: number; cost: number }[];
	plateCost: number;
	reagentCost: number;
	fixedCost: number;
	total: number;
	/** Reagents whose wells exceed their stock limit. */
	overStock: { id: string; wells: number; maxWells: number }[];
	/** Set when no treatment fits a plate (controls and excluded edge fill it). */
	problem: string | null;
}

/**
 * Cost of a design (DESIGN.md "Sizing"): plates × plate cost + wells × reagent cost per well
 * + fixed cost. Each (reagent, context) gets `replicates` wells. Plate-level contexts get plates
 * of their own; baseline and well-level contexts share plates. Controls cost no reagent.
 * A group needs at least ceil(replicates / maxReplicatesPerPlate) plates, since replicates of one
 * (reagent, context) on the same plate go on distinct rows and columns.
 * A design that fixes `plates` gets at least that many (more when its wells do not fit).
 */
export function designCost(plan: Plan, design: Design): DesignCost {
	const { budget } = plan;
	const usable = usableWellsPerPlate(budget.plateFormat, budget.excludeEdgeWells, design.controlsPerPlate);
	const reagentById = new Map(plan.reagents.map((r) => [r.id, r]));
	const contextById = new Map(plan.contexts.map((c) => [c.id, c]));
	const contexts = design.contexts.map((id) => contextById.get(id)).filter((c) => c !== undefined);
	const nContexts = Math.max(1, contexts.length);
	const perReagent = design.reagents.map((id) => {
		const r = reagentById.get(id);
		if (!r) throw new RangeError(`design.reagents: unknown reagent "${id}"`);
		const wells = design.replicates * nContexts;
		return { id, wells, cost: wells * r.costPerWell };
	});
	const wellsPerContext = design.replicates * design.reagents.length;
	const groups: PlateGroup[] = [];
	const plateLevel = contexts.filter((c) => c.level === 'plate');
	const sharedContexts = contexts.length === 0 ? 1 : contexts.length - plateLevel.length;
	// A (reagent, context) group's replicates on one plate sit on distinct rows and columns
	// (layout rule), so one plate holds at most min(usable rows, usable columns) of them.
	const perPlateCap = maxReplicatesPerPlate(budget.plateFormat, budget.excludeEdgeWells);
	const minPlates = design.replicates > 0 ? Math.ceil(design.replicates / perPlateCap) : 0;
	const fit = (wells: number) => (wells === 0 ? 0 : usable > 0 ? Math.max(minPlates, Math.ceil(wells / usable)) : Infinity);
	if (sharedContexts > 0) groups.push({ context: null, treatmentWells: wellsPerContext * sharedContexts, plates: Math.max(1, fit(wellsPerContext * sharedContexts)) });
	for (const c of plateLevel) groups.push({ context: c.id, treatmentWells: wellsPerContext, plates: Math.max(1, fit(wellsPerContext)) });
	let plates = groups.reduce((s, g) => s + g.plates, 0);
	if (design.plates !== undefined && design.plates > plates && Number.isFinite(plates)) {
		// Extra plates go to the shared group (or the first group) to spread replicates further.
		groups[0].plates += design.plates - plates;
		plates = design.plates;
	}
	const treatmentWells = perReagent.reduce((s, r) => s + r.wells, 0);
	const controlWells = Number.isFinite(plates) ? plates * design.controlsPerPlate : Infinity;
	const reagentCost = perReagent.reduce((s, r) => s + r.cost, 0);
	const plateCost = plates * budget.plateCost;
	const overStock = perReagent
		.map((r) => ({ id: r.id, wells: r.wells, maxWells: reagentById.get(r.id)!.maxWells }))
		.filter((r): r is { id: string; wells: number; maxWells: number } => r.maxWells !== undefined && r.wells > r.maxWells);
	const problem =
		usable > 0
			? null
			: `no treatment wells fit on a ${budget.plateFormat}-well plate with ${design.controlsPerPlate} controls${budget.excludeEdgeWells ? ' and the edge excluded' : ''}; use fewer controls per plate or a larger plate format`;
	return {
		usableWellsPerPlate: usable,
		groups,
		plates,
		treatmentWells,
		controlWells,
		wells: treatmentWells + controlWells,
		perReagent,
		plateCost,
		reagentCost,
		fixedCost: budget.fixedCost,
		total: plateCost + reagentCost + budget.fixedCost,
		overStock,
		problem
	};
}
