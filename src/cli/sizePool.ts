/**
 * A worker_threads pool that evaluates sizing requests in parallel for the command line.
 * Each batch of requests is split into chunks of replicates, spread over the workers, and
 * reassembled in order; results are identical for any number of threads because every
 * replicate is deterministic in (seed, rep).
 */
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import type { Plan } from '../lib/core/plan';
import { directEvaluator, type EvalRequest, type Evaluator, type ReplicateOutcome } from '../lib/core/size';

export interface SizePool {
	evaluate: Evaluator;
	threads: number;
	close(): Promise<void>;
}

export function defaultThreads(): number {
	return Math.max(1, availableParallelism());
}

/** A pool of `threads` workers; with 1 thread the requests run on this thread. */
export async function createSizePool(plan: Plan, threads: number): Promise<SizePool> {
	if (!Number.isInteger(threads) || threads < 1) throw new RangeError(`threads must be an integer ≥ 1, got ${threads}`);
	if (threads === 1) return { evaluate: directEvaluator(plan), threads: 1, close: async () => {} };
	const workers = await Promise.all(
		Array.from({ length: threads }, () => {
			const w = new Worker(new URL('./sizeWorker.mjs', import.meta.url), { workerData: { plan } });
			return new Promise<Worker>((resolve, reject) => {
				const onMessage = (m: { ready?: boolean }) => {
					if (m && m.ready) {
						w.off('message', onMessage);
						w.off('error', reject);
						resolve(w);
					}
				};
				w.on('message', onMessage);
				w.once('error', reject);
			});
		})
	);
	let nextId = 1;
	const pending = new Map<number, { resolve: (o: ReplicateOutcome[]) => void; reject: (e: Error) => void }>();
	for (const w of workers) {
		w.on('message', (m: { id: number; outcomes?: ReplicateOutcome[]; error?: string }) => {
			const p = pending.get(m.id);
			if (!p) return;
			pending.delete(m.id);
			if (m.error !== undefined) p.reject(new Error(`sizing worker: ${m.error}`));
			else p.resolve(m.outcomes!);
		});
		w.on('error', (err) => {
			for (const p of pending.values()) p.reject(err);
			pending.clear();
		});
	}
	let turn = 0;
	const send = (request: EvalRequest) =>
		new Promise<ReplicateOutcome[]>((resolve, reject) => {
			const id = nextId++;
			pending.set(id, { resolve, reject });
			workers[turn++ % workers.length].postMessage({ id, request });
		});

	const evaluate: Evaluator = async (batch) => {
		// Split every request's replicates into about `threads` chunks overall.
		const total = batch.reduce((s, r) => s + r.reps.length, 0);
		const chunk = Math.max(1, Math.ceil(total / threads));
		const jobs: { req: number; part: Promise<ReplicateOutcome[]> }[] = [];
		batch.forEach((req, i) => {
			for (let k = 0; k < req.reps.length; k += chunk) jobs.push({ req: i, part: send({ ...req, reps: req.reps.slice(k, k + chunk) }) });
		});
		const parts = await Promise.all(jobs.map((j) => j.part));
		const out: ReplicateOutcome[][] = batch.map(() => []);
		jobs.forEach((j, k) => out[j.req].push(...parts[k]));
		return out;
	};
	return {
		evaluate,
		threads,
		close: async () => {
			await Promise.all(workers.map((w) => w.terminate()));
		}
	};
}
