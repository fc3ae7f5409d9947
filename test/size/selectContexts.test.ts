import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { selectContexts, designCost } from '../../src/lib/core/size';
import { checkPlan } from '../../src/lib/core/identify';
import { parsePlan, type Plan } from '../../src/lib/core/plan';

const multi = () => parsePlan(readFileSync('templates/multi-context.json', 'utf8'));

function contextsVerdicts(plan: Plan, contexts: string[]) {
	const res = checkPlan({ ...plan, goal: { ...plan.goal, route: 'contexts' } }, { reagents: plan.reagents.map((r) => r.id), replicates: 2, controlsPerPlate: 8, contexts });
	return res.routes.find((r) => r.route === 'contexts')!.factors;
}

describe('selectContexts: cheapest contexts that separate the factors (contexts route)', () => {
	it('multi-context template: the cheapest subset by brute force, checked with the verdict engine', () => {
		const plan = multi();
		const base = { reagents: plan.reagents.map((r) => r.id), replicates: 2, controlsPerPlate: 8 };
		const sel = selectContexts(plan, base);
		expect(sel.allIndividual).toBe(true);
		expect(sel.method).toBe('exact');
		const ids = plan.contexts.map((c) => c.id);
		let best = Infinity;
		for (let mask = 1; mask < 1 << ids.length; mask++) {
			const set = ids.filter((_, i) => mask & (1 << i));
			if (set.length < 2) continue;
			const cost = designCost(plan, { ...base, contexts: set }).total;
			if (cost < best && contextsVerdicts(plan, set).every((f) => f.verdict === 'individual')) best = cost;
		}
		expect(designCost(plan, { ...base, contexts: sel.sets[0] }).total).toBe(best);
		expect(contextsVerdicts(plan, sel.sets[0]).every((f) => f.verdict === 'individual')).toBe(true);
		// the second candidate is every context
		expect(sel.sets.at(-1)).toEqual(ids);
	});

	it('proportional variance profiles stay a block (Pham & Cardoso 2001, condition from memory)', () => {
		const plan = multi();
		// make prol's profile proportional to diff's in every context: variance 1 everywhere for both
		const flat = { ...plan, contexts: plan.contexts.map((c) => ({ ...c, variance: Object.fromEntries(Object.entries(c.variance).filter(([f]) => f !== 'prol' && f !== 'diff')) })) };
		const sel = selectContexts(flat, { reagents: [], replicates: 2, controlsPerPlate: 8 });
		expect(sel.allIndividual).toBe(false);
		const ids = sel.unreachable.map((u) => u.id);
		expect(ids).toEqual(expect.arrayContaining(['prol', 'diff']));
		for (const u of sel.unreachable.filter((x) => x.id === 'prol' || x.id === 'diff')) expect(u.block).toEqual(expect.arrayContaining(['prol', 'diff']));
	});
});
