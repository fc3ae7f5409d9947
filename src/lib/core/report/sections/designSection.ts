import type { Design, Plan } from '../../plan/types';
import type { SizeResult } from '../../size/types';
import { designCost } from '../../size/costModel';
import { formatNumber } from '../formatNumber';
import type { ReportBlock, ReportSection } from '../types';
import { SECTION_TITLES, emptySection, type ReportContext } from './context';

/**
 * The design the report stands for: the one fixed in the plan (adopted), else the sizing's
 * recommendation (or the best the budget buys), else null.
 */
export function reportDesign(plan: Plan, sizing?: SizeResult | null): { design: Design; role: 'adopted' | 'recommended' | 'best affordable' } | null {
	if (plan.design) return { design: plan.design, role: 'adopted' };
	const s = sizing;
	if (s?.design) {
		const { reagents, replicates, controlsPerPlate, contexts, cellsPerWell, plates } = s.design;
		const design: Design = { reagents, replicates, controlsPerPlate, contexts, plates, ...(cellsPerWell !== undefined ? { cellsPerWell } : {}) };
		return { design, role: s.feasible ? 'recommended' : 'best affordable' };
	}
	return null;
}

/** The adopted or recommended design with its full cost breakdown (from the cost model). */
export function designSection(ctx: ReportContext): ReportSection {
	const chosen = reportDesign(ctx.plan, ctx.inputs.sizing);
	if (!chosen)
		return emptySection(
			ctx,
			'design',
			ctx.inputs.sizing ? 'sizing found no design that fits the budget, and the plan fixes none.' : 'the plan fixes no design and it has not been sized yet.',
			'Size the plan (notebook or `identiplate size PLAN`), or fix a design in the plan file’s `design` field.'
		);
	const { plan } = ctx;
	const { design, role } = chosen;
	const cost = designCost(plan, design);
	const blocks: ReportBlock[] = [];
	const roleWords = { adopted: 'The design fixed in the plan (adopted).', recommended: 'The cheapest design the sizing found that reaches the goal within the budget (recommended).', 'best affordable': 'The design with the highest assurance the budget buys; it does not reach the goal (see Sizing).' }[role];
	blocks.push({ kind: 'paragraph', text: roleWords });
	blocks.push({
		kind: 'facts',
		items: [
			{ label: 'Reagents', value: design.reagents.map(ctx.reagentLabel).join(', ') || 'none' },
			{ label: 'Contexts', value: design.contexts.length ? design.contexts.map(ctx.contextLabel).join(', ') : 'one baseline environment' },
			{ label: 'Replicate wells per reagent and context', value: String(design.replicates) },
			{ label: 'Controls per plate', value: String(design.controlsPerPlate) },
			{ label: 'Cells per well', value: String(design.cellsPerWell ?? plan.observation.cellsPerWell) + ((design.cellsPerWell ?? plan.observation.cellsPerWell) === 0 ? ' (well level)' : '') },
			{ label: 'Plates', value: `${cost.plates} × ${plan.budget.plateFormat}-well (${cost.usableWellsPerPlate} treatment wells usable per plate)` },
			{ label: 'Wells', value: `${cost.wells} (${cost.treatmentWells} treatment, ${cost.controlWells} control)` }
		]
	});
	const rows = cost.perReagent.map((r) => {
		const reagent = plan.reagents.find((x) => x.id === r.id);
		return [ctx.reagentLabel(r.id), String(r.wells), formatNumber(reagent?.costPerWell, 2), ctx.money(r.cost)];
	});
	rows.push([`Plates (${cost.plates} × ${ctx.money(plan.budget.plateCost)})`, '', '', ctx.money(cost.plateCost)]);
	rows.push(['Fixed costs', '', '', ctx.money(cost.fixedCost)]);
	rows.push(['Total', String(cost.treatmentWells), '', ctx.money(cost.total)]);
	blocks.push({
		kind: 'table',
		table: {
			caption: `Cost breakdown (${plan.budget.currency}); controls cost no reagent`,
			columns: [{ label: 'Item' }, { label: 'Wells', align: 'right' }, { label: 'Per well', align: 'right' }, { label: 'Cost', align: 'right' }],
			rows
		}
	});
	const left = plan.budget.total - cost.total;
	blocks.push({
		kind: 'paragraph',
		text: left >= 0 ? `The design uses ${formatNumber((cost.total / plan.budget.total) * 100, 0)} % of the budget of ${ctx.money(plan.budget.total)}; ${ctx.money(left)} remain.` : `The design costs ${ctx.money(-left)} more than the budget of ${ctx.money(plan.budget.total)}.`
	});
	if (cost.groups.length > 1)
		blocks.push({
			kind: 'table',
			table: {
				caption: 'Plate groups (plate-level contexts get plates of their own)',
				columns: [{ label: 'Plates for' }, { label: 'Treatment wells', align: 'right' }, { label: 'Plates', align: 'right' }],
				rows: cost.groups.map((g) => [g.context ? ctx.contextLabel(g.context) : 'baseline and well-level contexts', String(g.treatmentWells), String(g.plates)])
			}
		});
	const problems: string[] = [];
	if (cost.problem) problems.push(cost.problem);
	for (const o of cost.overStock) problems.push(`${ctx.reagentLabel(o.id)} needs ${o.wells} wells but its stock covers ${o.maxWells}.`);
	if (left < 0) problems.push('The design exceeds the budget.');
	if (problems.length) blocks.push({ kind: 'callout', tone: 'warning', title: 'Problems with this design', items: problems });
	return { id: 'design', title: SECTION_TITLES.design, hasResults: true, blocks };
}
