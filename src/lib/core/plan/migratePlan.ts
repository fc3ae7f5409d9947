import { PlanError } from './PlanError';
import { PLAN_VERSION } from './types';

/**
 * Upgrade steps from each older plan-file version to the next. Version 1 is the first published
 * version, so the table is empty; every future version adds the step from its predecessor here
 * (and a test with a file of the old version).
 */
const steps: Record<number, (plan: Record<string, unknown>) => Record<string, unknown>> = {};

/** Migrates a plan object of an older version to the current one; does not mutate its input. */
export function migratePlan(value: Record<string, unknown>): Record<string, unknown> {
	let plan = structuredClone(value);
	let version = plan.version as number;
	while (version < PLAN_VERSION) {
		const step = steps[version];
		if (!step) throw new PlanError([{ path: 'version', message: `plan version ${version} was never written by Identiplate; expected ${PLAN_VERSION}` }]);
		plan = step(plan);
		version = plan.version as number;
	}
	return plan;
}
