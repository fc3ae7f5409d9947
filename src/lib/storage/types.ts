import type { Plan } from '$core/plan/types';

/**
 * A result a notebook section computed from the plan (verdicts, simulation, sizing, layout…).
 * `inputHash` is `planInputHash(plan)` at the time it was computed: when the plan's inputs
 * change, the hash differs and the result is shown as stale (never silently reused).
 */
export interface StoredResult {
	/** Which section produced it, e.g. "check", "simulate", "size". */
	kind: string;
	createdAt: number;
	/** Seed of a random computation; null when the computation is deterministic. */
	seed: number | null;
	/** The options it ran with (plain, serialisable). */
	settings: Record<string, unknown>;
	/** The result itself, in the producing section's own plain shape. */
	summary: unknown;
	inputHash: string;
}

/** The working copy of a plan (table `plans`). Autosaved; soft-deleted with `deletedAt`. */
export interface PlanRecord {
	id: string;
	/** Copy of `plan.title`, kept for listing without reading the whole plan. */
	title: string;
	createdAt: number;
	/** Milliseconds since 1970; strictly increases with every write (conflict detection). */
	updatedAt: number;
	plan: Plan;
	results: Record<string, StoredResult>;
	/** Set when the plan was deleted; it can be restored until it is purged. */
	deletedAt?: number;
}

/** An immutable snapshot of a plan and its results (table `revisions`). Never updated. */
export interface RevisionRecord {
	id: string;
	planId: string;
	/** 1, 2, 3… per plan, in the order they were saved. */
	number: number;
	label: string;
	createdAt: number;
	plan: Plan;
	results: Record<string, StoredResult>;
}

/** Outcome of an autosave: written, or refused because the stored copy changed meanwhile. */
export type SaveOutcome =
	| { ok: true; record: PlanRecord }
	| { ok: false; reason: 'conflict'; stored: PlanRecord }
	| { ok: false; reason: 'missing' };

/** Row of the plans list. */
export interface PlanSummary {
	id: string;
	title: string;
	createdAt: number;
	updatedAt: number;
	factors: number;
	reagents: number;
	contexts: number;
	revisions: number;
	/** Stored results by kind, each with whether it is stale against the current inputs. */
	results: { kind: string; stale: boolean; result: StoredResult }[];
}
