/**
 * Live verdicts: re-runs the identifiability checks (and the design's cost) in a worker
 * shortly after every change of the plan, and stores a short summary as the plan's `check`
 * result (shown on the plans list).
 */
import type { CheckResult } from '$core/identify/types';
import type { EngineHandlers, EnginePool } from '$lib/workers';
import type { PlanSession } from './PlanSession.svelte';
import { TaskRunner } from './TaskRunner.svelte';

/** Delay after the last edit before the checks rerun, in milliseconds. */
export const VERDICT_DELAY_MS = 150;

/** Counts stored as the plan's `check` result. */
export interface CheckSummary {
	route: string;
	individual: number;
	block: number;
	none: number;
	failed: number;
	warned: number;
}

export function summarizeCheck(result: CheckResult): CheckSummary {
	const count = (v: string) => result.factors.filter((f) => f.verdict === v).length;
	return {
		route: String(result.route),
		individual: count('individual'),
		block: count('block'),
		none: count('none'),
		failed: result.checks.filter((c) => c.status === 'fail').length,
		warned: result.checks.filter((c) => c.status === 'warn').length
	};
}

export class VerdictRunner {
	readonly check: TaskRunner<EngineHandlers, 'check'>;
	readonly cost: TaskRunner<EngineHandlers, 'designCost'>;
	/** True between an edit and the start of the rerun. */
	waiting = $state(false);
	/** Input hash of the plan whose checks and cost have both arrived (and been stored). */
	private settledTag: string | null = $state(null);
	/** True when the verdicts and the cost shown belong to the plan as it is now. */
	readonly current: boolean = $derived.by(() => this.settledTag === this.session.inputHash && !this.waiting);

	private timer: ReturnType<typeof setTimeout> | undefined;
	private readonly unsubscribe: () => void;

	constructor(
		private readonly session: PlanSession,
		pool: EnginePool<EngineHandlers>,
		private readonly delayMs = VERDICT_DELAY_MS
	) {
		this.check = new TaskRunner(pool, 'check', 'ignore');
		this.cost = new TaskRunner(pool, 'designCost', 'ignore');
		this.unsubscribe = session.onPlanChange(() => this.schedule(this.delayMs));
		this.schedule(0);
	}

	/** Reruns after `delay` ms (restarting the wait on every call). */
	schedule(delay = this.delayMs): void {
		clearTimeout(this.timer);
		this.waiting = true;
		this.timer = setTimeout(() => void this.run(), delay);
	}

	private async run(): Promise<void> {
		this.waiting = false;
		if (this.session.issues.length) return; // the notebook shows the plan's problems instead
		const plan = this.session.snapshot();
		const tag = this.session.inputHash;
		const [outcome, cost] = await Promise.all([this.check.run({ plan }, tag), this.cost.run({ plan }, tag)]);
		if (tag !== this.session.inputHash) return; // the plan changed meanwhile; a newer run follows
		if (outcome.ok) {
			const previous = this.session.resultFor('check');
			const summary = summarizeCheck(outcome.result);
			const unchanged = previous && !previous.stale && JSON.stringify(previous.result.summary) === JSON.stringify(summary);
			if (!unchanged) this.session.setResult('check', null, { route: plan.goal.route }, summary);
		}
		if (outcome.ok && cost.ok) this.settledTag = tag;
	}

	destroy(): void {
		clearTimeout(this.timer);
		this.unsubscribe();
	}
}
