import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import Dexie from 'dexie';
import { parsePlan, type Plan } from '../../src/lib/core/plan';
import { checkPlan } from '../../src/lib/core/identify';
import { IdentiplateDb, PlanStore } from '../../src/lib/storage';
import { PlanSession, AUTOSAVE_DELAY_MS } from '../../src/lib/ui/session/PlanSession.svelte';
import { VerdictRunner, summarizeCheck } from '../../src/lib/ui/session/VerdictRunner.svelte';
import { EnginePool, type WorkerLike } from '../../src/lib/workers/EnginePool';
import { createTaskServer } from '../../src/lib/workers/taskServer';
import { handlers, type EngineHandlers } from '../../src/lib/workers/handlers';
import type { TaskReply, TaskRequest } from '../../src/lib/workers/protocol';
import { setTargets } from '../../src/lib/ui/planEdits';

const load = (name: string): Plan => parsePlan(readFileSync(`templates/${name}.json`, 'utf8'));
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

let db: IdentiplateDb;
let store: PlanStore;
let name: string;
let n = 0;
beforeEach(() => {
	name = `session-${++n}-${Date.now()}`;
	db = new IdentiplateDb(name);
	store = new PlanStore(db);
});
afterEach(async () => {
	db.close();
	await Dexie.delete(name);
});

