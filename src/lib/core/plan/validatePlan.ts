import {
	budgetRules,
	checkRule,
	contextMeanRule,
	contextRules,
	contextVarianceRule,
	designRules,
	effectRule,
	factorRules,
	goalRules,
	idRule,
	observationRules,
	reagentRules,
	showValue,
	type FieldRule
} from './constraints';
import { PlanError, type PlanIssue } from './PlanError';
import { PLAN_FORMAT, PLAN_VERSION, type Plan } from './types';
import { migratePlan } from './migratePlan';

type Obj = Record<string, unknown>;

/** Labels of control wells in layout and pilot CSVs; no reagent may use them as its id. */
export const RESERVED_REAGENT_IDS = ['control', 'positive', 'empty'];

const isObject = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

class Collector {
	issues: PlanIssue[] = [];
	add(path: string, message: string) {
		if (this.issues.length < 200) this.issues.push({ path, message });
	}
	/** Checks that `obj` has exactly the allowed keys; reports unknown and missing ones. */
	keys(obj: Obj, path: string, required: string[], optional: string[]) {
		const allowed = new Set([...required, ...optional]);
		for (const k of Object.keys(obj)) {
			if (!allowed.has(k)) this.add(join(path, k), `unknown field; expected one of ${[...allowed].join(', ')}`);
		}
		for (const k of required) if (!(k in obj)) this.add(join(path, k), 'missing required field');
	}
	rule(obj: Obj, key: string, rule: FieldRule, path: string) {
		if (!(key in obj) || obj[key] === undefined) {
			if (!rule.optional) return; // reported by keys()
			return;
		}
		const problem = checkRule(rule, obj[key]);
		if (problem) this.add(join(path, key), `expected ${problem}, got ${showValue(obj[key])}`);
	}
	rules(obj: Obj, table: Record<string, FieldRule>, path: string) {
		for (const [k, r] of Object.entries(table)) this.rule(obj, k, r, path);
	}
}

function join(path: string, key: string | number): string {
	if (typeof key === 'number') return `${path}[${key}]`;
	return path ? `${path}.${key}` : key;
}

function required(table: Record<string, FieldRule>): string[] {
	return Object.entries(table).filter(([, r]) => !r.optional).map(([k]) => k);
}
function optional(table: Record<string, FieldRule>): string[] {
	return Object.entries(table).filter(([, r]) => r.optional).map(([k]) => k);
}

function uniqueIds(c: Collector, items: unknown[], path: string, what: string): Set<string> {
	const seen = new Map<string, number>();
	items.forEach((item, i) => {
		if (!isObject(item) || typeof item.id !== 'string') return;
		const prev = seen.get(item.id);
		if (prev !== undefined) c.add(join(join(path, i), 'id'), `duplicate ${what} id ${JSON.stringify(item.id)} (also ${path}[${prev}])`);
		else seen.set(item.id, i);
	});
	return new Set(seen.keys());
}

function arrayField(c: Collector, obj: Obj, key: string, path: string): unknown[] {
	const v = obj[key];
	if (v === undefined) return [];
	if (!Array.isArray(v)) {
		c.add(join(path, key), `expected an array, got ${showValue(v)}`);
		return [];
	}
	return v;
}

/** A per-factor numeric map (context mean/variance, reagent effect object). */
function factorMap(c: Collector, v: unknown, path: string, factorIds: Set<string>, rule: FieldRule, allowedKeys?: Set<string>) {
	if (!isObject(v)) {
		c.add(path, `expected an object mapping factor ids to numbers, got ${showValue(v)}`);
		return;
	}
	for (const [k, x] of Object.entries(v)) {
		const p = join(path, k);
		if (!factorIds.has(k)) c.add(p, `unknown factor ${JSON.stringify(k)}`);
		else if (allowedKeys && !allowedKeys.has(k)) c.add(p, `factor ${JSON.stringify(k)} is not a target of this reagent`);
		const problem = checkRule(rule, x);
		if (problem) c.add(p, `expected ${problem}, got ${showValue(x)}`);
	}
}

/**
 * Validates a parsed JSON value as a plan file of the current version and returns every
 * problem found (empty when valid). Does not mutate its input.
 */
