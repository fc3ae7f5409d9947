import type { ReportBlock, ReportSection } from '../types';
import { SECTION_TITLES, type ReportContext } from './context';

/** Cautions every report carries, whatever the plan. */
export const STANDING_CAUTIONS = [
	'Every number in this report holds only under the stated model: linear or mildly nonlinear mixing, the stated noise levels, plate effect, effect sizes, efficacies and factor shapes. Real data can break any of these.',
	'A pilot is the test of these assumptions. Run one before ordering the full experiment and re-size the plan with its estimates.',
	'This plan does not replace a review by a statistician, who should check the design, the analysis plan and the sizing before money is spent.',
	'Follow your local biosafety rules and obtain the institutional approvals required for the reagents, cells and organisms used; this planner does not check them.'
];

/** A component caution that repeats a standing one (review, biosafety, approvals) is left out. */
function coveredByStanding(caution: string): boolean {
	return /statistician|biosafety/i.test(caution);
}

/** Distinct, non-empty items in first-seen order, leaving out those already in `seen`. */
function distinct(items: string[], seen: Set<string>): string[] {
	return items.filter((c) => {
		const key = c.trim();
		if (!key || seen.has(key)) return false;
		seen.add(key);
		return true;
	});
}

/**
 * Cautions in three groups: the standing ones and those of the situation (no pilot, unknown
 * targets, nonlinear mixing, unrecoverable factors, an infeasible sizing); then those of the
 * checks and of the sizing, without repeats (cautions repeating the standing review and biosafety
 * caution are left out of the later groups).
 */
export function cautionsSection(ctx: ReportContext): ReportSection {
	const { plan, inputs } = ctx;
	const situational: string[] = [];
	if (!inputs.pilot) situational.push('No pilot data are in this report: the noise, plate effect and effect sizes are still the plan’s guesses.');
	if (!inputs.simulation && !inputs.sizing) situational.push('No Monte Carlo result is in this report: the verdicts say whether recovery is possible at all, not how many wells it needs.');
	if (plan.observation.mixing === 'nonlinear') situational.push('The mixing is stated as nonlinear: recovery then also depends on the representation learned, and the simulation covers only mild, invertible nonlinearity.');
	if (plan.reagents.some((r) => r.targets === null)) situational.push('Some reagents have unknown targets: the symbolic checks cannot judge them, and their contribution rests on the simulation alone.');
	if (inputs.check.factors.some((f) => f.verdict !== 'individual')) situational.push('Not every factor can be recovered individually with this design (see the verdicts); the factors reported as blocks or not at all cannot be interpreted one by one.');
	if (inputs.sizing && !inputs.sizing.feasible) situational.push('The sizing found no design that reaches the goal within the budget.');
	const seen = new Set<string>();
	const blocks: ReportBlock[] = [{ kind: 'callout', tone: 'caution', title: 'Read before relying on this plan', items: distinct([...STANDING_CAUTIONS, ...situational], seen) }];
	const fromChecks = distinct(inputs.check.cautions.filter((c) => !coveredByStanding(c)), seen);
	if (fromChecks.length) blocks.push({ kind: 'callout', tone: 'caution', title: 'About the verdicts', items: fromChecks });
	const fromSizing = distinct((inputs.sizing?.cautions ?? []).filter((c) => !coveredByStanding(c)), seen);
	if (fromSizing.length) blocks.push({ kind: 'callout', tone: 'caution', title: 'About the sizing', items: fromSizing });
	return { id: 'cautions', title: SECTION_TITLES.cautions, hasResults: true, blocks };
}