describe('PlanSession autosave', () => {
	it('saves an edit by itself after the autosave delay', async () => {
		const rec = await store.create(load('demo'));
		const session = (await PlanSession.open(store, rec.id))!;
		session.edit((p) => (p.notes = 'edited in the notebook'));
		expect(session.saveState).toBe('pending');
		await sleep(AUTOSAVE_DELAY_MS + 150);
		expect(session.saveState).toBe('saved');
		expect((await store.get(rec.id))!.plan.notes).toBe('edited in the notebook');
		session.destroy();
	});

	it('flush writes at once; an invalid plan is not written and says so', async () => {
		const rec = await store.create(load('demo'));
		const session = (await PlanSession.open(store, rec.id))!;
		session.edit((p) => (p.reagents[0].efficacy = 0));
		await session.flush();
		expect(session.saveState).toBe('invalid');
		expect(session.issues[0].path).toBe('reagents[0].efficacy');
		expect((await store.get(rec.id))!.plan.reagents[0].efficacy).toBe(0.95);
		session.edit((p) => (p.reagents[0].efficacy = 0.5));
		await session.flush();
		expect(session.saveState).toBe('saved');
		expect((await store.get(rec.id))!.plan.reagents[0].efficacy).toBe(0.5);
		session.destroy();
	});

	it('two tabs: the second writer gets a conflict and can reload or save a copy; nothing is overwritten', async () => {
		const rec = await store.create(load('demo'));
		const tabA = (await PlanSession.open(store, rec.id))!;
		const tabB = (await PlanSession.open(store, rec.id))!;
		tabA.edit((p) => (p.notes = 'A'));
		await tabA.flush();
		tabB.edit((p) => (p.notes = 'B'));
		await tabB.flush();
		expect(tabB.saveState).toBe('conflict');
		expect(tabB.conflict!.plan.notes).toBe('A');
		expect((await store.get(rec.id))!.plan.notes).toBe('A');

		// Autosave stays off while in conflict.
		tabB.edit((p) => (p.notes = 'B again'));
		await tabB.flush();
		expect((await store.get(rec.id))!.plan.notes).toBe('A');

		const copyId = await tabB.saveAsCopy();
		expect((await store.get(copyId))!.plan.notes).toBe('B again');
		expect((await store.get(copyId))!.title).toMatch(/this tab's version/);

		tabB.loadStoredCopy();
		expect(tabB.plan.notes).toBe('A');
		expect(tabB.saveState).toBe('saved');
		tabB.edit((p) => (p.notes = 'B after reload'));
		await tabB.flush();
		expect(tabB.saveState).toBe('saved');
		expect((await store.get(rec.id))!.plan.notes).toBe('B after reload');
		tabA.destroy();
		tabB.destroy();
	});

	it('results are stale exactly when inputs change, and are saved with the plan', async () => {
		const rec = await store.create(load('demo'));
		const session = (await PlanSession.open(store, rec.id))!;
		session.setResult('simulate', 7, { reps: 10 }, { mcc: 0.9 });
		expect(session.resultFor('simulate')!.stale).toBe(false);
		session.edit((p) => (p.notes = 'prose only'));
		expect(session.resultFor('simulate')!.stale).toBe(false);
		session.edit((p) => (p.observation.replicateNoise = 0.6));
		expect(session.resultFor('simulate')!.stale).toBe(true);
		await session.flush();
		const stored = (await store.get(rec.id))!;
		expect(stored.results.simulate).toMatchObject({ kind: 'simulate', seed: 7, settings: { reps: 10 }, summary: { mcc: 0.9 } });
		expect(session.resultFor('nothing')).toBeUndefined();
		session.destroy();
	});

	it('saves revisions of the latest edits and restores one into the working copy', async () => {
		const rec = await store.create(load('demo'));
		const session = (await PlanSession.open(store, rec.id))!;
		session.edit((p) => (p.budget.total = 12000));
		const r1 = await session.saveRevision('tighter budget');
		expect(r1.plan.budget.total).toBe(12000);
		session.edit((p) => (p.budget.total = 9000));
		await session.saveRevision('');
		expect(session.revisions.map((r) => r.label)).toEqual(['tighter budget', 'Revision 2']);
		session.replacePlan(r1.plan, r1.results);
		await session.flush();
		expect((await store.get(rec.id))!.plan.budget.total).toBe(12000);
		expect((await store.listRevisions(rec.id)).length).toBe(2);
		session.destroy();
	});

	it('notifies listeners on plan edits but not on stored results', async () => {
		const rec = await store.create(load('demo'));
		const session = (await PlanSession.open(store, rec.id))!;
		let calls = 0;
		const off = session.onPlanChange(() => calls++);
		session.edit((p) => (p.title = 'x'));
		session.setResult('check', null, {}, {});
		expect(calls).toBe(1);
		off();
		session.edit((p) => (p.title = 'y'));
		expect(calls).toBe(1);
		session.destroy();
	});

	it('does not open a deleted or missing plan', async () => {
		const rec = await store.create(load('demo'));
		await store.softDelete(rec.id);
		expect(await PlanSession.open(store, rec.id)).toBeUndefined();
		expect(await PlanSession.open(store, 'missing')).toBeUndefined();
	});
});

/** The real engine handlers served in this process, behind the same protocol as the worker. */
class InProcessEngine implements WorkerLike {
	onmessage: ((event: { data: TaskReply }) => void) | null = null;
	onerror: ((event: { message?: string }) => void) | null = null;
	private serve = createTaskServer(handlers, (reply) => setTimeout(() => this.onmessage?.({ data: structuredClone(reply) }), 0));
	postMessage(request: TaskRequest) {
		const copy = structuredClone(request);
		setTimeout(() => void this.serve(copy), 0);
	}
	terminate() {}
}

describe('live verdicts through the engine protocol', () => {
	it('agree with calling checkPlan directly, follow edits, and store a summary', async () => {
		const plan = load('multi-context');
		plan.goal.route = 'targeted';
		const rec = await store.create(plan);
		const session = (await PlanSession.open(store, rec.id))!;
		const pool = new EnginePool<EngineHandlers>({ size: 1, createWorker: () => new InProcessEngine() });
		const verdicts = new VerdictRunner(session, pool, 10);
		const settle = async () => {
			for (let i = 0; i < 200 && !verdicts.current; i++) await sleep(10);
			expect(verdicts.current).toBe(true);
		};
		await settle();
		const direct = JSON.parse(JSON.stringify(checkPlan(session.snapshot())));
		expect(verdicts.check.result).toEqual(direct);
		expect(verdicts.check.result!.factors.find((f) => f.id === 'diff')!.verdict).toBe('individual');

		// g1 now also targets diff: only g3 and g4 avoid diff, which cannot span the three
		// other factors, so diff falls into a block with prol (rank argument of DESIGN.md).
		session.edit((p) => setTargets(p, 'g1', ['prol', 'diff']));
		await settle();
		const diff = verdicts.check.result!.factors.find((f) => f.id === 'diff')!;
		expect(diff.verdict).toBe('block');
		expect(diff.block).toEqual(['prol', 'diff']);
		expect(verdicts.check.result).toEqual(JSON.parse(JSON.stringify(checkPlan(session.snapshot()))));
		expect(session.resultFor('check')!.result.summary).toEqual(summarizeCheck(verdicts.check.result!));
		expect(verdicts.cost.result!.total).toBeGreaterThan(0);

		verdicts.destroy();
		pool.destroy();
		await session.flush();
		session.destroy();
	});
});
