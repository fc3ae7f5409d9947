/**
 * Simulation worker: keeps the prepared simulations it has been sent (by job index) and runs
 * replicate lists on request. Protocol (plain data):
 *   in  { id, job, prep?, reps }   — prep is sent with the first request of each job
 *   out { id, results } | { id, error } ; { ready: true } once loaded.
 */
import { parentPort } from 'node:worker_threads';
import { runReplicate, type PreparedSimulation, type ReplicateResult } from '../lib/core/simulate';

const preps = new Map<number, PreparedSimulation>();
const port = parentPort!;
port.on('message', (m: { id: number; job: number; prep?: PreparedSimulation; reps: number[] }) => {
	try {
		if (m.prep) preps.set(m.job, m.prep);
		const prep = preps.get(m.job);
		if (!prep) throw new Error(`job ${m.job} was never sent to this worker`);
		const results: ReplicateResult[] = m.reps.map((rep) => runReplicate(prep, rep));
		port.postMessage({ id: m.id, results });
	} catch (err) {
		port.postMessage({ id: m.id, error: (err as Error)?.stack ?? String(err) });
	}
});
port.postMessage({ ready: true });
