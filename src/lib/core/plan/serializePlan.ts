import type { Plan } from './types';

/** Canonical plan-file text: fixed key order as in DESIGN.md, two-space indentation, trailing newline. */
export function serializePlan(plan: Plan): string {
	const ordered: Plan = {
		format: plan.format,
		version: plan.version,
		title: plan.title,
		notes: plan.notes,
		factors: plan.factors.map((f) => ({ id: f.id, name: f.name, shape: f.shape })),
		reagents: plan.reagents.map((r) => {
			const out: Record<string, unknown> = { id: r.id, name: r.name, targets: r.targets };
			if (r.expectedTargets !== undefined) out.expectedTargets = r.expectedTargets;
			out.kind = r.kind;
			out.effect = r.effect;
			if (r.effectCv !== undefined) out.effectCv = r.effectCv;
			out.efficacy = r.efficacy;
			out.costPerWell = r.costPerWell;
			if (r.maxWells !== undefined) out.maxWells = r.maxWells;
			return out as unknown as Plan['reagents'][number];
		}),
		contexts: plan.contexts.map((c) => ({ id: c.id, name: c.name, level: c.level, mean: c.mean, variance: c.variance })),
		observation: plan.observation,
		budget: plan.budget,
		goal: plan.goal,
		design: plan.design
	};
	if (plan.sectionNotes && Object.keys(plan.sectionNotes).length) ordered.sectionNotes = plan.sectionNotes;
	return JSON.stringify(ordered, null, 2) + '\n';
}
