import { describe, expect, it } from 'vitest';
import { EnginePool, type WorkerLike } from '../../src/lib/workers/EnginePool';
import { createTaskServer } from '../../src/lib/workers/taskServer';
import type { HandlerRegistry, TaskReply, TaskRequest } from '../../src/lib/workers/protocol';
import { PlanError } from '../../src/lib/core/plan';

/** Gates that tests open by hand, to hold a "slow" task while they inspect the pool. */
const gates = new Map<string, () => void>();
const gate = (name: string) => new Promise<void>((resolve) => gates.set(name, resolve));
/** Opens a gate once the task has reached it. */
async function open(name: string) {
	while (!gates.has(name)) await new Promise((r) => setTimeout(r, 0));
	gates.get(name)!();
}
const tick = () => new Promise((r) => setTimeout(r, 0));

const registry = {
	add: ({ a, b }: { a: number; b: number }) => a + b,
	fail: () => {
		throw new PlanError([{ path: 'reagents[0].efficacy', message: 'expected a number in (0, 1], got 0' }]);
	},
	slow: async ({ name, steps }: { name: string; steps: number }, progress: (p: { done: number; total: number }) => void) => {
		for (let i = 1; i <= steps; i++) progress({ done: i, total: steps });
		await gate(name);
		return `${name} finished`;
	}
} satisfies HandlerRegistry;

/** A worker stand-in running the same task server in this process, with structured cloning both ways. */
class InProcessWorker implements WorkerLike {
	static started = 0;
	static terminated = 0;
	onmessage: ((event: { data: TaskReply }) => void) | null = null;
	onerror: ((event: { message?: string }) => void) | null = null;
	private dead = false;
	private serve = createTaskServer(registry, (reply) => {
		if (!this.dead) setTimeout(() => !this.dead && this.onmessage?.({ data: structuredClone(reply) }), 0);
	});
	constructor() {
		InProcessWorker.started++;
	}
	postMessage(request: TaskRequest) {
		const copy = structuredClone(request); // throws DataCloneError like a real worker
		setTimeout(() => !this.dead && void this.serve(copy), 0);
	}
	terminate() {
		this.dead = true;
		InProcessWorker.terminated++;
	}
}

const makePool = (size = 2) => new EnginePool<typeof registry>({ size, createWorker: () => new InProcessWorker() });

