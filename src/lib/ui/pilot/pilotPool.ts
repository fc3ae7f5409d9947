/**
 * The pilot worker, behind the same pool client as the engine (progress, cancel by
 * terminate-and-replace, outcomes as data). One worker: one pilot file is read at a time.
 */
import { EnginePool, type WorkerLike } from '$lib/workers/EnginePool';
import type { PilotHandlers } from './pilotTasks';

let pool: EnginePool<PilotHandlers> | undefined;

export function getPilotPool(): EnginePool<PilotHandlers> {
	pool ??= new EnginePool<PilotHandlers>({
		size: 1,
		createWorker: () => new Worker(new URL('../../workers/pilot.worker.ts', import.meta.url), { type: 'module' }) as unknown as WorkerLike
	});
	return pool;
}
