import type { Plan } from '../plan/types';

/**
 * A legend group label per reagent: the names of its target factors joined with " + ", or
 * "targets unknown (about k)" when only the expected number of targets is known. Reagents with
 * the same targets share a group (and a hue in plate maps).
 */
export function reagentGroupsFromPlan(plan: Plan): Record<string, string> {
	const factorName = new Map(plan.factors.map((f) => [f.id, f.name]));
	const out: Record<string, string> = {};
	for (const r of plan.reagents)
		out[r.id] = r.targets
			? r.targets.map((t) => factorName.get(t) ?? t).join(' + ') || 'no targets'
			: `targets unknown (about ${r.expectedTargets ?? '?'})`;
	return out;
}
