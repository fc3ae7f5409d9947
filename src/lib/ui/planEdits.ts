/**
 * Structural edits of a plan that keep every reference valid: factor ids in reagent targets,
 * per-target effects and context means/variances; reagent and context ids in the design.
 * Each function mutates the plan it is given (the notebook passes its live state inside
 * `PlanSession.edit`) and returns what else it had to change, for the undo message.
 * Caller mistakes (unknown ids, removing the last factor, a taken id) throw at once.
 */
import { checkRule, effectiveDesign, idRule, nextId, type Design, type Plan, type Reagent } from '$core/plan';

function factorIndex(plan: Plan, id: string): number {
	const i = plan.factors.findIndex((f) => f.id === id);
	if (i < 0) throw new Error(`no factor with id "${id}"`);
	return i;
}
function reagentOf(plan: Plan, id: string): Reagent {
	const r = plan.reagents.find((x) => x.id === id);
	if (!r) throw new Error(`no reagent with id "${id}"`);
	return r;
}

/** Rounds to 6 significant digits (for averaged effects shown in forms). */
const tidy = (x: number) => Number(x.toPrecision(6));

/** Adds a factor (laplace-shaped, the non-Gaussian default) and returns its id. */
export function addFactor(plan: Plan, name = 'New factor'): string {
	const id = nextId('f', plan.factors.map((f) => f.id));
	plan.factors.push({ id, name, shape: 'laplace' });
	return id;
}

export interface FactorRemoval {
	/** Reagents that lost this target but kept others. */
	reagentsChanged: string[];
	/** Reagents removed because this factor was their only target. */
	reagentsRemoved: string[];
	/** Contexts whose mean or variance for this factor was dropped. */
	contextsChanged: string[];
	/** Unknown-target reagents whose expected number of targets was lowered to the new factor count. */
	expectedTargetsLowered: string[];
	/** True when the fixed design lost its last reagent and was reset to "all reagents". */
	designReset: boolean;
}

/**
 * Removes a factor and every reference to it. A reagent whose only target it was is removed
 * too (a reagent needs at least one target); the fixed design drops removed reagents.
 */
export function removeFactor(plan: Plan, id: string): FactorRemoval {
	const i = factorIndex(plan, id);
	if (plan.factors.length === 1) throw new Error('a plan needs at least one factor');
	plan.factors.splice(i, 1);
	const out: FactorRemoval = { reagentsChanged: [], reagentsRemoved: [], contextsChanged: [], expectedTargetsLowered: [], designReset: false };
	for (const r of plan.reagents) {
		if (r.targets === null) {
			if (r.expectedTargets !== undefined && r.expectedTargets > plan.factors.length) {
				r.expectedTargets = plan.factors.length;
				out.expectedTargetsLowered.push(r.id);
			}
			continue;
		}
		if (!r.targets.includes(id)) continue;
		if (r.targets.length === 1) {
			out.reagentsRemoved.push(r.id);
			continue;
		}
		r.targets = r.targets.filter((t) => t !== id);
		if (typeof r.effect !== 'number') {
			const { [id]: _dropped, ...rest } = r.effect;
			r.effect = rest;
		}
		out.reagentsChanged.push(r.id);
	}
	for (const rid of out.reagentsRemoved) out.designReset = removeReagent(plan, rid) || out.designReset;
	for (const c of plan.contexts) {
		if (id in c.mean || id in c.variance) {
			delete c.mean[id];
			delete c.variance[id];
			out.contextsChanged.push(c.id);
		}
	}
	return out;
}

/** Checks a proposed id: null when usable, else the reason. */
export function idProblem(id: string, taken: Iterable<string>, current?: string): string | null {
	const problem = checkRule(idRule, id);
	if (problem) return `expected ${problem}`;
	if (id !== current && new Set(taken).has(id)) return `the id "${id}" is already used`;
	return null;
}

