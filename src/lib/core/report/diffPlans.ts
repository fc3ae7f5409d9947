import type { Plan } from '../plan/types';

/**
 * One field-level change between two plans.
 * - `path`: where, with collection members named by id: `observation.replicateNoise`,
 *   `reagents.kb101.effect`, `reagents` (for an added or removed member), `design.reagents`.
 * - `kind`: `added` / `removed` (a collection member, a design reagent or context, an optional
 *   field), `changed` (a value), `reordered` (same members in another order).
 * - `before` / `after`: the values (absent for added / removed respectively).
 * - `text`: the change in plain words, e.g. "observation.replicateNoise 0.5 → 0.62" or
 *   "reagents: added kb703 (KB-703 pair)".
 */
export interface PlanChange {
	path: string;
	kind: 'added' | 'removed' | 'changed' | 'reordered';
	before?: unknown;
	after?: unknown;
	text: string;
}

/** Longest string shown in full inside a change text; longer text is cut with an ellipsis. */
const TEXT_LIMIT = 80;

/** Compact display of a value for a change text (strings quoted and cut at 80 characters). */
export function showValue(value: unknown): string {
	if (value === undefined) return '(absent)';
	if (value === null) return 'none';
	if (typeof value === 'string') {
		const oneLine = value.replace(/\s+/g, ' ');
		return JSON.stringify(oneLine.length > TEXT_LIMIT ? oneLine.slice(0, TEXT_LIMIT - 1) + '…' : oneLine);
	}
	if (typeof value === 'number' || typeof value === 'boolean') return String(value);
	if (Array.isArray(value)) return `[${value.map(showValue).join(', ')}]`;
	const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined);
	return `{${entries.map(([k, v]) => `${k}: ${showValue(v)}`).join(', ')}}`;
}

function same(a: unknown, b: unknown): boolean {
	if (a === b) return true;
	if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
	if (Array.isArray(a) !== Array.isArray(b)) return false;
	if (Array.isArray(a)) {
		const bb = b as unknown[];
		return a.length === bb.length && a.every((x, i) => same(x, bb[i]));
	}
	const ka = Object.keys(a).filter((k) => (a as Record<string, unknown>)[k] !== undefined);
	const kb = Object.keys(b).filter((k) => (b as Record<string, unknown>)[k] !== undefined);
	return ka.length === kb.length && ka.every((k) => same((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
}

/** Field by field diff of two flat-ish records (one level; nested values compared whole). */
function diffFields(path: string, a: Record<string, unknown>, b: Record<string, unknown>, out: PlanChange[], skip: string[] = []) {
	const keys: string[] = [];
	for (const k of [...Object.keys(a), ...Object.keys(b)]) if (!keys.includes(k) && !skip.includes(k)) keys.push(k);
	for (const k of keys) {
		const before = a[k];
		const after = b[k];
		if (same(before, after)) continue;
		const p = `${path}.${k}`;
		if (before === undefined) out.push({ path: p, kind: 'added', after, text: `${p} set to ${showValue(after)}` });
		else if (after === undefined) out.push({ path: p, kind: 'removed', before, text: `${p} removed (was ${showValue(before)})` });
		else out.push({ path: p, kind: 'changed', before, after, text: `${p} ${showValue(before)} → ${showValue(after)}` });
	}
}

/** Members of a collection keyed by id: added, removed, changed field by field, reordered. */
function diffCollection<T extends { id: string; name?: string }>(path: string, a: readonly T[], b: readonly T[], out: PlanChange[]) {
	const before = new Map(a.map((x) => [x.id, x]));
	const after = new Map(b.map((x) => [x.id, x]));
	const label = (x: T) => (x.name ? `${x.id} (${x.name})` : x.id);
	for (const x of a) if (!after.has(x.id)) out.push({ path, kind: 'removed', before: x, text: `${path}: removed ${label(x)}` });
	for (const x of b) if (!before.has(x.id)) out.push({ path, kind: 'added', after: x, text: `${path}: added ${label(x)}` });
	for (const x of b) {
		const old = before.get(x.id);
		if (old) diffFields(`${path}.${x.id}`, old as unknown as Record<string, unknown>, x as unknown as Record<string, unknown>, out, ['id']);
	}
	const keptA = a.filter((x) => after.has(x.id)).map((x) => x.id);
	const keptB = b.filter((x) => before.has(x.id)).map((x) => x.id);
	if (!same(keptA, keptB)) out.push({ path, kind: 'reordered', before: keptA, after: keptB, text: `${path}: order changed to ${keptB.join(', ')}` });
}

/** A list of ids treated as a set: added and removed members, then a reorder when only the order differs. */
function diffIdList(path: string, a: readonly string[], b: readonly string[], out: PlanChange[]) {
	const removed = a.filter((x) => !b.includes(x));
	const added = b.filter((x) => !a.includes(x));
	if (removed.length) out.push({ path, kind: 'removed', before: removed, text: `${path}: removed ${removed.join(', ')}` });
	if (added.length) out.push({ path, kind: 'added', after: added, text: `${path}: added ${added.join(', ')}` });
	if (!removed.length && !added.length && !same(a, b)) out.push({ path, kind: 'reordered', before: [...a], after: [...b], text: `${path}: order changed to ${b.join(', ')}` });
}

/**
 * Field-level differences from plan `a` to plan `b`, in plan-file order: title, notes,
 * factors, reagents, contexts (members matched by id), observation, budget, goal, design
 * (its reagent and context lists compared as sets) and section notes. Equal plans give [].
 * Values are compared structurally, so key order never counts as a change. Pure: neither
 * plan is modified.
 */
export function diffPlans(a: Plan, b: Plan): PlanChange[] {
	const out: PlanChange[] = [];
	for (const k of ['title', 'notes'] as const)
		if (a[k] !== b[k]) out.push({ path: k, kind: 'changed', before: a[k], after: b[k], text: `${k} ${showValue(a[k])} → ${showValue(b[k])}` });
	diffCollection('factors', a.factors, b.factors, out);
	diffCollection('reagents', a.reagents, b.reagents, out);
	diffCollection('contexts', a.contexts, b.contexts, out);
	diffFields('observation', { ...a.observation }, { ...b.observation }, out);
	diffFields('budget', { ...a.budget }, { ...b.budget }, out);
	diffFields('goal', { ...a.goal }, { ...b.goal }, out);
	if (a.design === null && b.design !== null) out.push({ path: 'design', kind: 'added', after: b.design, text: `design fixed: ${showValue(b.design)}` });
	else if (a.design !== null && b.design === null) out.push({ path: 'design', kind: 'removed', before: a.design, text: 'design cleared (the plan is sized again)' });
	else if (a.design && b.design) {
		diffIdList('design.reagents', a.design.reagents, b.design.reagents, out);
		diffIdList('design.contexts', a.design.contexts, b.design.contexts, out);
		diffFields('design', { ...a.design }, { ...b.design }, out, ['reagents', 'contexts']);
	}
	const notesA = a.sectionNotes ?? {};
	const notesB = b.sectionNotes ?? {};
	for (const k of new Set([...Object.keys(notesA), ...Object.keys(notesB)])) {
		const before = notesA[k] ?? '';
		const after = notesB[k] ?? '';
		if (before === after) continue;
		const p = `sectionNotes.${k}`;
		if (!before) out.push({ path: p, kind: 'added', after, text: `${p} written: ${showValue(after)}` });
		else if (!after) out.push({ path: p, kind: 'removed', before, text: `${p} cleared` });
		else out.push({ path: p, kind: 'changed', before, after, text: `${p} ${showValue(before)} → ${showValue(after)}` });
	}
	return out;
}
