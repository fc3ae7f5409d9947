import type { HandlerRegistry, Progress, TaskError, TaskOutcome, TaskReply, TaskRequest } from './protocol';

/** The part of `Worker` the pool uses (a test can pass an in-process stand-in). */
export interface WorkerLike {
	postMessage(message: TaskRequest): void;
	terminate(): void;
	onmessage: ((event: { data: TaskReply }) => void) | null;
	onerror: ((event: { message?: string }) => void) | null;
}

export interface EnginePoolOptions {
	/** Most workers running at once (default 2: one long task never blocks a quick one). */
	size?: number;
	/** Makes one worker. */
	createWorker: () => WorkerLike;
}

export interface RunOptions {
	onProgress?: (progress: Progress) => void;
	/** Aborting cancels the task (same as `handle.cancel()`). */
	signal?: AbortSignal;
}

/** A running (or queued) task: its outcome and a way to cancel it. */
export interface TaskHandle<R> {
	readonly id: number;
	readonly promise: Promise<TaskOutcome<R>>;
	/** Cancels: drops it from the queue, or terminates its worker (a fresh one starts for the next task). */
	cancel(): void;
}

export type PayloadOf<H extends HandlerRegistry, T extends keyof H> = Parameters<H[T]>[0];
export type ResultOf<H extends HandlerRegistry, T extends keyof H> = Awaited<ReturnType<H[T]>>;

interface Job {
	request: TaskRequest;
	onProgress?: (progress: Progress) => void;
	settle: (outcome: TaskOutcome<unknown>) => void;
	slot?: Slot;
	done: boolean;
	cleanup?: () => void;
}

interface Slot {
	worker: WorkerLike;
	job: Job | null;
}

const cancelledError: TaskError = { name: 'Cancelled', message: 'the task was cancelled' };

/**
 * A small pool of engine workers with a Promise client keyed by request id. Tasks queue in
 * order and go to the first idle worker; progress reaches the caller's callback; outcomes are
 * data (`{ ok, result | error }`), never thrown. Cancelling a running task terminates its
 * worker and starts a fresh one, so a long computation stops at once. Type parameter `H` is
 * the handler registry (see `handlers.ts`), which types each task's payload and result.
 */
export class EnginePool<H extends HandlerRegistry> {
	private readonly size: number;
	private readonly createWorker: () => WorkerLike;
	private readonly slots: Slot[] = [];
	private readonly queue: Job[] = [];
	private nextId = 1;
	private destroyed = false;

	constructor(options: EnginePoolOptions) {
		if (!Number.isInteger(options.size ?? 2) || (options.size ?? 2) < 1) throw new RangeError(`EnginePool size: expected an integer ≥ 1, got ${options.size}`);
		this.size = options.size ?? 2;
		this.createWorker = options.createWorker;
	}

	/** Number of workers started so far (they start on demand). */
	get workers(): number {
		return this.slots.length;
	}

	/** Tasks waiting for a free worker. */
	get queued(): number {
		return this.queue.length;
	}

	/** Starts task `type` with `payload`. */
	run<T extends keyof H & string>(type: T, payload: PayloadOf<H, T>, options: RunOptions = {}): TaskHandle<ResultOf<H, T>> {
		const id = this.nextId++;
		let settle!: (outcome: TaskOutcome<unknown>) => void;
		const promise = new Promise<TaskOutcome<unknown>>((resolve) => (settle = resolve));
		const job: Job = { request: { id, type, payload }, onProgress: options.onProgress, settle, done: false };
		const handle: TaskHandle<ResultOf<H, T>> = {
			id,
			promise: promise as Promise<TaskOutcome<ResultOf<H, T>>>,
			cancel: () => this.cancel(job)
		};
		if (this.destroyed) {
			this.finish(job, { ok: false, cancelled: true, error: { name: 'Cancelled', message: 'the engine was shut down' } });
			return handle;
		}
		if (options.signal) {
			if (options.signal.aborted) {
				this.finish(job, { ok: false, cancelled: true, error: cancelledError });
				return handle;
			}
			const onAbort = () => this.cancel(job);
			options.signal.addEventListener('abort', onAbort, { once: true });
			job.cleanup = () => options.signal!.removeEventListener('abort', onAbort);
		}
		this.queue.push(job);
		this.pump();
		return handle;
	}

	/** Terminates every worker and cancels every task. */
	destroy(): void {
		this.destroyed = true;
		for (const job of this.queue.splice(0)) this.finish(job, { ok: false, cancelled: true, error: { name: 'Cancelled', message: 'the engine was shut down' } });
		for (const slot of this.slots.splice(0)) {
			slot.worker.terminate();
			if (slot.job) this.finish(slot.job, { ok: false, cancelled: true, error: { name: 'Cancelled', message: 'the engine was shut down' } });
		}
	}

	private pump(): void {
		while (this.queue.length) {
			let slot = this.slots.find((s) => s.job === null);
			if (!slot && this.slots.length < this.size) slot = this.spawn();
			if (!slot) return;
			const job = this.queue.shift()!;
			slot.job = job;
			job.slot = slot;
			try {
				slot.worker.postMessage(job.request);
			} catch (err) {
				// The payload could not be cloned (a caller mistake): report it as data.
				slot.job = null;
				this.finish(job, { ok: false, cancelled: false, error: { name: 'DataCloneError', message: `task "${job.request.type}": ${(err as Error).message}` } });
			}
		}
	}

	private spawn(): Slot {
		const slot: Slot = { worker: this.createWorker(), job: null };
		slot.worker.onmessage = (event) => this.receive(slot, event.data);
		slot.worker.onerror = (event) => {
			// A crash outside any handler (e.g. the worker script failed to load): fail its task,
			// replace the worker and carry on with the queue.
			const job = slot.job;
			this.replace(slot);
			if (job) this.finish(job, { ok: false, cancelled: false, error: { name: 'WorkerError', message: event.message || 'the engine worker stopped unexpectedly' } });
			this.pump();
		};
		this.slots.push(slot);
		return slot;
	}

	private replace(slot: Slot): void {
		slot.worker.onmessage = null;
		slot.worker.onerror = null;
		slot.worker.terminate();
		const i = this.slots.indexOf(slot);
		if (i >= 0) this.slots.splice(i, 1);
		if (slot.job) slot.job.slot = undefined;
		slot.job = null;
	}

	private receive(slot: Slot, reply: TaskReply): void {
		const job = slot.job;
		if (!job || job.request.id !== reply.id) return; // a late reply of a cancelled task
		if (reply.type === 'progress') {
			job.onProgress?.(reply.progress);
			return;
		}
		slot.job = null;
		job.slot = undefined;
		if (reply.type === 'result') this.finish(job, { ok: true, result: reply.result });
		else this.finish(job, { ok: false, cancelled: false, error: reply.error });
		this.pump();
	}

	private cancel(job: Job): void {
		if (job.done) return;
		const queued = this.queue.indexOf(job);
		if (queued >= 0) this.queue.splice(queued, 1);
		else if (job.slot) this.replace(job.slot);
		this.finish(job, { ok: false, cancelled: true, error: cancelledError });
		this.pump();
	}

	private finish(job: Job, outcome: TaskOutcome<unknown>): void {
		if (job.done) return;
		job.done = true;
		job.cleanup?.();
		job.settle(outcome);
	}
}
