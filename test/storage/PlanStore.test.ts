import 'fake-indexeddb/auto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import Dexie from 'dexie';
import { parsePlan, PlanError, serializePlan, type Plan } from '../../src/lib/core/plan';
import { planInputHash } from '../../src/lib/core/plan/hashPlan';
import { IdentiplateDb, PlanStore, SCHEMA, SCHEMA_VERSION, SEEDED_KEY, copyTitle, isStale, makeResult } from '../../src/lib/storage';

const demoText = readFileSync('templates/demo.json', 'utf8');
const demo = (): Plan => parsePlan(demoText);

let dbName: string;
let db: IdentiplateDb;
let store: PlanStore;
let clock: number;
let counter = 0;

beforeEach(() => {
	dbName = `test-${++counter}-${Date.now()}`;
	db = new IdentiplateDb(dbName);
	clock = 1_700_000_000_000;
	store = new PlanStore(db, { now: () => clock });
});
afterEach(async () => {
	db.close();
	await Dexie.delete(dbName);
});

describe('plans', () => {
	it('creates, lists and reads back a plan unchanged', async () => {
		const rec = await store.create(demo());
		expect(rec.id).toMatch(/^[a-z2-9]{12}$/);
		expect(rec.title).toBe(demo().title);
		const list = await store.list();
		expect(list.map((p) => p.id)).toEqual([rec.id]);
		expect(list[0]).toMatchObject({ factors: 6, reagents: 20, contexts: 0, revisions: 0 });
		const back = await store.get(rec.id);
		expect(serializePlan(back!.plan)).toBe(demoText);
	});

	it('refuses to store an invalid plan, naming the field', async () => {
		const bad = demo() as any;
		bad.reagents[0].efficacy = 0;
		await expect(store.create(bad)).rejects.toThrow(PlanError);
		await expect(store.create(bad)).rejects.toThrow(/reagents\[0\]\.efficacy/);
		expect(await store.list()).toEqual([]);
	});

	it('lists the most recently changed plan first', async () => {
		const a = await store.create(demo());
		clock += 10;
		const b = await store.create(demo());
		expect((await store.list()).map((p) => p.id)).toEqual([b.id, a.id]);
		clock += 10;
		const plan = demo();
		plan.title = 'edited';
		await store.save(a.id, plan, {}, a.updatedAt);
		expect((await store.list()).map((p) => p.id)).toEqual([a.id, b.id]);
	});
});

describe('autosave never silently overwrites', () => {
	it('saves when the stored version is the one loaded, and updatedAt strictly increases', async () => {
		const rec = await store.create(demo());
		const plan = demo();
		plan.notes = 'first edit';
		const first = await store.save(rec.id, plan, {}, rec.updatedAt);
		expect(first.ok).toBe(true);
		if (!first.ok) return;
		// Same millisecond: the stamp still moves on, so a second tab's copy is detected as old.
		expect(first.record.updatedAt).toBe(rec.updatedAt + 1);
		plan.notes = 'second edit';
		const second = await store.save(rec.id, plan, {}, first.record.updatedAt);
		expect(second.ok).toBe(true);
		expect((await store.get(rec.id))!.plan.notes).toBe('second edit');
	});

	it('reports a conflict and writes nothing when another tab saved in between', async () => {
		const rec = await store.create(demo());
		const tabA = demo();
		const tabB = demo();
		tabA.notes = 'from tab A';
		tabB.notes = 'from tab B';
		clock += 5;
		const a = await store.save(rec.id, tabA, {}, rec.updatedAt);
		expect(a.ok).toBe(true);
		const b = await store.save(rec.id, tabB, {}, rec.updatedAt);
		expect(b.ok).toBe(false);
		if (b.ok || b.reason !== 'conflict') throw new Error('expected a conflict');
		expect(b.stored.plan.notes).toBe('from tab A');
		expect((await store.get(rec.id))!.plan.notes).toBe('from tab A');
	});

	it('reports a missing plan', async () => {
		expect(await store.save('nope', demo(), {}, 0)).toEqual({ ok: false, reason: 'missing' });
	});

	it('does not keep references to the caller objects', async () => {
		const rec = await store.create(demo());
		const plan = demo();
		const results = { check: makeResult(plan, 'check', null, {}, { individual: 6 }, clock) };
		await store.save(rec.id, plan, results, rec.updatedAt);
		plan.title = 'mutated after save';
		(results.check.summary as any).individual = 0;
		const back = await store.get(rec.id);
		expect(back!.plan.title).toBe(demo().title);
		expect((back!.results.check.summary as any).individual).toBe(6);
	});
});