/** Renames a factor id everywhere it is referenced. */
export function renameFactor(plan: Plan, from: string, to: string): void {
	const i = factorIndex(plan, from);
	const problem = idProblem(to, plan.factors.map((f) => f.id), from);
	if (problem) throw new Error(`factor id: ${problem}`);
	if (from === to) return;
	plan.factors[i].id = to;
	const rekey = (obj: Record<string, number>) => {
		if (!(from in obj)) return obj;
		return Object.fromEntries(Object.entries(obj).map(([k, v]) => [k === from ? to : k, v]));
	};
	for (const r of plan.reagents) {
		if (r.targets) r.targets = r.targets.map((t) => (t === from ? to : t));
		if (typeof r.effect !== 'number') r.effect = rekey(r.effect);
	}
	for (const c of plan.contexts) {
		c.mean = rekey(c.mean);
		c.variance = rekey(c.variance);
	}
}

/**
 * Adds a reagent targeting the first factor and returns its id. Its effect (1 SD), efficacy
 * (0.9) and cost (0) are starting values for the form, which asks for the real ones.
 */
export function addReagent(plan: Plan): string {
	const id = nextId('r', plan.reagents.map((r) => r.id));
	plan.reagents.push({ id, name: 'New reagent', targets: [plan.factors[0].id], kind: 'shift', effect: 1, efficacy: 0.9, costPerWell: 0 });
	if (plan.design) plan.design.reagents.push(id);
	return id;
}

/**
 * Removes a reagent (and from the fixed design). Returns true when the fixed design lost its
 * last reagent and was therefore reset to "all reagents" (design = null).
 */
export function removeReagent(plan: Plan, id: string): boolean {
	const i = plan.reagents.findIndex((r) => r.id === id);
	if (i < 0) throw new Error(`no reagent with id "${id}"`);
	plan.reagents.splice(i, 1);
	if (!plan.design) return false;
	plan.design.reagents = plan.design.reagents.filter((r) => r !== id);
	if (plan.design.reagents.length === 0) {
		plan.design = null;
		return true;
	}
	return false;
}

/** Renames a reagent id (also in the design). */
export function renameReagent(plan: Plan, from: string, to: string): void {
	const r = reagentOf(plan, from);
	const problem = idProblem(to, plan.reagents.map((x) => x.id), from);
	if (problem) throw new Error(`reagent id: ${problem}`);
	r.id = to;
	if (plan.design) plan.design.reagents = plan.design.reagents.map((x) => (x === from ? to : x));
}

/**
 * Sets a reagent's known targets (`targets` non-empty) or marks them unknown (`null`, with the
 * expected count). Per-target effects follow: new targets get the mean of the stated effects,
 * dropped targets lose theirs; unknown targets keep one number (the mean).
 */
export function setTargets(plan: Plan, id: string, targets: string[] | null, expectedTargets?: number): void {
	const r = reagentOf(plan, id);
	const known = new Set(plan.factors.map((f) => f.id));
	if (targets !== null) {
		if (targets.length === 0) throw new Error('a reagent needs at least one target, or unknown targets');
		for (const t of targets) if (!known.has(t)) throw new Error(`no factor with id "${t}"`);
		const ordered = plan.factors.map((f) => f.id).filter((f) => targets.includes(f));
		if (typeof r.effect !== 'number') {
			const values = Object.values(r.effect);
			const mean = values.length ? tidy(values.reduce((s, v) => s + v, 0) / values.length) : 1;
			const effect = r.effect;
			r.effect = Object.fromEntries(ordered.map((t) => [t, effect[t] ?? mean]));
		}
		r.targets = ordered;
		delete r.expectedTargets;
	} else {
		const n = expectedTargets ?? r.expectedTargets ?? Math.max(1, r.targets?.length ?? 1);
		if (!Number.isInteger(n) || n < 1 || n > plan.factors.length) throw new Error(`expectedTargets: expected an integer in [1, ${plan.factors.length}], got ${n}`);
		if (typeof r.effect !== 'number') {
			const values = Object.values(r.effect);
			r.effect = values.length ? tidy(values.reduce((s, v) => s + v, 0) / values.length) : 1;
		}
		r.targets = null;
		r.expectedTargets = n;
	}
}

