import type { Factor, Plan, Reagent } from '../plan/types';

/** "Respiration (resp)" — the factor's name with its id, as used in every message. */
export function factorLabel(f: Factor): string {
	return f.name === f.id ? f.id : `${f.name} (${f.id})`;
}

/** "kb202 (KB-202 complex-I blocker)". */
export function reagentLabel(r: Reagent): string {
	return r.name === r.id ? r.id : `${r.id} (${r.name})`;
}

/** Amount in the plan's currency: whole numbers without decimals, others with two. */
export function money(plan: Plan, amount: number): string {
	if (!Number.isFinite(amount)) return `an unbounded amount of ${plan.budget.currency}`;
	const text = Number.isInteger(amount) ? String(amount) : amount.toFixed(2);
	return `${text} ${plan.budget.currency}`;
}

/** "A", "A and B", "A, B and C". */
export function listText(items: string[]): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}
