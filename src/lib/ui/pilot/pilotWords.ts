/** Words and numbers of the Pilot section (pure helpers, unit-tested). */
import type { PilotProblem } from './pilotTasks';

/** What the plan assumed when a pilot was read (kept in the pilot result's settings). */
export interface PlannedValues {
	replicateNoise: number;
	measurementNoise: number;
	plateEffect: number;
	factors: number;
}

/** The settings stored with a pilot result (`session.setResult('pilot', seed, settings, estimates)`). */
export interface PilotSettings {
	file: string;
	bytes: number;
	planned: PlannedValues;
	/** Revision saved just before the pilot was applied, and the one with the pilot applied; null until applied. */
	beforeRevision: number | null;
	afterRevision: number | null;
}

export type Tone = 'good' | 'warn' | 'bad' | 'neutral';

/**
 * A pilot estimate set against the plan's assumed value: "0.58 × the plan" with a tone —
 * within ±25 % good, within a factor of 2 warn, beyond bad. The bands are common practice for
 * reading a pilot, not a published rule.
 */
export function ratioWords(estimate: number | null, planned: number): { text: string; tone: Tone } {
	if (estimate === null || !Number.isFinite(estimate)) return { text: 'not estimable from this pilot', tone: 'neutral' };
	if (!(planned > 0)) return { text: 'the plan assumes 0', tone: 'neutral' };
	const r = estimate / planned;
	const text = `${r.toFixed(2)} × the plan`;
	if (r >= 0.75 && r <= 1.25) return { text: `${text} (within ±25 %)`, tone: 'good' };
	if (r >= 0.5 && r <= 2) return { text: `${text} (within a factor of 2)`, tone: 'warn' };
	return { text: `${text} (more than a factor of 2 off)`, tone: 'bad' };
}

/** A file size for people: "512 bytes", "48.2 kB", "103.5 MB" (powers of 1000). */
export function bytesText(n: number): string {
	if (!Number.isFinite(n) || n < 0) return '—';
	if (n < 1000) return `${n} byte${n === 1 ? '' : 's'}`;
	const units = ['kB', 'MB', 'GB'];
	let v = n / 1000;
	let i = 0;
	while (v >= 1000 && i < units.length - 1) {
		v /= 1000;
		i++;
	}
	return `${v.toFixed(1)} ${units[i]}`;
}

/** A pilot-file problem as one sentence with its place: `demo.csv, line 12, column "f3": expected …, got "x".` */
export function problemText(problem: PilotProblem, fileName: string): string {
	const where = [fileName, problem.line === null ? null : `line ${problem.line}`, problem.column === null ? null : `column “${problem.column}”`].filter(Boolean).join(', ');
	return `${where}: expected ${problem.expected}${problem.got ? `, got ${problem.got}` : ''}.`;
}
