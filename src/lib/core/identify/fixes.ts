import type { Reagent } from '../plan/types';
import { addedReagentCost, type EvalContext } from './evalContext';
import { money, reagentLabel } from './labels';
import type { Fix } from './types';

/** "add kb202 (KB-202 …) at 2.40 EUR per well (38.40 EUR for its 16 wells)". */
export function addReagentText(ctx: EvalContext, r: Reagent): string {
	const wells = ctx.wellsPerReagent;
	return `add ${reagentLabel(r)} at ${money(ctx.plan, r.costPerWell)} per well (${money(ctx.plan, addedReagentCost(ctx, r))} for its ${wells} wells)`;
}

/** One suggestion per problem: a catalogue reagent when one was found, else a description of the reagent needed. */
export interface Suggestion {
	/** What the suggestion fixes, e.g. "makes Respiration (resp) individual". */
	purpose: string;
	reagent: Reagent | null;
	/** Used when no catalogue reagent fits: "add a reagent that targets … without …". */
	fallback: string;
}

/**
 * Merges per-problem suggestions into one Fix. The text names every suggestion (one catalogue
 * reagent covering several problems is named once); `reagentId` and `cost` refer to the first
 * catalogue reagent named.
 */
export function combineSuggestions(ctx: EvalContext, suggestions: Suggestion[]): Fix | null {
	if (suggestions.length === 0) return null;
	const parts: string[] = [];
	const byReagent = new Map<string, { reagent: Reagent; purposes: string[] }>();
	for (const s of suggestions) {
		if (!s.reagent) continue;
		const entry = byReagent.get(s.reagent.id);
		if (entry) entry.purposes.push(s.purpose);
		else byReagent.set(s.reagent.id, { reagent: s.reagent, purposes: [s.purpose] });
	}
	for (const { reagent, purposes } of byReagent.values()) parts.push(`${addReagentText(ctx, reagent)}: ${purposes.join('; ')}`);
	for (const s of suggestions) if (!s.reagent) parts.push(s.fallback);
	const first = byReagent.values().next().value;
	const text = capitalise(parts.join('; ')) + '.';
	return first ? { text, reagentId: first.reagent.id, cost: addedReagentCost(ctx, first.reagent) } : { text };
}

export function capitalise(s: string): string {
	return s.charAt(0).toUpperCase() + s.slice(1);
}
