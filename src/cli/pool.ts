/**
 * worker_threads pool for Monte Carlo replicates on the command line. Work is a list of jobs
 * (a prepared simulation and the replicate numbers to run); replicate lists are cut into
 * chunks and spread over the workers, and results come back in the order asked for. Every
 * replicate is deterministic in (seed, rep), so results are identical for any thread count.
 * With threads = 1 everything runs on this thread (no worker start-up cost).
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { runReplicate, type PreparedSimulation, type ReplicateResult } from '../lib/core/simulate';

export interface ReplicateJob {
	prep: PreparedSimulation;
	reps: number[];
}

export interface PoolOptions {
	/** Worker threads (default: available cores); never more than there are replicates. */
	threads?: number;
	/** Called after every finished chunk with replicates done and total. */
	onProgress?: (done: number, total: number) => void;
}

export function defaultThreadCount(): number {
	return Math.max(1, availableParallelism());
}

/** Runs every job's replicates; returns one result list per job, in the order of its `reps`. */
export async function runJobsParallel(jobs: ReplicateJob[], opts: PoolOptions = {}): Promise<ReplicateResult[][]> {
	const total = jobs.reduce((s, j) => s + j.reps.length, 0);
	const threads = Math.min(opts.threads ?? defaultThreadCount(), Math.max(1, total));
	if (!Number.isInteger(threads) || threads < 1) throw new RangeError(`threads must be an integer ≥ 1, got ${opts.threads}`);
	const out: ReplicateResult[][] = jobs.map((j) => new Array<ReplicateResult>(j.reps.length));
	let done = 0;
	if (threads === 1) {
		jobs.forEach((job, ji) =>
			job.reps.forEach((rep, i) => {
				out[ji][i] = runReplicate(job.prep, rep);
				opts.onProgress?.(++done, total);
			})
		);
		return out;
	}
	// Chunks: about four per thread for balance.
	const chunk = Math.max(1, Math.ceil(total / (threads * 4)));
	const tasks: { job: number; start: number; reps: number[] }[] = [];
	jobs.forEach((job, ji) => {
		for (let s = 0; s < job.reps.length; s += chunk) tasks.push({ job: ji, start: s, reps: job.reps.slice(s, s + chunk) });
	});
	const workers = await Promise.all(Array.from({ length: threads }, startWorker));
	try {
		let next = 0;
		let id = 0;
		await Promise.all(
			workers.map(async (w) => {
				const sent = new Set<number>();
				while (next < tasks.length) {
					const t = tasks[next++];
					const first = !sent.has(t.job);
					sent.add(t.job);
					const results = await request(w, { id: ++id, job: t.job, prep: first ? jobs[t.job].prep : undefined, reps: t.reps });
					results.forEach((r, i) => (out[t.job][t.start + i] = r));
					done += results.length;
					opts.onProgress?.(done, total);
				}
			})
		);
	} finally {
		await Promise.all(workers.map((w) => w.terminate()));
	}
	return out;
}

/** One prepared simulation, the given replicates. */
export async function runReplicatesParallel(prep: PreparedSimulation, reps: number[], opts: PoolOptions = {}): Promise<ReplicateResult[]> {
	return (await runJobsParallel([{ prep, reps }], opts))[0];
}

function startWorker(): Promise<Worker> {
	const w = new Worker(new URL('./simulateWorker.mjs', import.meta.url));
	return new Promise((resolve, reject) => {
		const onMessage = (m: { ready?: boolean }) => {
			if (m?.ready) {
				w.off('message', onMessage);
				w.off('error', reject);
				resolve(w);
			}
		};
		w.on('message', onMessage);
		w.once('error', reject);
	});
}

function request(w: Worker, msg: { id: number; job: number; prep?: PreparedSimulation; reps: number[] }): Promise<ReplicateResult[]> {
	return new Promise((resolve, reject) => {
		const onMessage = (m: { id: number; results?: ReplicateResult[]; error?: string }) => {
			if (m?.id !== msg.id) return;
			w.off('message', onMessage);
			w.off('error', onError);
			if (m.error !== undefined) reject(new Error(`simulation worker: ${m.error}`));
			else resolve(m.results!);
		};
		const onError = (err: Error) => {
			w.off('message', onMessage);
			reject(err);
		};
		w.on('message', onMessage);
		w.once('error', onError);
		w.postMessage(msg);
	});
}
