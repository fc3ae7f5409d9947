import { observationRules } from '../plan/constraints';
import { validatePlan } from '../plan/validatePlan';
import type { Plan } from '../plan/types';
import type { PilotEstimates } from './types';

/** Significant digits kept for values written into the plan. */
const DIGITS = 3;
const round = (v: number) => Number(v.toPrecision(DIGITS));
const clampTo = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/**
 * A new plan carrying the pilot's measurements (the input is not modified):
 * - `observation.replicateNoise`, `measurementNoise`, `plateEffect` take the estimates that
 *   exist (null estimates keep the plan's values), rounded to 3 significant digits and kept
 *   within the plan's bounds;
 * - each measured reagent's effect is rescaled so its norm equals the measured effect, keeping
 *   the stated sign and the split between targets (the pilot measures a norm, not the split);
 *   scale reagents and unmeasured reagents keep their values;
 * - `sectionNotes.pilot` gets a summary, the pilot's notes and warnings, and a note when the
 *   signal dimension differs from the number of factors; existing text is kept above it.
 *   `notes` and everything else stay as they were.
 */
export function applyPilot(plan: Plan, estimates: PilotEstimates): Plan {
	const next = JSON.parse(JSON.stringify(plan)) as Plan;
	const obs = next.observation;
	const changes: string[] = [];
	const setObs = (key: 'replicateNoise' | 'measurementNoise' | 'plateEffect', value: number | null, label: string) => {
		if (value === null || !Number.isFinite(value)) return;
		const rule = observationRules[key];
		const v = round(clampTo(value, rule.min ?? 0, rule.max ?? Infinity));
		changes.push(`${label} ${obs[key]} → ${v}`);
		obs[key] = v;
	};
	setObs('replicateNoise', estimates.replicateNoise, 'replicate noise (factor SD units)');
	setObs('measurementNoise', estimates.measurementNoise, 'measurement noise (feature units)');
	setObs('plateEffect', estimates.plateEffect, 'plate effect (feature units)');

	const effects: string[] = [];
	for (const est of estimates.reagents) {
		const r = next.reagents.find((x) => x.id === est.id);
		if (!r || est.effect === null || !Number.isFinite(est.effect) || r.kind === 'scale' || !(est.stated > 0)) continue;
		const ratio = est.effect / est.stated;
		const before = JSON.stringify(r.effect);
		if (typeof r.effect === 'number') r.effect = round(clampTo(r.effect * ratio, -20, 20));
		else r.effect = Object.fromEntries(Object.entries(r.effect).map(([f, v]) => [f, round(clampTo(v * ratio, -20, 20))]));
		effects.push(`${r.id} ${before} → ${JSON.stringify(r.effect)}`);
	}

	const d = plan.factors.length;
	const lines = [
		`Pilot applied: ${estimates.wells} wells (${estimates.kind === 'cells' ? `${estimates.rows} cells, ` : ''}${estimates.plates.length} plate${estimates.plates.length === 1 ? '' : 's'}, ${estimates.features.kept} features).`,
		changes.length ? `Changed: ${changes.join('; ')}.` : 'Noise and plate effect unchanged (not estimable from this pilot).',
		effects.length ? `Effects: ${effects.join('; ')}.` : 'No reagent effect changed.',
		`Signal dimension ${estimates.signalDimension} (plan: ${d} factor${d === 1 ? '' : 's'})${estimates.signalDimension !== d ? ` — check the factor count: the pilot shows ${estimates.signalDimension > d ? 'more' : 'fewer'} independent effect directions than the plan has factors.` : '.'}`,
		`Z′ ${estimates.zPrime === null ? 'not computed' : estimates.zPrime.toFixed(2)}.`,
		...estimates.notes.map((t) => `- ${t}`),
		...estimates.warnings.map((t) => `- Caution: ${t}`),
		'- The re-planned values hold only under the plan model; have the re-sized design reviewed before ordering.'
	];
	const text = lines.join('\n');
	const previous = plan.sectionNotes?.pilot;
	next.sectionNotes = { ...(plan.sectionNotes ?? {}), pilot: previous && previous.trim() !== '' ? `${previous}\n\n${text}` : text };
	const issues = validatePlan(next);
	if (issues.length) throw new Error(`applyPilot produced an invalid plan: ${issues[0].path}: ${issues[0].message}`);
	return next;
}
