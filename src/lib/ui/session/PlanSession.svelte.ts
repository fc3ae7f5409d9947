/**
 * The open plan of the notebook: its live (reactive) state, autosave, results and revisions.
 *
 * Sections change the plan only through `edit(fn)` (or `replacePlan`), which schedules an
 * autosave and tells listeners (the verdict runner, other sections' runners) that the inputs
 * changed. A section stores what it computed with `setResult(kind, …)` and reads it back with
 * `resultFor(kind)`, which says whether it is stale (computed from other inputs).
 *
 * Autosave never overwrites someone else's write: it saves only if the stored copy is still
 * the one this tab loaded; otherwise it stops and `conflict` holds the stored copy, and the
 * notebook offers to load it (dropping this tab's edits) or to save this tab's version as a copy.
 */
import { validatePlan, type Plan, type PlanIssue } from '$core/plan';
import { planInputHash } from '$core/plan/hashPlan';
import { makeResult, type PlanRecord, type PlanStore, type RevisionRecord, type StoredResult } from '$lib/storage';

export type SaveState = 'saved' | 'pending' | 'saving' | 'conflict' | 'invalid' | 'error';

/** Autosave delay after the last edit, in milliseconds. */
export const AUTOSAVE_DELAY_MS = 400;

export class PlanSession {
	readonly id: string;
	readonly createdAt: number;
	/** The working copy; mutate it only inside `edit`. */
	plan: Plan = $state() as Plan;
	/** Stored results by kind (plain data, replaced as a whole). */
	results: Record<string, StoredResult> = $state.raw({});
	/** Saved revisions, oldest first. */
	revisions: RevisionRecord[] = $state.raw([]);
	saveState: SaveState = $state('saved');
	/** When the working copy was last written (ms since 1970). */
	savedAt: number = $state(0);
	saveError: string | null = $state(null);
	/** The stored copy that another tab or window wrote after this tab loaded (autosave stops). */
	conflict: PlanRecord | null = $state.raw(null);
	/** Problems that keep the plan from being valid (shown; autosave waits until fixed). */
	readonly issues: PlanIssue[] = $derived(validatePlan(this.plan));
	/** Hash of the plan's inputs (see `planInputHash`); results with another hash are stale. */
	readonly inputHash: string = $derived(planInputHash(this.plan));

	private readonly store: PlanStore;
	private loadedUpdatedAt: number;
	private timer: ReturnType<typeof setTimeout> | undefined;
	private editSeq = 0;
	private savedSeq = 0;
	private saving: Promise<void> | null = null;
	private readonly listeners = new Set<() => void>();

	constructor(store: PlanStore, record: PlanRecord, revisions: RevisionRecord[] = []) {
		this.store = store;
		this.id = record.id;
		this.createdAt = record.createdAt;
		this.plan = structuredClone(record.plan);
		this.results = structuredClone(record.results);
		this.revisions = revisions;
		this.loadedUpdatedAt = record.updatedAt;
		this.savedAt = record.updatedAt;
	}

	/** Opens a stored plan; undefined when it does not exist or was deleted. */
	static async open(store: PlanStore, id: string): Promise<PlanSession | undefined> {
		const record = await store.get(id);
		if (!record || record.deletedAt !== undefined) return undefined;
		return new PlanSession(store, record, await store.listRevisions(id));
	}

	/** Calls `listener` after every change of the plan's contents; returns the unsubscribe function. */
	onPlanChange(listener: () => void): () => void {
		this.listeners.add(listener);
		return () => this.listeners.delete(listener);
	}

	/** Changes the plan: `change` mutates the live plan; returns what `change` returns. */
	edit<T>(change: (plan: Plan) => T): T {
		const out = change(this.plan);
		this.changed();
		return out;
	}

	/** Replaces the whole working copy (undo, restore a revision). */
	replacePlan(plan: Plan, results?: Record<string, StoredResult>): void {
		this.plan = structuredClone(plan);
		if (results) this.results = structuredClone(results);
		this.changed();
	}

	/** A deep plain copy of the working copy (for undo, workers and files). */
	snapshot(): Plan {
		return $state.snapshot(this.plan) as Plan;
	}

