import { serializePlan } from '../plan/serializePlan';
import { sha256Hex } from './sha256';
import { cautionsSection } from './sections/cautionsSection';
import { reportContext } from './sections/context';
import { designSection } from './sections/designSection';
import { glance } from './sections/glance';
import { inputsSection } from './sections/inputsSection';
import { layoutSection } from './sections/layoutSection';
import { pilotSection } from './sections/pilotSection';
import { questionSection } from './sections/questionSection';
import { reproducibilitySection } from './sections/reproducibilitySection';
import { revisionsSection } from './sections/revisionsSection';
import { simulationSection } from './sections/simulationSection';
import { sizingSection } from './sections/sizingSection';
import { verdictsSection } from './sections/verdictsSection';
import type { ReportInputs, ReportModel } from './types';

/** ISO 8601 date-time with a time zone (Z or ±hh:mm), as `Date.prototype.toISOString` writes it. */
const ISO_DATE_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:\d{2})$/;

function check(condition: boolean, field: string, expected: string, got: unknown) {
	if (!condition) throw new RangeError(`${field} must be ${expected}, got ${typeof got === 'string' ? JSON.stringify(got) : String(got)}`);
}

/**
 * Builds the collaborator report (DESIGN.md "Why should a collaborator believe it?") as plain
 * data: eleven sections in a fixed order — question, inputs, verdicts, simulation, sizing,
 * design, layout, pilot, revisions, cautions, reproducibility. A section without results says
 * so plainly (`hasResults: false` and an `empty` callout naming why, when `unavailable` tells).
 * Pure and synchronous (SHA-256 in plain TypeScript), so it runs in a Web Worker; it reads its
 * inputs and never modifies them. Caller mistakes (missing plan or check, a malformed date,
 * an empty version, non-integer seeds) throw a RangeError naming the field.
 */
export function buildReport(inputs: ReportInputs): ReportModel {
	check(!!inputs && typeof inputs === 'object', 'inputs', 'an object', inputs);
	check(!!inputs.plan && Array.isArray(inputs.plan.factors), 'inputs.plan', 'a plan', inputs.plan);
	check(!!inputs.check && Array.isArray(inputs.check.factors) && Array.isArray(inputs.check.checks), 'inputs.check', 'the result of checkPlan(plan)', inputs.check);
	check(typeof inputs.generatedAt === 'string' && ISO_DATE_TIME.test(inputs.generatedAt) && Number.isFinite(Date.parse(inputs.generatedAt)), 'inputs.generatedAt', 'an ISO 8601 date-time such as 2025-01-31T09:30:00.000Z', inputs.generatedAt);
	check(typeof inputs.appVersion === 'string' && inputs.appVersion.trim() !== '', 'inputs.appVersion', 'a non-empty version string', inputs.appVersion);
	check(!!inputs.seeds && typeof inputs.seeds === 'object', 'inputs.seeds', 'an object of named seeds', inputs.seeds);
	for (const [k, v] of Object.entries(inputs.seeds)) check(Number.isSafeInteger(v) && v >= 0, `inputs.seeds.${k}`, 'an integer ≥ 0', v);
	if (inputs.maxPlateMaps !== undefined) check(Number.isInteger(inputs.maxPlateMaps) && inputs.maxPlateMaps >= 0, 'inputs.maxPlateMaps', 'an integer ≥ 0', inputs.maxPlateMaps);
	if (inputs.pilotPlan) check(Array.isArray(inputs.pilotPlan.factors), 'inputs.pilotPlan', 'a plan', inputs.pilotPlan);
	(inputs.revisions ?? []).forEach((r, i) => {
		check(Number.isInteger(r?.number), `inputs.revisions[${i}].number`, 'an integer', r?.number);
		check(!!r?.plan && Array.isArray(r.plan.factors), `inputs.revisions[${i}].plan`, 'a plan', r?.plan);
	});

	const planText = inputs.planText ?? serializePlan(inputs.plan);
	const planSha256 = sha256Hex(planText);
	const ctx = reportContext(inputs);
	return {
		title: inputs.plan.title,
		generatedAt: inputs.generatedAt,
		appVersion: inputs.appVersion,
		planSha256,
		glance: glance(ctx),
		sections: [
			questionSection(ctx),
			inputsSection(ctx),
			verdictsSection(ctx),
			simulationSection(ctx),
			sizingSection(ctx),
			designSection(ctx),
			layoutSection(ctx),
			pilotSection(ctx),
			revisionsSection(ctx),
			cautionsSection(ctx),
			reproducibilitySection(ctx, planSha256)
		]
	};
}
