import type { Design } from '../plan/types';
import { designCost } from '../size/costModel';
import type { EvalContext } from './evalContext';
import { capitalise } from './fixes';
import { listText, money, reagentLabel } from './labels';
import { SOURCES } from './sources';
import type { Check, Fix } from './types';

/** Fewest controls per plate before a warning (common practice: 8–16 per plate). */
export const MIN_CONTROLS_PER_PLATE = 8;

/**
 * Practicalities of the design: replicates, controls, stock, plate capacity, budget.
 * `redundant` lists design reagents (most expensive first) whose removal worsens no factor's
 * verdict; the budget fix suggests dropping the first.
 */
export function practicalChecks(ctx: EvalContext, redundant: () => string[]): Check[] {
	const { plan, design } = ctx;
	const checks: Check[] = [];
	const cost = designCost(plan, design);

	checks.push({
		id: 'practical.replicates',
		route: 'practical',
		status: design.replicates >= 2 ? 'pass' : 'fail',
		message:
			design.replicates >= 2
				? `${design.replicates} replicate wells per reagent and context allow the well-to-well noise to be estimated.`
				: 'One well per reagent and context leaves the well-to-well noise unestimated: a single failed well goes unnoticed.',
		source: SOURCES.replicates,
		fix: design.replicates >= 2 ? null : { text: 'Use at least 2 replicate wells per reagent and context.', cost: designCost(plan, { ...design, replicates: 2 }).total - cost.total }
	});

	const c = design.controlsPerPlate;
	checks.push({
		id: 'practical.controls',
		route: 'practical',
		status: c === 0 ? 'fail' : c < MIN_CONTROLS_PER_PLATE ? 'warn' : 'pass',
		message:
			c === 0
				? 'No control wells: plates cannot be normalised and reagent effects have no baseline on each plate.'
				: c < MIN_CONTROLS_PER_PLATE
					? `${c} control well${c === 1 ? '' : 's'} per plate give a noisy per-plate baseline; ${MIN_CONTROLS_PER_PLATE}–16 are common.`
					: `${c} control wells on every plate give each plate its own baseline.`,
		source: SOURCES.controls,
		fix: c < MIN_CONTROLS_PER_PLATE ? { text: `Put at least ${MIN_CONTROLS_PER_PLATE} negative-control wells on every plate.` } : null
	});

	const nContexts = Math.max(1, design.contexts.length);
	const over = cost.overStock;
	checks.push({
		id: 'practical.stock',
		route: 'practical',
		status: over.length ? 'fail' : 'pass',
		message: over.length
			? `Not enough stock: ${listText(over.map((o) => `${reagentLabel(ctx.used.find((r) => r.id === o.id)!)} needs ${o.wells} wells but stock covers ${o.maxWells}`))}.`
			: 'Every reagent has stock for its wells.',
		source: SOURCES.stock,
		fix: over.length ? stockFix(over, nContexts) : null
	});

	checks.push({
		id: 'practical.capacity',
		route: 'practical',
		status: cost.problem ? 'fail' : 'pass',
		message: cost.problem
			? capitalise(cost.problem) + '.'
			: `The design fits on ${cost.plates} plate${cost.plates === 1 ? '' : 's'} of ${plan.budget.plateFormat} wells (${cost.usableWellsPerPlate} treatment wells each).`,
		source: SOURCES.capacity,
		fix: cost.problem ? { text: 'Use fewer controls per plate, keep the edge wells, or choose a larger plate format.' } : null
	});

	const within = Number.isFinite(cost.total) && cost.total <= plan.budget.total;
	checks.push({
		id: 'practical.budget',
		route: 'practical',
		status: within ? 'pass' : 'fail',
		message: !Number.isFinite(cost.total)
			? 'The design cannot be costed because its treatments fit on no plate.'
			: within
				? `The design costs ${money(plan, cost.total)} of the ${money(plan, plan.budget.total)} budget.`
				: `The design costs ${money(plan, cost.total)}, over the budget of ${money(plan, plan.budget.total)} by ${money(plan, cost.total - plan.budget.total)}.`,
		source: SOURCES.budget,
		fix: within || !Number.isFinite(cost.total) ? null : budgetFix(ctx, cost.total, redundant)
	});
	return checks;
}

function stockFix(over: { id: string; wells: number; maxWells: number }[], nContexts: number): Fix {
	const maxReplicates = Math.min(...over.map((o) => Math.floor(o.maxWells / nContexts)));
	return {
		text:
			maxReplicates >= 2
				? `Buy more stock of ${listText(over.map((o) => o.id))}, or use at most ${maxReplicates} replicate wells per reagent and context.`
				: `Buy more stock of ${listText(over.map((o) => o.id))}, or leave ${over.length === 1 ? 'it' : 'them'} out of the design.`
	};
}

function budgetFix(ctx: EvalContext, total: number, redundant: () => string[]): Fix {
	const { plan, design } = ctx;
	const parts: string[] = [];
	let first: Fix | null = null;
	const drop = redundant()[0];
	if (drop) {
		const smaller: Design = { ...design, reagents: design.reagents.filter((id) => id !== drop) };
		const after = designCost(plan, smaller).total;
		const r = ctx.used.find((x) => x.id === drop)!;
		parts.push(`drop ${reagentLabel(r)}, which no verdict needs (the design then costs ${money(plan, after)})`);
		first = { text: '', reagentId: drop, cost: after - total };
	}
	for (let reps = design.replicates - 1; reps >= 2; reps--) {
		const after = designCost(plan, { ...design, replicates: reps }).total;
		if (after <= plan.budget.total) {
			parts.push(`use ${reps} replicate wells instead of ${design.replicates} (the design then costs ${money(plan, after)})`);
			first ??= { text: '', cost: after - total };
			break;
		}
	}
	if (parts.length === 0) return { text: `Raise the budget to ${money(plan, total)} or drop reagents the verdicts do not need; fewer replicates alone do not fit the budget.` };
	return { ...first!, text: capitalise(parts.join(', or ')) + '.' };
}
