import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { selectReagents } from '../../src/lib/core/size/selectReagents';
import { checkPlan } from '../../src/lib/core/identify';
import { parsePlan, type Plan } from '../../src/lib/core/plan';
import { smallPlan } from './smallPlan';

const demo = () => parsePlan(readFileSync('templates/demo.json', 'utf8'));

function targetedCheck(plan: Plan, reagents: string[]) {
	return checkPlan({ ...plan, goal: { ...plan.goal, route: 'targeted' } }, { reagents, replicates: 2, controlsPerPlate: 8, contexts: [] });
}

/** Every factor individual on the targeted route for `reagents` (the verdict engine's own check). */
function allIndividual(plan: Plan, reagents: string[]): boolean {
	return targetedCheck(plan, reagents).factors.every((f) => f.verdict === 'individual');
}

/** The verdict engine warns that the stated effects are exactly degenerate for some factor. */
function exactlyDegenerate(plan: Plan, reagents: string[]): boolean {
	return targetedCheck(plan, reagents).checks.some((c) => c.id === 'targeted.exact' && c.status !== 'pass');
}

const weight = (plan: Plan, ids: string[], extra = 0) => ids.reduce((s, id) => s + plan.reagents.find((r) => r.id === id)!.costPerWell + extra, 0);

describe('selectReagents: minimum-cost set meeting the per-factor rank condition', () => {
	it('demo plan: the exact minimum set recovers every factor and costs no more than greedy', () => {
		const plan = demo();
		const exact = selectReagents(plan, { plateCostPerWell: 0.5 });
		const greedy = selectReagents(plan, { plateCostPerWell: 0.5, exactLimit: 0 });
		expect(exact.method).toBe('exact');
		expect(greedy.method).toBe('greedy');
		expect(exact.allIndividual).toBe(true);
		expect(allIndividual(plan, exact.sets[0].reagents)).toBe(true);
		expect(allIndividual(plan, greedy.sets[0].reagents)).toBe(true);
		expect(exact.sets[0].weight).toBeLessThanOrEqual(greedy.sets[0].weight + 1e-9);
		// unknown-target reagents are never chosen on the targeted route with known targets
		for (const s of exact.sets) expect(s.reagents).not.toContain('kb901');
	});
	it('augmented sets contain the minimum set and grow', () => {
		const sel = selectReagents(demo(), { maxSets: 4 });
		expect(sel.sets.length).toBeGreaterThanOrEqual(2);
		expect(sel.sets.length).toBeLessThanOrEqual(4);
		for (let k = 1; k < sel.sets.length; k++) {
			for (const id of sel.sets[0].reagents) expect(sel.sets[k].reagents).toContain(id);
			expect(sel.sets[k].reagents.length).toBeGreaterThan(sel.sets[k - 1].reagents.length);
			expect(sel.sets[k].kind).toBe('augmented');
		}
	});
	it('pairs {f1,f2}, {f2,f3}, {f1,f3} separate every pair yet recover no factor (DESIGN.md worked example; Ahuja, Hartford & Bengio 2022)', () => {
		const plan = smallPlan({
			reagents: [
				{ id: 'p12', targets: ['f1', 'f2'] },
				{ id: 'p23', targets: ['f2', 'f3'] },
				{ id: 'p13', targets: ['f1', 'f3'] }
			]
		});
		const sel = selectReagents(plan);
		expect(sel.allIndividual).toBe(false);
		expect(sel.unreachable.map((u) => u.id)).toEqual(['f1', 'f2', 'f3']);
		for (const u of sel.unreachable) expect(u.block).toEqual(['f1', 'f2', 'f3']);
		expect(sel.unreachable[0].reason).toMatch(/mixed with f2, f3/);
	});
	it('reagents without enough stock are left out, with a warning', () => {
		const plan = smallPlan({
			reagents: [
				{ id: 'a1', targets: ['f1'], costPerWell: 0.1, maxWells: 3 },
				{ id: 'b1', targets: ['f1'], costPerWell: 5 },
				{ id: 'a2', targets: ['f2'] },
				{ id: 'a3', targets: ['f3'] }
			]
		});
		const sel = selectReagents(plan, { wellsPerReagent: 4 });
		expect(sel.sets[0].reagents).toEqual(['b1', 'a2', 'a3']);
		expect(sel.warnings.join(' ')).toMatch(/a1 \(3\)/);
		expect(selectReagents(plan, { wellsPerReagent: 2 }).sets[0].reagents).toEqual(['a1', 'a2', 'a3']);
	});
	it('nonlinear mixing: one single-target clamp per factor, a second in the augmented set', () => {
		const plan = smallPlan({
			mixing: 'nonlinear',
			nonlinearity: 0.3,
			reagents: [
				{ id: 'c1', targets: ['f1'], kind: 'clamp', effect: 1.5, costPerWell: 3 },
				{ id: 'c1b', targets: ['f1'], kind: 'clamp', effect: -1.5, costPerWell: 4 },
				{ id: 'c2', targets: ['f2'], kind: 'clamp', effect: 1.5, costPerWell: 3 },
				{ id: 'c3', targets: ['f3'], kind: 'clamp', effect: 1.5, costPerWell: 3 },
				{ id: 's1', targets: ['f1'], costPerWell: 0.5 }
			]
		});
		const sel = selectReagents(plan);
		expect(sel.method).toBe('clamps');
		expect(sel.sets[0].reagents).toEqual(['c1', 'c2', 'c3']);
		expect(sel.sets[1].reagents).toEqual(['c1', 'c1b', 'c2', 'c3']);
		const missing = selectReagents({ ...plan, reagents: plan.reagents.filter((r) => r.id !== 'c3') });
		expect(missing.unreachable.map((u) => u.id)).toEqual(['f3']);
	});
	it('rejects bad options with the field named', () => {
		expect(() => selectReagents(demo(), { maxSets: 5 })).toThrow(/maxSets/);
		expect(() => selectReagents(demo(), { plateCostPerWell: -1 })).toThrow(/plateCostPerWell/);
	});
	it('does not mutate the plan', () => {
		const plan = demo();
		const before = JSON.stringify(plan);
		selectReagents(plan);
		expect(JSON.stringify(plan)).toBe(before);
	});
});

