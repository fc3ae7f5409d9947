/**
 * Public surface of the worker area. Pages and sections call `getEnginePool().run(type, payload)`
 * and never compute on the main thread.
 */
import { EnginePool, type WorkerLike } from './EnginePool';
import type { EngineHandlers } from './handlers';

export { EnginePool, type WorkerLike, type EnginePoolOptions, type RunOptions, type TaskHandle, type PayloadOf, type ResultOf } from './EnginePool';
export type { EngineHandlers } from './handlers';
export type { Progress, TaskError, TaskOutcome, TaskReply, TaskRequest, Handler, HandlerRegistry } from './protocol';
export { toTaskError } from './protocol';
export { createTaskServer } from './taskServer';

let pool: EnginePool<EngineHandlers> | undefined;

/** The app's pool of engine workers (two, or more on machines with many cores; at most four). */
export function getEnginePool(): EnginePool<EngineHandlers> {
	if (!pool) {
		const cores = typeof navigator !== 'undefined' ? (navigator.hardwareConcurrency ?? 2) : 2;
		pool = new EnginePool<EngineHandlers>({
			size: Math.min(4, Math.max(2, cores - 1)),
			createWorker: () => new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module' }) as unknown as WorkerLike
		});
	}
	return pool;
}
