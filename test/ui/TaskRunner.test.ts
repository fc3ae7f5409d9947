import { describe, expect, it } from 'vitest';
import { EnginePool, type WorkerLike } from '../../src/lib/workers/EnginePool';
import { createTaskServer } from '../../src/lib/workers/taskServer';
import type { HandlerRegistry, TaskReply, TaskRequest } from '../../src/lib/workers/protocol';
import { TaskRunner } from '../../src/lib/ui/session/TaskRunner.svelte';

const release = new Map<number, () => void>();
const registry = {
	/** Reports two progress steps, then waits until the test releases run `n`. */
	count: async ({ n }: { n: number }, progress: (p: { done: number; total: number }) => void) => {
		progress({ done: 1, total: 2 });
		await new Promise<void>((r) => release.set(n, r));
		progress({ done: 2, total: 2 });
		return n * 10;
	},
	broken: () => {
		throw new RangeError('replicates must be ≥ 2');
	}
} satisfies HandlerRegistry;

let terminated = 0;
class Fake implements WorkerLike {
	onmessage: ((event: { data: TaskReply }) => void) | null = null;
	onerror: ((event: { message?: string }) => void) | null = null;
	private dead = false;
	private serve = createTaskServer(registry, (reply) => setTimeout(() => !this.dead && this.onmessage?.({ data: structuredClone(reply) }), 0));
	postMessage(request: TaskRequest) {
		const copy = structuredClone(request);
		setTimeout(() => !this.dead && void this.serve(copy), 0);
	}
	terminate() {
		this.dead = true;
		terminated++;
	}
}
const until = async (ok: () => boolean) => {
	for (let i = 0; i < 500 && !ok(); i++) await new Promise((r) => setTimeout(r, 2));
	expect(ok()).toBe(true);
};

describe('TaskRunner', () => {
	it('tracks status, progress and result of a run', async () => {
		const pool = new EnginePool<typeof registry>({ size: 2, createWorker: () => new Fake() });
		const runner = new TaskRunner(pool, 'count');
		const done = runner.run({ n: 1 }, 'tag-1');
		expect(runner.status).toBe('running');
		await until(() => runner.progress?.done === 1 && release.has(1));
		release.get(1)!();
		expect(await done).toEqual({ ok: true, result: 10 });
		expect(runner).toMatchObject({ status: 'done', result: 10, resultTag: 'tag-1', error: null });
		pool.destroy();
	});

	it('a new run cancels the previous one by default (its worker is terminated)', async () => {
		const pool = new EnginePool<typeof registry>({ size: 2, createWorker: () => new Fake() });
		const runner = new TaskRunner(pool, 'count');
		const before = terminated;
		const first = runner.run({ n: 2 });
		await until(() => release.has(2));
		const second = runner.run({ n: 3 });
		expect(await first).toMatchObject({ ok: false, cancelled: true });
		expect(terminated - before).toBe(1);
		await until(() => release.has(3));
		release.get(3)!();
		expect(await second).toEqual({ ok: true, result: 30 });
		expect(runner.result).toBe(30);
		pool.destroy();
	});

	it("with supersede 'ignore' the older run finishes but its result is dropped", async () => {
		const pool = new EnginePool<typeof registry>({ size: 2, createWorker: () => new Fake() });
		const runner = new TaskRunner(pool, 'count', 'ignore');
		const before = terminated;
		const first = runner.run({ n: 4 }, 'old');
		await until(() => release.has(4));
		const second = runner.run({ n: 5 }, 'new');
		await until(() => release.has(5));
		release.get(5)!();
		await second;
		release.get(4)!();
		expect(await first).toEqual({ ok: true, result: 40 });
		expect(terminated).toBe(before);
		expect(runner).toMatchObject({ status: 'done', result: 50, resultTag: 'new' });
		pool.destroy();
	});

	it('cancel() stops the run and reports it; errors arrive as data', async () => {
		const pool = new EnginePool<typeof registry>({ size: 1, createWorker: () => new Fake() });
		const runner = new TaskRunner(pool, 'count');
		const run = runner.run({ n: 6 });
		await until(() => release.has(6));
		runner.cancel();
		expect(runner.status).toBe('cancelled');
		expect(await run).toMatchObject({ ok: false, cancelled: true });

		const failing = new TaskRunner(pool, 'broken');
		expect(await failing.run(undefined)).toMatchObject({ ok: false, cancelled: false, error: { name: 'RangeError', message: 'replicates must be ≥ 2' } });
		expect(failing.status).toBe('error');
		expect(failing.error?.message).toBe('replicates must be ≥ 2');
		pool.destroy();
	});
});