describe('selectReagents property: the exact search equals brute force over every subset', () => {
	// Random catalogues of up to 9 reagents on 4 factors, targets 1–2 factors, whole-number
	// costs; brute force enumerates all 2^R subsets with the verdict engine.
	const catalogue = fc.array(
		fc.record({
			targets: fc.uniqueArray(fc.integer({ min: 0, max: 3 }), { minLength: 1, maxLength: 2 }),
			cost: fc.integer({ min: 1, max: 9 }),
			effect: fc.constantFrom(0.5, 0.8, 1, 1.3)
		}),
		{ minLength: 3, maxLength: 9 }
	);
	// The documented condition: every factor individual (structural rank), and — when the whole
	// catalogue's stated effects are not exactly degenerate — no exact degeneracy in the set either.
	it('minimum weight matches, and the chosen set meets the condition', () => {
		fc.assert(
			fc.property(catalogue, (cat) => {
				const plan = parsePlan({
					...JSON.parse(JSON.stringify(smallPlan())),
					factors: [0, 1, 2, 3].map((j) => ({ id: `f${j}`, name: `F${j}`, shape: 'laplace' })),
					reagents: cat.map((c, i) => ({ id: `r${i}`, name: `R${i}`, targets: c.targets.map((j) => `f${j}`), kind: 'shift', effect: c.effect, efficacy: 0.9, costPerWell: c.cost }))
				});
				const sel = selectReagents(plan);
				const ids = plan.reagents.map((r) => r.id);
				const fullOk = allIndividual(plan, ids);
				expect(sel.allIndividual).toBe(fullOk);
				if (!fullOk) return;
				const strict = !exactlyDegenerate(plan, ids);
				const meets = (subset: string[]) => allIndividual(plan, subset) && (!strict || !exactlyDegenerate(plan, subset));
				let best = Infinity;
				for (let mask = 1; mask < 1 << ids.length; mask++) {
					const subset = ids.filter((_, i) => mask & (1 << i));
					const w = weight(plan, subset);
					if (w < best && meets(subset)) best = w;
				}
				expect(meets(sel.sets[0].reagents)).toBe(true);
				expect(sel.sets[0].weight).toBeCloseTo(best, 9);
				const greedy = selectReagents(plan, { exactLimit: 0 });
				expect(meets(greedy.sets[0].reagents)).toBe(true);
				expect(greedy.sets[0].weight).toBeGreaterThanOrEqual(best - 1e-9);
			}),
			{ numRuns: 40, seed: 20240611 }
		);
	});
});
