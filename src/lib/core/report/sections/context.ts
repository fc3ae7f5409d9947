import type { Plan } from '../../plan/types';
import { formatMoney } from '../formatNumber';
import type { ReportBlock, ReportInputs, ReportSection, ReportSectionId } from '../types';

/** Section titles, in report order. */
export const SECTION_TITLES: Record<ReportSectionId, string> = {
	question: 'Question and notes',
	inputs: 'Inputs and assumptions',
	verdicts: 'Can the factors be recovered?',
	simulation: 'Simulated recovery',
	sizing: 'Sizing: cost against assurance',
	design: 'Design and cost',
	layout: 'Plate layout',
	pilot: 'Pilot findings',
	revisions: 'Revision history',
	cautions: 'Cautions',
	reproducibility: 'Reproducibility'
};

export const SECTION_ORDER = Object.keys(SECTION_TITLES) as ReportSectionId[];

/** Lookups every section builder uses. */
export interface ReportContext {
	inputs: ReportInputs;
	plan: Plan;
	factorName(id: string): string;
	reagentName(id: string): string;
	contextName(id: string): string;
	/** "Name (id)" for a factor, reagent or context; the id alone when the name is empty. */
	factorLabel(id: string): string;
	reagentLabel(id: string): string;
	contextLabel(id: string): string;
	money(x: number | null | undefined): string;
}

export function reportContext(inputs: ReportInputs): ReportContext {
	const plan = inputs.plan;
	const names = (list: { id: string; name: string }[]) => new Map(list.map((x) => [x.id, x.name]));
	const f = names(plan.factors);
	const r = names(plan.reagents);
	const c = names(plan.contexts);
	const label = (m: Map<string, string>) => (id: string) => {
		const n = m.get(id);
		return n && n !== id ? `${n} (${id})` : id;
	};
	return {
		inputs,
		plan,
		factorName: (id) => f.get(id) || id,
		reagentName: (id) => r.get(id) || id,
		contextName: (id) => c.get(id) || id,
		factorLabel: label(f),
		reagentLabel: label(r),
		contextLabel: label(c),
		money: (x) => formatMoney(x, plan.budget.currency)
	};
}

/** A section that has no results yet: says so plainly, with why (when known) and how to get them. */
export function emptySection(ctx: ReportContext, id: ReportSectionId, what: string, how: string, extra: ReportBlock[] = []): ReportSection {
	const why = ctx.inputs.unavailable?.[id];
	const items = [`No results yet: ${what}`];
	if (why) items.push(`Why: ${why}`);
	items.push(how);
	return { id, title: SECTION_TITLES[id], hasResults: false, blocks: [{ kind: 'callout', tone: 'empty', title: 'No results yet', items }, ...extra] };
}

/** A list joined in words: "a", "a and b", "a, b and c". */
export function joinWords(items: string[]): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

function sameDesign(a: { reagents: string[]; replicates: number; controlsPerPlate: number; contexts: string[] }, b: { reagents: string[]; replicates: number; controlsPerPlate: number; contexts: string[] }): boolean {
	const set = (x: string[]) => [...x].sort().join('\u0000');
	return set(a.reagents) === set(b.reagents) && set(a.contexts) === set(b.contexts) && a.replicates === b.replicates && a.controlsPerPlate === b.controlsPerPlate;
}

/**
 * Which design a result was computed for, in words: the design fixed in the plan ("adopted"),
 * the sizing's recommendation, the default design the checks evaluate, or another one.
 */
export function designRole(ctx: ReportContext, d: { reagents: string[]; replicates: number; controlsPerPlate: number; contexts: string[] }): string {
	const { plan, inputs } = ctx;
	if (plan.design && sameDesign(plan.design, d)) return 'the adopted design';
	if (inputs.sizing?.design && sameDesign(inputs.sizing.design, d)) return inputs.sizing.feasible ? 'the recommended design' : 'the best design the budget buys';
	if (!plan.design && sameDesign(inputs.check.design, d)) return 'the default design (every reagent and context, 4 replicates)';
	return 'a design';
}
