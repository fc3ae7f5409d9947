/** One problem found in a plan file: where (JSON path) and what was expected. */
export interface PlanIssue {
	path: string;
	message: string;
}

/**
 * A caller mistake in plan input: thrown at once by `parsePlan`. `issues` lists every problem
 * found; `message` starts with the first one ("reagents[3].targets[1]: unknown factor \"f9\"").
 */
export class PlanError extends Error {
	readonly issues: PlanIssue[];
	constructor(issues: PlanIssue[]) {
		const first = issues[0];
		const more = issues.length > 1 ? ` (and ${issues.length - 1} more problem${issues.length > 2 ? 's' : ''})` : '';
		super(first ? `${first.path || '(plan)'}: ${first.message}${more}` : 'invalid plan');
		this.name = 'PlanError';
		this.issues = issues;
	}
}
