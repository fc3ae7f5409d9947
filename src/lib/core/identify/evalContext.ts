import type { Context, Design, Factor, Plan, Reagent } from '../plan/types';
import { designCost } from '../size/costModel';
import { factorLabel } from './labels';

/** What every route needs to know about the plan and the design under evaluation. */
export interface EvalContext {
	plan: Plan;
	design: Design;
	factors: Factor[];
	factorIndex: Map<string, number>;
	/** Design reagents, in design order. */
	used: Reagent[];
	/** Catalogue reagents not in the design, cheapest per well first (ties: plan order). */
	unused: Reagent[];
	/** Design contexts, in design order. */
	contexts: Context[];
	/** Catalogue contexts not in the design, in plan order. */
	unusedContexts: Context[];
	/** Wells one more reagent would fill in this design: replicates × max(1, contexts). */
	wellsPerReagent: number;
	/** Whether the mixing is treated as nonlinear (mixing 'nonlinear' with nonlinearity > 0). */
	nonlinear: boolean;
	/** Skip the exact-rank arithmetic (structural verdicts only). */
	skipExact: boolean;
	label(factorId: string): string;
}

/**
 * Builds the evaluation context. Throws a RangeError naming the field when the design refers to
 * reagents or contexts the plan does not have (a caller mistake).
 */
export function evalContext(plan: Plan, design: Design, skipExact = false): EvalContext {
	const reagentById = new Map(plan.reagents.map((r) => [r.id, r]));
	const contextById = new Map(plan.contexts.map((c) => [c.id, c]));
	if (!design || !Array.isArray(design.reagents) || !Array.isArray(design.contexts))
		throw new RangeError('checkPlan: design must have reagents and contexts arrays');
	const used = design.reagents.map((id, i) => {
		const r = reagentById.get(id);
		if (!r) throw new RangeError(`design.reagents[${i}]: unknown reagent ${JSON.stringify(id)}`);
		return r;
	});
	const contexts = design.contexts.map((id, i) => {
		const c = contextById.get(id);
		if (!c) throw new RangeError(`design.contexts[${i}]: unknown context ${JSON.stringify(id)}`);
		return c;
	});
	if (!Number.isInteger(design.replicates) || design.replicates < 1)
		throw new RangeError(`design.replicates: expected an integer ≥ 1, got ${design.replicates}`);
	const inDesign = new Set(design.reagents);
	const order = new Map(plan.reagents.map((r, i) => [r.id, i]));
	const unused = plan.reagents
		.filter((r) => !inDesign.has(r.id))
		.sort((a, b) => a.costPerWell - b.costPerWell || order.get(a.id)! - order.get(b.id)!);
	const usedContexts = new Set(design.contexts);
	const factorIndex = new Map(plan.factors.map((f, i) => [f.id, i]));
	return {
		plan,
		design,
		factors: plan.factors,
		factorIndex,
		used,
		unused,
		contexts,
		unusedContexts: plan.contexts.filter((c) => !usedContexts.has(c.id)),
		wellsPerReagent: design.replicates * Math.max(1, contexts.length),
		nonlinear: plan.observation.mixing === 'nonlinear' && plan.observation.nonlinearity > 0,
		skipExact,
		label: (id) => factorLabel(plan.factors[factorIndex.get(id)!])
	};
}

/** Cost the design gains by adding `reagent` (its wells at the design's replicates and contexts). */
export function addedReagentCost(ctx: EvalContext, reagent: Reagent): number {
	return ctx.wellsPerReagent * reagent.costPerWell;
}

/** Change in total design cost when the design's contexts are extended by `extra`. */
export function addedContextsCost(ctx: EvalContext, extra: Context[]): number {
	const before = designCost(ctx.plan, ctx.design).total;
	const after = designCost(ctx.plan, { ...ctx.design, contexts: [...ctx.design.contexts, ...extra.map((c) => c.id)] }).total;
	return after - before;
}