	/** Stores a section's result for the current inputs (replacing the previous one of that kind). */
	setResult(kind: string, seed: number | null, settings: Record<string, unknown>, summary: unknown): StoredResult {
		const result = makeResult(this.snapshot(), kind, seed, settings, summary, Date.now());
		this.results = { ...this.results, [kind]: result };
		this.editSeq++;
		this.scheduleSave();
		return result;
	}

	/** A stored result and whether it is stale (computed from other inputs than the current ones). */
	resultFor(kind: string): { result: StoredResult; stale: boolean } | undefined {
		const result = this.results[kind];
		return result ? { result, stale: result.inputHash !== this.inputHash } : undefined;
	}

	/** Writes pending changes now (used before a revision, an export or leaving the page). */
	async flush(): Promise<void> {
		clearTimeout(this.timer);
		this.timer = undefined;
		if (this.saving) await this.saving;
		if (this.editSeq !== this.savedSeq && this.saveState !== 'conflict') await this.save();
	}

	/** Saves the current working copy as the next immutable revision. */
	async saveRevision(label: string): Promise<RevisionRecord> {
		await this.flush();
		if (this.saveState === 'conflict') throw new Error('resolve the save conflict before saving a revision');
		if (this.issues.length) throw new Error(`fix the plan first: ${this.issues[0].path}: ${this.issues[0].message}`);
		const revision = await this.store.addRevision(this.id, label);
		this.revisions = [...this.revisions, revision];
		return revision;
	}

	/** Conflict: drop this tab's unsaved edits and continue from the stored copy. */
	loadStoredCopy(): void {
		const stored = this.conflict;
		if (!stored) return;
		this.conflict = null;
		this.loadedUpdatedAt = stored.updatedAt;
		this.savedAt = stored.updatedAt;
		this.plan = structuredClone(stored.plan);
		this.results = structuredClone(stored.results);
		this.savedSeq = ++this.editSeq;
		this.saveState = 'saved';
		for (const l of this.listeners) l();
	}

	/** Conflict: store this tab's version as a new plan; returns its id (the stored copy stays as it is). */
	async saveAsCopy(): Promise<string> {
		const plan = this.snapshot();
		plan.title = `${plan.title} (this tab's version)`;
		const record = await this.store.create(plan, $state.snapshot(this.results) as Record<string, StoredResult>);
		return record.id;
	}

	/** Stops autosave timers (the page is closing); call `flush` first to keep pending edits. */
	destroy(): void {
		clearTimeout(this.timer);
		this.listeners.clear();
	}

	private changed(): void {
		this.editSeq++;
		for (const l of this.listeners) l();
		this.scheduleSave();
	}

	private scheduleSave(): void {
		if (this.saveState === 'conflict') return;
		this.saveState = 'pending';
		clearTimeout(this.timer);
		this.timer = setTimeout(() => void this.save(), AUTOSAVE_DELAY_MS);
	}

	private async save(): Promise<void> {
		if (this.saving) {
			await this.saving;
			if (this.editSeq === this.savedSeq || this.saveState === 'conflict') return;
		}
		this.saving = this.write();
		try {
			await this.saving;
		} finally {
			this.saving = null;
		}
	}

	private async write(): Promise<void> {
		if (this.issues.length) {
			this.saveState = 'invalid';
			return;
		}
		const seq = this.editSeq;
		const plan = this.snapshot();
		const results = $state.snapshot(this.results) as Record<string, StoredResult>;
		this.saveState = 'saving';
		try {
			const outcome = await this.store.save(this.id, plan, results, this.loadedUpdatedAt);
			if (outcome.ok) {
				this.loadedUpdatedAt = outcome.record.updatedAt;
				this.savedAt = outcome.record.updatedAt;
				this.savedSeq = seq;
				this.saveError = null;
				this.saveState = this.editSeq === seq ? 'saved' : 'pending';
				if (this.editSeq !== seq) this.scheduleSave();
			} else if (outcome.reason === 'conflict') {
				this.conflict = outcome.stored;
				this.saveState = 'conflict';
			} else {
				this.saveState = 'error';
				this.saveError = 'This plan is no longer in the browser database (deleted in another tab?). Export it to keep your work.';
			}
		} catch (err) {
			this.saveState = 'error';
			this.saveError = (err as Error).message;
		}
	}
}
