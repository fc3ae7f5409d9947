/**
 * Reactive state of one kind of engine task for a section: status, progress, result, error.
 * A section creates one per task type, calls `run(payload)` (from a button or a debounced
 * input change) and shows `status`, `progress` (a progress bar) and `cancel()`.
 *
 * A new `run` supersedes the previous one: with `supersede: 'cancel'` (default, for long
 * tasks) the old one is cancelled, which terminates its worker; with `'ignore'` (for quick
 * tasks that rerun on every edit) it is left to finish and its outcome is dropped.
 */
import type { EnginePool, PayloadOf, Progress, ResultOf, TaskError, TaskHandle, TaskOutcome, HandlerRegistry } from '$lib/workers';

export type TaskStatus = 'idle' | 'running' | 'done' | 'error' | 'cancelled';

export class TaskRunner<H extends HandlerRegistry, T extends keyof H & string> {
	status: TaskStatus = $state('idle');
	progress: Progress | null = $state.raw(null);
	result: ResultOf<H, T> | null = $state.raw(null);
	error: TaskError | null = $state.raw(null);
	/** The caller's tag of the run that produced `result` (e.g. the plan input hash). */
	resultTag: string | null = $state(null);
	/** When the last result arrived (ms since 1970). */
	finishedAt = $state(0);

	private current: TaskHandle<ResultOf<H, T>> | null = null;
	private seq = 0;

	constructor(
		private readonly pool: EnginePool<H>,
		readonly type: T,
		private readonly supersede: 'cancel' | 'ignore' = 'cancel'
	) {}

	/** Starts the task; resolves with its outcome (also when superseded: then `cancelled`). */
	async run(payload: PayloadOf<H, T>, tag: string | null = null): Promise<TaskOutcome<ResultOf<H, T>>> {
		const seq = ++this.seq;
		if (this.current && this.supersede === 'cancel') this.current.cancel();
		this.status = 'running';
		this.progress = null;
		const handle = this.pool.run(this.type, payload, {
			onProgress: (p) => {
				if (seq === this.seq) this.progress = p;
			}
		});
		this.current = handle;
		const outcome = await handle.promise;
		if (seq !== this.seq) return outcome;
		this.current = null;
		if (outcome.ok) {
			this.result = outcome.result;
			this.resultTag = tag;
			this.error = null;
			this.status = 'done';
			this.finishedAt = Date.now();
		} else if (outcome.cancelled) {
			this.status = 'cancelled';
		} else {
			this.error = outcome.error;
			this.status = 'error';
		}
		return outcome;
	}

	/** Cancels the running task (its worker is terminated and replaced). */
	cancel(): void {
		if (!this.current) return;
		this.seq++;
		this.current.cancel();
		this.current = null;
		this.status = 'cancelled';
		this.progress = null;
	}
}
