import { parsePlan, serializePlan, type Plan } from '$core/plan';
import { planInputHash } from '$core/plan/hashPlan';
import { IdentiplateDb, SEEDED_KEY } from './db';
import { newId } from './newId';
import type { PlanRecord, PlanSummary, RevisionRecord, SaveOutcome, StoredResult } from './types';

/** Options of a `PlanStore`. */
export interface PlanStoreOptions {
	/** Clock in milliseconds since 1970 (default `Date.now`); injected by tests. */
	now?: () => number;
}

/** Deleted plans older than this are purged by `purgeDeleted()` when no age is given: one day. */
export const PURGE_AFTER_MS = 24 * 60 * 60 * 1000;

const clone = <T>(value: T): T => structuredClone(value);

/**
 * Plans, their results and their revisions in IndexedDB. The only writer of the database.
 *
 * Rules it keeps:
 * - never silently overwrite: `save` writes only when the stored `updatedAt` is the one the
 *   caller loaded, and otherwise returns the stored copy as a conflict;
 * - revisions are immutable: there is no method that changes one;
 * - import always creates a new plan; delete is soft (`restore` undoes it) until `purgeDeleted`.
 * Every plan written is validated with `parsePlan` first (a `PlanError` names the field).
 */
export class PlanStore {
	readonly db: IdentiplateDb;
	private readonly now: () => number;

	constructor(db: IdentiplateDb, options: PlanStoreOptions = {}) {
		this.db = db;
		this.now = options.now ?? Date.now;
	}

	/** Plans that are not deleted, most recently changed first. */
	async list(): Promise<PlanSummary[]> {
		const records = await this.db.plans.orderBy('updatedAt').reverse().toArray();
		const live = records.filter((r) => r.deletedAt === undefined);
		const counts = new Map<string, number>();
		await this.db.revisions.each((rev) => counts.set(rev.planId, (counts.get(rev.planId) ?? 0) + 1));
		return live.map((r) => {
			const hash = planInputHash(r.plan);
			return {
				id: r.id,
				title: r.title,
				createdAt: r.createdAt,
				updatedAt: r.updatedAt,
				factors: r.plan.factors.length,
				reagents: r.plan.reagents.length,
				contexts: r.plan.contexts.length,
				revisions: counts.get(r.id) ?? 0,
				results: Object.values(r.results).map((result) => ({ kind: result.kind, stale: result.inputHash !== hash, result }))
			};
		});
	}

	/** The stored working copy (also when soft-deleted; check `deletedAt`), or undefined. */
	async get(id: string): Promise<PlanRecord | undefined> {
		return this.db.plans.get(id);
	}

	/** Stores a new plan (validated) and returns its record. */
	async create(plan: Plan, results: Record<string, StoredResult> = {}): Promise<PlanRecord> {
		const valid = parsePlan(clone(plan));
		const t = this.now();
		const record: PlanRecord = { id: newId(), title: valid.title, createdAt: t, updatedAt: t, plan: valid, results: clone(results) };
		await this.db.plans.add(record);
		return record;
	}

	/**
	 * Autosave of the working copy. Writes `plan` and `results` only if the stored record's
	 * `updatedAt` equals `expectedUpdatedAt` (the version this tab loaded or last wrote);
	 * otherwise nothing is written and the stored record is returned as a conflict.
	 * The plan is validated first (throws `PlanError`).
	 */
	async save(id: string, plan: Plan, results: Record<string, StoredResult>, expectedUpdatedAt: number): Promise<SaveOutcome> {
		const valid = parsePlan(clone(plan));
		const copy = clone(results);
		return this.db.transaction('rw', this.db.plans, async (): Promise<SaveOutcome> => {
			const stored = await this.db.plans.get(id);
			if (!stored) return { ok: false, reason: 'missing' };
			if (stored.updatedAt !== expectedUpdatedAt) return { ok: false, reason: 'conflict', stored };
			const record: PlanRecord = {
				...stored,
				title: valid.title,
				plan: valid,
				results: copy,
				updatedAt: Math.max(this.now(), stored.updatedAt + 1)
			};
			await this.db.plans.put(record);
			return { ok: true, record };
		});
	}

	/** A new plan with the same inputs and results, titled "… (copy)". Revisions stay with the original. */
	async duplicate(id: string): Promise<PlanRecord> {
		const source = await this.db.plans.get(id);
		if (!source) throw new Error(`no plan with id "${id}"`);
		const plan = clone(source.plan);
		plan.title = copyTitle(plan.title);
		return this.create(plan, source.results);
	}