describe('EnginePool', () => {
	it('returns results keyed to their request', async () => {
		const pool = makePool();
		const outcomes = await Promise.all([pool.run('add', { a: 1, b: 2 }).promise, pool.run('add', { a: 10, b: 20 }).promise, pool.run('add', { a: -1, b: 1 }).promise]);
		expect(outcomes).toEqual([
			{ ok: true, result: 3 },
			{ ok: true, result: 30 },
			{ ok: true, result: 0 }
		]);
		pool.destroy();
	});

	it('returns errors as data, with a plan error\'s field paths', async () => {
		const pool = makePool();
		const outcome = await pool.run('fail', undefined).promise;
		expect(outcome).toEqual({
			ok: false,
			cancelled: false,
			error: { name: 'PlanError', message: 'reagents[0].efficacy: expected a number in (0, 1], got 0', issues: [{ path: 'reagents[0].efficacy', message: 'expected a number in (0, 1], got 0' }] }
		});
		pool.destroy();
	});

	it('reports an unknown task type as an error naming the known ones', async () => {
		const pool = makePool();
		const outcome = await (pool as unknown as EnginePool<HandlerRegistry>).run('nope', {}).promise;
		expect(outcome.ok).toBe(false);
		if (!outcome.ok) expect(outcome.error.message).toMatch(/no handler for task type "nope"; known: add, fail, slow/);
		pool.destroy();
	});

	it('passes progress to the caller', async () => {
		const pool = makePool();
		const seen: number[] = [];
		const handle = pool.run('slow', { name: 'p', steps: 3 }, { onProgress: (p) => seen.push(p.done) });
		while (seen.length < 3) await tick();
		await open('p');
		expect(await handle.promise).toEqual({ ok: true, result: 'p finished' });
		expect(seen).toEqual([1, 2, 3]);
		pool.destroy();
	});

	it('runs at most `size` tasks at once and queues the rest in order', async () => {
		const pool = makePool(2);
		const a = pool.run('slow', { name: 'a', steps: 0 });
		const b = pool.run('slow', { name: 'b', steps: 0 });
		const c = pool.run('add', { a: 2, b: 2 });
		await tick();
		expect(pool.workers).toBe(2);
		expect(pool.queued).toBe(1);
		await open('b');
		expect(await b.promise).toEqual({ ok: true, result: 'b finished' });
		expect(await c.promise).toEqual({ ok: true, result: 4 });
		await open('a');
		expect(await a.promise).toEqual({ ok: true, result: 'a finished' });
		pool.destroy();
	});

	it('cancelling a running task terminates its worker, and the next task gets a fresh one', async () => {
		const pool = makePool(1);
		const before = { started: InProcessWorker.started, terminated: InProcessWorker.terminated };
		const stuck = pool.run('slow', { name: 'stuck', steps: 1 });
		const next = pool.run('add', { a: 5, b: 5 });
		await tick();
		stuck.cancel();
		expect(await stuck.promise).toMatchObject({ ok: false, cancelled: true });
		expect(InProcessWorker.terminated - before.terminated).toBe(1);
		expect(await next.promise).toEqual({ ok: true, result: 10 });
		expect(InProcessWorker.started - before.started).toBe(2);
		await open('stuck'); // the terminated worker's late reply is ignored
		await tick();
		stuck.cancel(); // cancelling twice is harmless
		pool.destroy();
	});

	it('cancelling a queued task removes it without touching workers', async () => {
		const pool = makePool(1);
		const running = pool.run('slow', { name: 'r', steps: 0 });
		const queued = pool.run('add', { a: 1, b: 1 });
		const terminatedBefore = InProcessWorker.terminated;
		queued.cancel();
		expect(await queued.promise).toMatchObject({ ok: false, cancelled: true });
		expect(InProcessWorker.terminated).toBe(terminatedBefore);
		await open('r');
		expect(await running.promise).toEqual({ ok: true, result: 'r finished' });
		pool.destroy();
	});

	it('an AbortSignal cancels the task', async () => {
		const pool = makePool(1);
		const controller = new AbortController();
		const handle = pool.run('slow', { name: 's', steps: 0 }, { signal: controller.signal });
		await tick();
		controller.abort();
		expect(await handle.promise).toMatchObject({ ok: false, cancelled: true });
		const already = pool.run('add', { a: 1, b: 2 }, { signal: controller.signal });
		expect(await already.promise).toMatchObject({ ok: false, cancelled: true });
		pool.destroy();
	});

	it('a payload that cannot be cloned is an error outcome, and the pool keeps working', async () => {
		const pool = makePool(1);
		const bad = pool.run('add', { a: 1, b: (() => 2) as unknown as number });
		expect(await bad.promise).toMatchObject({ ok: false, cancelled: false, error: { name: 'DataCloneError' } });
		expect(await pool.run('add', { a: 1, b: 2 }).promise).toEqual({ ok: true, result: 3 });
		pool.destroy();
	});

	it('a worker crash fails its task and the pool replaces the worker', async () => {
		const workers: InProcessWorker[] = [];
		const pool = new EnginePool<typeof registry>({
			size: 1,
			createWorker: () => {
				const w = new InProcessWorker();
				workers.push(w);
				return w;
			}
		});
		const doomed = pool.run('slow', { name: 'crash', steps: 0 });
		await tick();
		workers[0].onerror!({ message: 'script failed' });
		expect(await doomed.promise).toEqual({ ok: false, cancelled: false, error: { name: 'WorkerError', message: 'script failed' } });
		expect(await pool.run('add', { a: 3, b: 4 }).promise).toEqual({ ok: true, result: 7 });
		expect(workers.length).toBe(2);
		pool.destroy();
	});

	it('destroy cancels everything and later runs are refused as cancelled', async () => {
		const pool = makePool(1);
		const a = pool.run('slow', { name: 'd1', steps: 0 });
		const b = pool.run('add', { a: 1, b: 1 });
		await tick();
		pool.destroy();
		expect(await a.promise).toMatchObject({ ok: false, cancelled: true });
		expect(await b.promise).toMatchObject({ ok: false, cancelled: true });
		expect(await pool.run('add', { a: 1, b: 1 }).promise).toMatchObject({ ok: false, cancelled: true });
	});

	it('rejects a size that is not a positive integer', () => {
		expect(() => new EnginePool({ size: 0, createWorker: () => new InProcessWorker() })).toThrow(/size: expected an integer ≥ 1, got 0/);
	});
});
