/**
 * The typed message protocol between the notebook and its engine workers.
 *
 * Request (page → worker):  `{ id, type, payload }` — `type` names a handler in `handlers.ts`.
 * Replies (worker → page):  `{ id, type: 'progress', progress }` any number of times, then
 *                           exactly one `{ id, type: 'result', result }` or
 *                           `{ id, type: 'error', error }`.
 * Every payload and result is plain data (structured-clone safe).
 */

/** Progress of a long task: `done` of `total` units, with an optional short note. */
export interface Progress {
	done: number;
	total: number;
	note?: string;
}

/** An error returned as data. `issues` carries a plan's field problems (PlanError). */
export interface TaskError {
	name: string;
	message: string;
	issues?: { path: string; message: string }[];
}

export interface TaskRequest {
	id: number;
	type: string;
	payload: unknown;
}

export type TaskReply =
	| { id: number; type: 'progress'; progress: Progress }
	| { id: number; type: 'result'; result: unknown }
	| { id: number; type: 'error'; error: TaskError };

/** A task handler: plain payload in, plain result out; may report progress. */
export type Handler<P = any, R = unknown> = (payload: P, progress: (p: Progress) => void) => R | Promise<R>;

/** A registry of handlers by task type. */
export type HandlerRegistry = Record<string, Handler>;

/** What a task ends with: its result, an error, or a cancellation — never a thrown error. */
export type TaskOutcome<R> =
	| { ok: true; result: R }
	| { ok: false; cancelled: false; error: TaskError }
	| { ok: false; cancelled: true; error: TaskError };

/** Turns anything thrown into plain error data. */
export function toTaskError(err: unknown): TaskError {
	if (err instanceof Error) {
		const issues = (err as { issues?: unknown }).issues;
		const out: TaskError = { name: err.name, message: err.message };
		if (Array.isArray(issues)) out.issues = issues.map((i) => ({ path: String(i?.path ?? ''), message: String(i?.message ?? '') }));
		return out;
	}
	return { name: 'Error', message: String(err) };
}