export function validatePlan(input: unknown): PlanIssue[] {
	const c = new Collector();
	if (!isObject(input)) {
		c.add('', `expected a JSON object (an identiplate-plan file), got ${showValue(input)}`);
		return c.issues;
	}
	c.keys(input, '', ['format', 'version', 'title', 'notes', 'factors', 'reagents', 'contexts', 'observation', 'budget', 'goal', 'design'], ['sectionNotes']);
	if (input.format !== PLAN_FORMAT) c.add('format', `expected "${PLAN_FORMAT}", got ${showValue(input.format)}`);
	if (input.version !== PLAN_VERSION) c.add('version', `expected ${PLAN_VERSION}, got ${showValue(input.version)}`);
	if (typeof input.title !== 'string') c.add('title', `expected a string, got ${showValue(input.title)}`);
	else if (input.title.length > 300) c.add('title', 'expected at most 300 characters');
	if ('notes' in input && typeof input.notes !== 'string') c.add('notes', `expected a string, got ${showValue(input.notes)}`);
	if (input.sectionNotes !== undefined) {
		if (!isObject(input.sectionNotes)) c.add('sectionNotes', `expected an object of section notes, got ${showValue(input.sectionNotes)}`);
		else for (const [k, v] of Object.entries(input.sectionNotes)) if (typeof v !== 'string') c.add(join('sectionNotes', k), `expected a string, got ${showValue(v)}`);
	}

	// factors
	const factors = arrayField(c, input, 'factors', '');
	if ('factors' in input && Array.isArray(input.factors) && factors.length === 0) c.add('factors', 'expected at least one factor');
	factors.forEach((f, i) => {
		const p = join('factors', i);
		if (!isObject(f)) return c.add(p, `expected an object, got ${showValue(f)}`);
		c.keys(f, p, required(factorRules), optional(factorRules));
		c.rules(f, factorRules, p);
	});
	const factorIds = uniqueIds(c, factors, 'factors', 'factor');

	// reagents
	const reagents = arrayField(c, input, 'reagents', '');
	reagents.forEach((r, i) => {
		const p = join('reagents', i);
		if (!isObject(r)) return c.add(p, `expected an object, got ${showValue(r)}`);
		c.keys(r, p, [...required(reagentRules), 'targets', 'effect'], optional(reagentRules));
		c.rules(r, reagentRules, p);
		let targetSet: Set<string> | undefined;
		if (r.targets === null) {
			if (r.expectedTargets === undefined) c.add(join(p, 'expectedTargets'), 'expected an integer ≥ 1 when targets is null (unknown targets)');
			else if (typeof r.expectedTargets === 'number' && r.expectedTargets > factorIds.size && factorIds.size > 0)
				c.add(join(p, 'expectedTargets'), `expected at most ${factorIds.size} (the number of factors), got ${r.expectedTargets}`);
		} else if (Array.isArray(r.targets)) {
			if (r.targets.length === 0) c.add(join(p, 'targets'), 'expected at least one target factor id, or null when the targets are unknown');
			targetSet = new Set();
			r.targets.forEach((t, j) => {
				const tp = join(join(p, 'targets'), j);
				if (typeof t !== 'string') c.add(tp, `expected a factor id, got ${showValue(t)}`);
				else if (!factorIds.has(t)) c.add(tp, `unknown factor ${JSON.stringify(t)}`);
				else if (targetSet!.has(t)) c.add(tp, `factor ${JSON.stringify(t)} listed twice`);
				else targetSet!.add(t);
			});
		} else if ('targets' in r) c.add(join(p, 'targets'), `expected an array of factor ids or null, got ${showValue(r.targets)}`);
		if ('effect' in r) {
			if (typeof r.effect === 'number' || !isObject(r.effect)) {
				const problem = checkRule(effectRule, r.effect);
				if (problem) c.add(join(p, 'effect'), `expected ${problem} or an object of per-target numbers, got ${showValue(r.effect)}`);
			} else {
				if (r.targets === null) c.add(join(p, 'effect'), 'expected one number when the targets are unknown');
				else {
					factorMap(c, r.effect, join(p, 'effect'), factorIds, effectRule, targetSet);
					if (targetSet) for (const t of targetSet) if (!(t in r.effect)) c.add(join(join(p, 'effect'), t), `missing effect for target ${JSON.stringify(t)}`);
				}
			}
			if (r.kind === 'scale') {
				const values = typeof r.effect === 'number' ? [r.effect] : isObject(r.effect) ? Object.values(r.effect) : [];
				if (values.some((v) => typeof v === 'number' && v <= -1)) c.add(join(p, 'effect'), 'expected > −1 for a scale reagent (the spread is multiplied by 1 + effect)');
			}
		}
	});
	reagents.forEach((r, i) => {
		if (isObject(r) && typeof r.id === 'string' && RESERVED_REAGENT_IDS.includes(r.id.toLowerCase()))
			c.add(join(join('reagents', i), 'id'), `"${r.id}" is reserved for control wells in layout and pilot files; choose another id`);
	});
	const reagentIds = uniqueIds(c, reagents, 'reagents', 'reagent');

	// contexts
	const contexts = arrayField(c, input, 'contexts', '');
	contexts.forEach((e, i) => {
		const p = join('contexts', i);
		if (!isObject(e)) return c.add(p, `expected an object, got ${showValue(e)}`);
		c.keys(e, p, [...required(contextRules), 'mean', 'variance'], []);
		c.rules(e, contextRules, p);
		if ('mean' in e) factorMap(c, e.mean, join(p, 'mean'), factorIds, contextMeanRule);
		if ('variance' in e) factorMap(c, e.variance, join(p, 'variance'), factorIds, contextVarianceRule);
	});
	const contextIds = uniqueIds(c, contexts, 'contexts', 'context');

	// observation, budget, goal
	for (const [key, table] of [
		['observation', observationRules],
		['budget', budgetRules],
		['goal', goalRules]
	] as const) {
		const v = input[key];
		if (v === undefined) continue;
		if (!isObject(v)) {
			c.add(key, `expected an object, got ${showValue(v)}`);
			continue;
		}
		c.keys(v, key, required(table), optional(table));
		c.rules(v, table, key);
	}

	// design
	const d = input.design;
	if (d !== null && d !== undefined) {
		if (!isObject(d)) c.add('design', `expected an object or null, got ${showValue(d)}`);
		else {
			c.keys(d, 'design', [...required(designRules), 'reagents', 'contexts'], optional(designRules));
			c.rules(d, designRules, 'design');
			for (const [key, ids, what] of [
				['reagents', reagentIds, 'reagent'],
				['contexts', contextIds, 'context']
			] as const) {
				const list = arrayField(c, d, key, 'design');
				const seen = new Set<string>();
				list.forEach((x, j) => {
					const p = join(join('design', key), j);
					const problem = checkRule(idRule, x);
					if (problem) c.add(p, `expected a ${what} id, got ${showValue(x)}`);
					else if (!ids.has(x as string)) c.add(p, `unknown ${what} ${JSON.stringify(x)}`);
					else if (seen.has(x as string)) c.add(p, `${what} ${JSON.stringify(x)} listed twice`);
					else seen.add(x as string);
				});
			}
			if (Array.isArray(d.reagents) && d.reagents.length === 0) c.add('design.reagents', 'expected at least one reagent');
		}
	}
	return c.issues;
}

/**
 * Parses plan JSON text or an already-parsed value: migrates older versions, refuses newer ones,
 * validates, and returns a deep copy typed as `Plan`. Throws `PlanError` naming the field path.
 */
export function parsePlan(input: unknown): Plan {
	let value = input;
	if (typeof input === 'string') {
		try {
			value = JSON.parse(input);
		} catch (err) {
			throw new PlanError([{ path: '', message: `not valid JSON (${(err as Error).message})` }]);
		}
	}
	if (isObject(value) && value.format === PLAN_FORMAT && typeof value.version === 'number') {
		if (value.version > PLAN_VERSION)
			throw new PlanError([{ path: 'version', message: `this file was written by a newer Identiplate (plan version ${value.version}); this version reads plan versions up to ${PLAN_VERSION}. Update Identiplate to open it.` }]);
		if (value.version < PLAN_VERSION) value = migratePlan(value);
	}
	const issues = validatePlan(value);
	if (issues.length) throw new PlanError(issues);
	return structuredClone(value) as Plan;
}