/** Switches a reagent between one effect for all targets and one effect per target. */
export function setEffectMode(plan: Plan, id: string, mode: 'single' | 'perTarget'): void {
	const r = reagentOf(plan, id);
	if (mode === 'single') {
		if (typeof r.effect === 'number') return;
		const values = Object.values(r.effect);
		r.effect = values.length ? tidy(values.reduce((s, v) => s + v, 0) / values.length) : 1;
		return;
	}
	if (r.targets === null) throw new Error('per-target effects need known targets');
	if (typeof r.effect !== 'number') return;
	const value = r.effect;
	r.effect = Object.fromEntries(r.targets.map((t) => [t, value]));
}

/** Adds a plate-level context that changes nothing yet (baseline mean 0, variance 1); returns its id. */
export function addContext(plan: Plan): string {
	const id = nextId('c', plan.contexts.map((c) => c.id));
	plan.contexts.push({ id, name: 'New context', level: 'plate', mean: {}, variance: {} });
	return id;
}

/** Removes a context (and from the fixed design). */
export function removeContext(plan: Plan, id: string): void {
	const i = plan.contexts.findIndex((c) => c.id === id);
	if (i < 0) throw new Error(`no context with id "${id}"`);
	plan.contexts.splice(i, 1);
	if (plan.design) plan.design.contexts = plan.design.contexts.filter((c) => c !== id);
}

/** Sets (or with `undefined`, clears back to baseline) a context's mean or variance of a factor. */
export function setContextValue(plan: Plan, contextId: string, which: 'mean' | 'variance', factorId: string, value: number | undefined): void {
	const c = plan.contexts.find((x) => x.id === contextId);
	if (!c) throw new Error(`no context with id "${contextId}"`);
	factorIndex(plan, factorId);
	if (value === undefined) delete c[which][factorId];
	else c[which][factorId] = value;
}

/** Fixes a design (starting from the default one: all reagents and contexts) or goes back to the default. */
export function setDesignFixed(plan: Plan, fixed: boolean): void {
	if (fixed === (plan.design !== null)) return;
	plan.design = fixed ? structuredClone(effectiveDesign(plan)) : null;
}

/** Includes or leaves out a reagent in the fixed design (refuses to leave it empty). */
export function setDesignReagent(plan: Plan, reagentId: string, included: boolean): void {
	if (!plan.design) throw new Error('no fixed design: fix one first');
	reagentOf(plan, reagentId);
	const set = new Set(plan.design.reagents);
	if (included) set.add(reagentId);
	else set.delete(reagentId);
	if (set.size === 0) throw new Error('a design needs at least one reagent');
	plan.design.reagents = plan.reagents.map((r) => r.id).filter((r) => set.has(r));
}

/** Includes or leaves out a context in the fixed design (none = one baseline environment). */
export function setDesignContext(plan: Plan, contextId: string, included: boolean): void {
	if (!plan.design) throw new Error('no fixed design: fix one first');
	if (!plan.contexts.some((c) => c.id === contextId)) throw new Error(`no context with id "${contextId}"`);
	const set = new Set(plan.design.contexts);
	if (included) set.add(contextId);
	else set.delete(contextId);
	plan.design.contexts = plan.contexts.map((c) => c.id).filter((c) => set.has(c));
}

/** What applying a reagent fix would do to the design, or null when the fix is advice only. */
export function fixAction(plan: Plan, fix: { reagentId?: string } | null | undefined): { action: 'add' | 'remove'; reagent: Reagent } | null {
	if (!fix?.reagentId) return null;
	const reagent = plan.reagents.find((r) => r.id === fix.reagentId);
	if (!reagent) return null;
	const design: Design = effectiveDesign(plan);
	if (design.reagents.includes(reagent.id)) return design.reagents.length > 1 ? { action: 'remove', reagent } : null;
	return { action: 'add', reagent };
}

/**
 * Applies a fix that names a catalogue reagent: adds it to the design (or, when it is already
 * in the design — the budget check's fix — removes it). A plan without a fixed design gets one
 * (the default design) first. Returns what was done, or null for advice-only fixes.
 */
export function applyFix(plan: Plan, fix: { reagentId?: string } | null | undefined): { action: 'add' | 'remove'; reagentId: string } | null {
	const what = fixAction(plan, fix);
	if (!what) return null;
	setDesignFixed(plan, true);
	setDesignReagent(plan, what.reagent.id, what.action === 'add');
	return { action: what.action, reagentId: what.reagent.id };
}
