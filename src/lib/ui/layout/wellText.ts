import type { WellAssignment } from '$core/layout/types';

/**
 * One well in words, for tooltips and screen readers:
 * "C5: KB-101 detergent pulse (kb101), context Low serum (c1), replicate 2",
 * "C1: negative control", "A1: excluded edge well", "D4: unused".
 * Names fall back to the id when the plan has no name for it.
 */
export function wellText(w: WellAssignment, names: Record<string, string>, contextNames: Record<string, string>, excluded = false): string {
	const ctx = w.context ? `, context ${label(w.context, contextNames)}` : '';
	switch (w.role) {
		case 'treatment':
			return `${w.well}: ${w.reagent ? label(w.reagent, names) : 'unknown reagent'}${ctx}, replicate ${w.replicate ?? '?'}`;
		case 'control':
			return `${w.well}: negative control${ctx}`;
		default:
			return `${w.well}: ${excluded ? 'excluded edge well' : 'unused'}`;
	}
}

function label(id: string, names: Record<string, string>): string {
	const name = names[id];
	return name && name !== id ? `${name} (${id})` : id;
}