	/** Reads plan-file text (validated, older versions migrated) into a new plan. Throws `PlanError`. */
	async importText(text: string): Promise<PlanRecord> {
		return this.create(parsePlan(text));
	}

	/** Plan-file text of a stored plan (the canonical `serializePlan` form). */
	async exportText(id: string): Promise<string> {
		const record = await this.db.plans.get(id);
		if (!record) throw new Error(`no plan with id "${id}"`);
		return serializePlan(record.plan);
	}

	/** Soft delete: hidden from the list, restorable with `restore` until purged. */
	async softDelete(id: string): Promise<void> {
		await this.db.plans.update(id, { deletedAt: this.now() });
	}

	/** Undoes a soft delete. */
	async restore(id: string): Promise<void> {
		await this.db.transaction('rw', this.db.plans, async () => {
			const record = await this.db.plans.get(id);
			if (!record) throw new Error(`plan "${id}" was already purged and cannot be restored`);
			delete record.deletedAt;
			await this.db.plans.put(record);
		});
	}

	/** Deletes for good the plans soft-deleted at least `olderThanMs` ago, with their revisions. Returns how many. */
	async purgeDeleted(olderThanMs: number = PURGE_AFTER_MS): Promise<number> {
		const cutoff = this.now() - olderThanMs;
		return this.db.transaction('rw', this.db.plans, this.db.revisions, async () => {
			const doomed = await this.db.plans.where('deletedAt').belowOrEqual(cutoff).primaryKeys();
			for (const id of doomed) await this.db.revisions.where('planId').equals(id).delete();
			await this.db.plans.bulkDelete(doomed);
			return doomed.length;
		});
	}

	/**
	 * Stores `plans` on the very first start (nothing stored and never seeded before) and marks
	 * the database as seeded. Returns the records created (empty when it did nothing).
	 */
	async seedIfEmpty(plans: Plan[]): Promise<PlanRecord[]> {
		const doSeed = await this.db.transaction('rw', this.db.plans, this.db.meta, async () => {
			const seeded = await this.db.meta.get(SEEDED_KEY);
			if (seeded) return false;
			await this.db.meta.put({ key: SEEDED_KEY, value: true });
			return (await this.db.plans.count()) === 0;
		});
		if (!doSeed) return [];
		const created: PlanRecord[] = [];
		for (const plan of plans) created.push(await this.create(plan));
		return created;
	}

	/**
	 * Saves an immutable snapshot of the stored working copy (plan and results) as the next
	 * revision of the plan. Save the working copy first so the snapshot holds the latest edits.
	 */
	async addRevision(planId: string, label: string): Promise<RevisionRecord> {
		return this.db.transaction('rw', this.db.plans, this.db.revisions, async () => {
			const record = await this.db.plans.get(planId);
			if (!record) throw new Error(`no plan with id "${planId}"`);
			const last = await this.db.revisions.where('[planId+number]').between([planId, 0], [planId, Infinity]).last();
			const revision: RevisionRecord = {
				id: newId(),
				planId,
				number: (last?.number ?? 0) + 1,
				label: label.trim() || `Revision ${(last?.number ?? 0) + 1}`,
				createdAt: this.now(),
				plan: clone(record.plan),
				results: clone(record.results)
			};
			await this.db.revisions.add(revision);
			return revision;
		});
	}

	/** Revisions of a plan, oldest first. */
	async listRevisions(planId: string): Promise<RevisionRecord[]> {
		return this.db.revisions.where('[planId+number]').between([planId, 0], [planId, Infinity]).toArray();
	}

	async getRevision(id: string): Promise<RevisionRecord | undefined> {
		return this.db.revisions.get(id);
	}
}

/** "Title" → "Title (copy)", "Title (copy)" → "Title (copy 2)", and so on. */
export function copyTitle(title: string): string {
	const m = /^(.*) \(copy(?: (\d+))?\)$/.exec(title);
	if (!m) return `${title} (copy)`;
	const n = m[2] ? Number(m[2]) + 1 : 2;
	return `${m[1]} (copy ${n})`;
}

/** A stored result for `plan`, stamped with the plan's current input hash. */
export function makeResult(plan: Plan, kind: string, seed: number | null, settings: Record<string, unknown>, summary: unknown, createdAt: number): StoredResult {
	return { kind, createdAt, seed, settings, summary, inputHash: planInputHash(plan) };
}

/** Whether a stored result was computed from inputs other than `plan`'s current ones. */
export function isStale(result: StoredResult, plan: Plan): boolean {
	return result.inputHash !== planInputHash(plan);
}
