/**
 * Sizing worker (worker_threads): receives the plan once, then evaluation requests
 * `{ id, request: EvalRequest }` and answers `{ id, outcomes }` or `{ id, error }`.
 * Replicates are deterministic in (seed, rep), so any split over workers gives the same results.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { directRunner } from '../lib/core/size';
import type { EvalRequest } from '../lib/core/size';
import type { Plan } from '../lib/core/plan';

const run = directRunner(workerData.plan as Plan);
parentPort!.on('message', (msg: { id: number; request: EvalRequest }) => {
	try {
		parentPort!.postMessage({ id: msg.id, outcomes: run(msg.request) });
	} catch (err) {
		parentPort!.postMessage({ id: msg.id, error: (err as Error)?.stack ?? String(err) });
	}
});
parentPort!.postMessage({ ready: true });
