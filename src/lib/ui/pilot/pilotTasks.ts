/**
 * Task handlers of the pilot worker (`src/lib/workers/pilot.worker.ts`), typed for
 * `EnginePool<PilotHandlers>` like the engine's `handlers.ts`:
 * - `analyse`: streams the CSV into the pilot reader (progress per chunk), then estimates noise,
 *   plate effect, effects, signal dimension and Z′. Bad input comes back as data
 *   (`{ ok: false, problem }` with line and column), not as a thrown error.
 * - `apply`: the re-planned plan (`applyPilot`) for a new revision.
 * Pure: no DOM; Node tests call the handlers directly with a string input.
 */
import { analysePilot } from '$core/pilot/analysePilot';
import { applyPilot } from '$core/pilot/applyPilot';
import { PilotError } from '$core/pilot/PilotError';
import type { PilotEstimates, PilotKind } from '$core/pilot/types';
import type { Plan } from '$core/plan/types';
import type { Handler, Progress } from '$lib/workers/protocol';
import { streamPilot } from './streamPilot';

export interface AnalysePilotPayload {
	plan: Plan;
	/** The CSV: a File or Blob in the browser, its text in tests. */
	input: Blob | string;
	/** Seed of the label permutations (default 1). */
	seed?: number;
	/** One row per well or per cell; default: decided from the file. */
	kind?: 'auto' | PilotKind;
	/** Characters per chunk (default 1 MiB). */
	chunkSize?: number;
}

/** A problem with the pilot file, as data: where (line and column) and what was expected. */
export interface PilotProblem {
	/** CSV record number, header = 1; null when the file could not be read at all. */
	line: number | null;
	/** Column name (or `#N`), or null when the problem concerns a whole row or file. */
	column: string | null;
	expected: string;
	got: string;
	message: string;
}

export type AnalysePilotResult = { ok: true; estimates: PilotEstimates; seed: number; lines: number } | { ok: false; problem: PilotProblem };

/** Progress note while the file is read (then the estimates are computed). */
export const READING = 'reading';
export const ESTIMATING = 'estimating';

function problemOf(err: unknown): PilotProblem {
	if (err instanceof PilotError) return { line: err.line, column: err.column, expected: err.expected, got: err.got, message: err.message };
	throw err;
}

export async function analysePilotTask(payload: AnalysePilotPayload, progress: (p: Progress) => void = () => {}): Promise<AnalysePilotResult> {
	const seed = payload.seed ?? 1;
	let lines = 0;
	try {
		const table = await streamPilot(payload.plan, payload.input, { kind: payload.kind ?? 'auto', chunkSize: payload.chunkSize }, (p) => {
			lines = p.lines;
			progress({ done: p.read, total: p.total, note: READING });
		});
		progress({ done: 0, total: 0, note: ESTIMATING });
		const estimates = analysePilot(payload.plan, table, { seed });
		return { ok: true, estimates, seed, lines };
	} catch (err) {
		return { ok: false, problem: problemOf(err) };
	}
}

export const pilotHandlers = {
	/** Reads a pilot CSV in chunks and estimates from it. */
	analyse: (payload: AnalysePilotPayload, progress: (p: Progress) => void) => analysePilotTask(payload, progress),
	/** The plan re-planned with the pilot's estimates (the input plan is not changed). */
	apply: ({ plan, estimates }: { plan: Plan; estimates: PilotEstimates }) => applyPilot(plan, estimates)
} satisfies Record<string, Handler>;

export type PilotHandlers = typeof pilotHandlers;