describe('results and staleness', () => {
	it('marks a result stale exactly when the plan inputs change', async () => {
		const plan = demo();
		const result = makeResult(plan, 'check', null, { route: 'targeted' }, { individual: 6 }, clock);
		expect(result.inputHash).toBe(planInputHash(plan));
		const rec = await store.create(plan, { check: result });
		expect((await store.list())[0].results).toEqual([{ kind: 'check', stale: false, result }]);

		const notesOnly = demo();
		notesOnly.notes = 'prose does not matter';
		notesOnly.sectionNotes = { factors: 'neither do section notes' };
		expect(isStale(result, notesOnly)).toBe(false);

		const changed = demo();
		changed.reagents[0].costPerWell = 3.3;
		expect(isStale(result, changed)).toBe(true);
		await store.save(rec.id, changed, { check: result }, rec.updatedAt);
		expect((await store.list())[0].results[0].stale).toBe(true);
	});
});

describe('duplicate, import, export', () => {
	it('duplicates with a copy title and the same inputs', async () => {
		const rec = await store.create(demo());
		const dup = await store.duplicate(rec.id);
		expect(dup.id).not.toBe(rec.id);
		expect(dup.title).toBe(`${demo().title} (copy)`);
		const again = await store.duplicate(dup.id);
		expect(again.title).toBe(`${demo().title} (copy 2)`);
		expect(planInputHash(dup.plan)).toBe(planInputHash(rec.plan));
		expect(await store.listRevisions(dup.id)).toEqual([]);
	});

	it('copyTitle counts up', () => {
		expect(copyTitle('A')).toBe('A (copy)');
		expect(copyTitle('A (copy)')).toBe('A (copy 2)');
		expect(copyTitle('A (copy 9)')).toBe('A (copy 10)');
	});

	it('export then import gives an identical file and always a new plan', async () => {
		const rec = await store.create(demo());
		const text = await store.exportText(rec.id);
		expect(text).toBe(demoText);
		const imported = await store.importText(text);
		expect(imported.id).not.toBe(rec.id);
		expect(await store.exportText(imported.id)).toBe(text);
		expect((await store.list()).length).toBe(2);
	});

	it('import of an invalid file throws a PlanError with the JSON path and stores nothing', async () => {
		const bad = JSON.parse(demoText);
		bad.reagents[3].targets = ['resp', 'f9'];
		await expect(store.importText(JSON.stringify(bad))).rejects.toThrow(/^reagents\[3\]\.targets\[1\]: unknown factor "f9"/);
		await expect(store.importText('{ not json')).rejects.toThrow(/not valid JSON/);
		expect(await store.list()).toEqual([]);
	});
});

describe('delete with undo', () => {
	it('soft delete hides the plan, restore brings it back unchanged', async () => {
		const rec = await store.create(demo());
		await store.softDelete(rec.id);
		expect(await store.list()).toEqual([]);
		expect((await store.get(rec.id))!.deletedAt).toBe(clock);
		await store.restore(rec.id);
		const back = await store.get(rec.id);
		expect(back!.deletedAt).toBeUndefined();
		expect((await store.list()).map((p) => p.id)).toEqual([rec.id]);
		expect(back!.updatedAt).toBe(rec.updatedAt);
	});

	it('purges only plans deleted long enough ago, with their revisions', async () => {
		const old = await store.create(demo());
		const recent = await store.create(demo());
		const kept = await store.create(demo());
		await store.addRevision(old.id, 'r1');
		await store.addRevision(kept.id, 'k1');
		await store.softDelete(old.id);
		clock += 5_000;
		await store.softDelete(recent.id);
		expect(await store.purgeDeleted(1_000)).toBe(1);
		expect(await store.get(old.id)).toBeUndefined();
		expect(await store.listRevisions(old.id)).toEqual([]);
		expect(await store.get(recent.id)).toBeDefined();
		expect((await store.listRevisions(kept.id)).length).toBe(1);
		await expect(store.restore(old.id)).rejects.toThrow(/already purged/);
	});
});

