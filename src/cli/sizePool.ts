/**
 * A worker_threads pool that evaluates sizing requests in parallel for the command line.
 * Each batch of requests is split into chunks of replicates, spread over the workers, and
 * reassembled in order; results are identical for any number of threads because every
 * replicate is deterministic in (seed, rep).
 *
 * Batches of the sizing search are often small (25 replicates of a fast well-level simulation
 * take a few milliseconds), where a round trip to the workers costs more than it saves. The
 * pool therefore runs a batch on the calling thread when its estimated work (replicates ×
 * measured milliseconds per replicate) is below `minParallelMs` (default 40 ms), and starts the
 * workers lazily the first time a batch is worth spreading.
 */
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import type { Plan } from '../lib/core/plan';
import { directEvaluator, directRunner, type EvalRequest, type Evaluator, type ReplicateOutcome } from '../lib/core/size';

export interface SizePool {
	evaluate: Evaluator;
	threads: number;
	close(): Promise<void>;
}

export function defaultThreads(): number {
	return Math.max(1, availableParallelism());
}

export interface SizePoolOptions {
	/** Batches estimated below this many milliseconds of work run on the calling thread (default 40). */
	minParallelMs?: number;
}

/** A pool of up to `threads` workers; with 1 thread every request runs on this thread. */
export async function createSizePool(plan: Plan, threads: number, opts: SizePoolOptions = {}): Promise<SizePool> {
	if (!Number.isInteger(threads) || threads < 1) throw new RangeError(`threads must be an integer ≥ 1, got ${threads}`);
	if (threads === 1) return { evaluate: directEvaluator(plan), threads: 1, close: async () => {} };
	const minParallelMs = opts.minParallelMs ?? 40;
	const direct = directRunner(plan);
	let msPerRep: number | null = null;
	let workers: Worker[] | null = null;
	let starting: Promise<Worker[]> | null = null;
	const start = () => (starting ??= startWorkers(plan, threads, (w) => (workers = w)));

	// Cost per replicate = the smallest seen on this thread (the first batches also pay for
	// compilation, and a busy machine only ever slows a batch down); the first three batches
	// always run here.
	let directRuns = 0;
	const evaluate: Evaluator = async (batch) => {
		const total = batch.reduce((s, r) => s + r.reps.length, 0);
		if (minParallelMs > 0 && (directRuns < 3 || msPerRep === null || total * msPerRep < minParallelMs)) {
			const t0 = performance.now();
			const out = batch.map(direct);
			directRuns++;
			const per = (performance.now() - t0) / Math.max(1, total);
			msPerRep = msPerRep === null ? per : Math.min(msPerRep, per);
			return out;
		}
		return spread(await start(), batch, total);
	};

	let nextId = 1;
	const pending = new Map<number, { resolve: (o: ReplicateOutcome[]) => void; reject: (e: Error) => void }>();
	let turn = 0;
	const send = (pool: Worker[], request: EvalRequest) =>
		new Promise<ReplicateOutcome[]>((resolve, reject) => {
			const id = nextId++;
			pending.set(id, { resolve, reject });
			pool[turn++ % pool.length].postMessage({ id, request });
		});
	async function spread(pool: Worker[], batch: EvalRequest[], total: number): Promise<ReplicateOutcome[][]> {
		// Split every request's replicates into about `threads` chunks overall.
		const chunk = Math.max(1, Math.ceil(total / threads));
		const jobs: { req: number; part: Promise<ReplicateOutcome[]> }[] = [];
		batch.forEach((req, i) => {
			for (let k = 0; k < req.reps.length; k += chunk) jobs.push({ req: i, part: send(pool, { ...req, reps: req.reps.slice(k, k + chunk) }) });
		});
		const parts = await Promise.all(jobs.map((j) => j.part));
		const out: ReplicateOutcome[][] = batch.map(() => []);
		jobs.forEach((j, k) => out[j.req].push(...parts[k]));
		return out;
	}
	function startWorkers(plan: Plan, n: number, done: (w: Worker[]) => void): Promise<Worker[]> {
		return startPool(plan, n).then((pool) => {
			for (const w of pool) {
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
			done(pool);
			return pool;
		});
	}
	return {
		evaluate,
		threads,
		close: async () => {
			if (starting) await starting.catch(() => undefined);
			if (workers) await Promise.all(workers.map((w) => w.terminate()));
		}
	};
}

function startPool(plan: Plan, threads: number): Promise<Worker[]> {
	return Promise.all(
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
}