describe('revisions are immutable snapshots', () => {
	it('numbers revisions per plan and snapshots the stored plan and results', async () => {
		const plan = demo();
		const rec = await store.create(plan, { check: makeResult(plan, 'check', null, {}, { individual: 6 }, clock) });
		const r1 = await store.addRevision(rec.id, 'before pilot');
		const edited = demo();
		edited.notes = 'after';
		await store.save(rec.id, edited, {}, rec.updatedAt);
		const r2 = await store.addRevision(rec.id, '  ');
		expect([r1.number, r2.number]).toEqual([1, 2]);
		expect(r2.label).toBe('Revision 2');
		const list = await store.listRevisions(rec.id);
		expect(list.map((r) => r.label)).toEqual(['before pilot', 'Revision 2']);
		expect(list[0].plan.notes).toBe(demo().notes);
		expect(Object.keys(list[0].results)).toEqual(['check']);
		expect(list[1].plan.notes).toBe('after');
		expect(list[1].results).toEqual({});
	});

	it('the store offers no way to change a revision', () => {
		const methods = Object.getOwnPropertyNames(PlanStore.prototype);
		expect(methods.filter((m) => /revision/i.test(m)).sort()).toEqual(['addRevision', 'getRevision', 'listRevisions']);
	});

	it('the database refuses update, modify and put over an existing revision', async () => {
		const rec = await store.create(demo());
		const rev = await store.addRevision(rec.id, 'one');
		await expect(db.revisions.update(rev.id, { label: 'changed' })).rejects.toThrow(/immutable/);
		await expect(db.revisions.toCollection().modify({ label: 'changed' })).rejects.toThrow(/immutable/);
		await expect(db.revisions.put({ ...rev, label: 'changed' })).rejects.toThrow(/immutable/);
		expect((await store.getRevision(rev.id))!.label).toBe('one');
	});
});

describe('first start', () => {
	it('seeds the given plans once, and never again after they are deleted', async () => {
		const seeded = await store.seedIfEmpty([demo()]);
		expect(seeded.length).toBe(1);
		expect(await store.seedIfEmpty([demo()])).toEqual([]);
		await store.softDelete(seeded[0].id);
		await store.purgeDeleted(0);
		expect(await store.list()).toEqual([]);
		expect(await store.seedIfEmpty([demo()])).toEqual([]);
	});
});

describe('schema versions', () => {
	it('the schema list is in order and the current version is the last', () => {
		expect(SCHEMA.map((s) => s.version)).toEqual([...SCHEMA.map((s) => s.version)].sort((a, b) => a - b));
		expect(SCHEMA_VERSION).toBe(SCHEMA[SCHEMA.length - 1].version);
		expect(db.verno).toBe(SCHEMA_VERSION);
	});

	it('upgrades a version-1 database: results added, title copied, marked as seeded', async () => {
		const name = `${dbName}-v1`;
		const v1 = new Dexie(name);
		v1.version(1).stores(SCHEMA[0].stores);
		const plan = demo();
		await v1.table('plans').add({ id: 'old1', title: 'stale title', createdAt: 1, updatedAt: 2, plan });
		await v1.table('revisions').add({ id: 'rev1', planId: 'old1', number: 1, label: 'kept', createdAt: 3, plan, results: {} });
		v1.close();

		const upgraded = new IdentiplateDb(name);
		const upgradedStore = new PlanStore(upgraded, { now: () => clock });
		try {
			const rec = await upgradedStore.get('old1');
			expect(upgraded.verno).toBe(SCHEMA_VERSION);
			expect(rec!.results).toEqual({});
			expect(rec!.title).toBe(plan.title);
			expect((await upgraded.meta.get(SEEDED_KEY))?.value).toBe(true);
			expect(await upgradedStore.seedIfEmpty([demo()])).toEqual([]);
			expect((await upgradedStore.listRevisions('old1')).map((r) => r.label)).toEqual(['kept']);
			expect((await upgradedStore.list()).map((p) => p.id)).toEqual(['old1']);
		} finally {
			upgraded.close();
			await Dexie.delete(name);
		}
	});

	it('an empty version-1 database is not marked as seeded, so the demo still arrives', async () => {
		const name = `${dbName}-v1-empty`;
		const v1 = new Dexie(name);
		v1.version(1).stores(SCHEMA[0].stores);
		await v1.open();
		v1.close();
		const upgraded = new IdentiplateDb(name);
		try {
			const s = new PlanStore(upgraded);
			expect((await s.seedIfEmpty([demo()])).length).toBe(1);
		} finally {
			upgraded.close();
			await Dexie.delete(name);
		}
	});
});
