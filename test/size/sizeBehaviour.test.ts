/**
 * Sizing with the simulation engine: the behaviour a user relies on. Monotonicity checks use
 * common random numbers (same seed), so they compare the same simulated worlds.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { designCost, sizePlanSync } from '../../src/lib/core/size';
import { checkPlan } from '../../src/lib/core/identify';
import { parsePlan } from '../../src/lib/core/plan';
import { smallPlan, type SmallPlanOptions } from './smallPlan';

const opts = { seed: 1, maxReplicates: 24 };
const cheapestCost = (o: SmallPlanOptions) => sizePlanSync(smallPlan(o), opts).cheapest?.cost ?? Infinity;

describe('sizing behaviour (simulation engine)', () => {
	it('more replicate noise never makes the cheapest design cheaper', () => {
		const costs = [0.4, 0.6, 0.8].map((noise) => cheapestCost({ goalMcc: 0.85, replicateNoise: noise }));
		expect(Number.isFinite(costs[0])).toBe(true);
		for (let k = 1; k < costs.length; k++) expect(costs[k]).toBeGreaterThanOrEqual(costs[k - 1]);
		expect(costs[2]).toBeGreaterThan(costs[0]);
	});

	it('a higher goal (score or assurance) never makes the cheapest design cheaper', () => {
		const base = cheapestCost({ goalMcc: 0.85 });
		const higherScore = cheapestCost({ goalMcc: 0.9 });
		const higherAssurance = cheapestCost({ goalMcc: 0.85, goalAssurance: 0.9 });
		expect(Number.isFinite(base)).toBe(true);
		expect(higherScore).toBeGreaterThanOrEqual(base);
		expect(higherAssurance).toBeGreaterThanOrEqual(base);
	});

	it('reagents that can only recover blocks: infeasible, with the factors and the reason', () => {
		// {f1,f2}, {f2,f3}, {f1,f3}: every pair separated, no factor individual (DESIGN.md worked example)
		const plan = smallPlan({
			reagents: [
				{ id: 'p12', targets: ['f1', 'f2'] },
				{ id: 'p23', targets: ['f2', 'f3'] },
				{ id: 'p13', targets: ['f1', 'f3'] }
			]
		});
		const res = sizePlanSync(plan, { ...opts, maxReplicates: 8 });
		expect(res.feasible).toBe(false);
		expect(res.budgetNeeded).toBeNull();
		expect(res.unreachable.map((u) => u.id)).toEqual(['f1', 'f2', 'f3']);
		expect(res.reason).toMatch(/No choice of reagents and contexts recovers f1, f2, f3 individually on the targeted route/);
		// the verdict engine agrees
		expect(checkPlan(plan).factors.map((f) => f.verdict)).toEqual(['block', 'block', 'block']);
	});

	it('a tiny budget: feasible false, the best design it buys, and the budget needed', () => {
		const roomy = sizePlanSync(smallPlan({ goalMcc: 0.85 }), opts);
		expect(roomy.feasible).toBe(true);
		const need = roomy.cheapest!.cost;
		const tight = sizePlanSync(smallPlan({ goalMcc: 0.85, budget: need - 1 }), opts);
		expect(tight.feasible).toBe(false);
		expect(tight.budgetNeeded).toBe(need);
		expect(tight.design).not.toBeNull();
		expect(tight.design!.cost).toBeLessThanOrEqual(need - 1);
		expect(tight.assurance!.p).toBeLessThan(0.8 + 1e-12);
		expect(tight.reason).toMatch(/above the budget/);
	});

	it('demo plan: the recommended design recovers every factor, reaches the goal, and its cost is the cost model’s', () => {
		const plan = parsePlan(readFileSync('templates/demo.json', 'utf8'));
		const res = sizePlanSync(plan, { seed: 1 });
		expect(res.route).toBe('targeted');
		expect(res.feasible).toBe(true);
		const d = res.design!;
		const design = { reagents: d.reagents, replicates: d.replicates, controlsPerPlate: d.controlsPerPlate, contexts: d.contexts };
		expect(checkPlan(plan, design).factors.every((f) => f.verdict === 'individual')).toBe(true);
		expect(res.assurance!.p).toBeGreaterThanOrEqual(plan.goal.assurance);
		const cost = designCost(plan, design);
		expect(d.cost).toBe(cost.total);
		expect(d.plates).toBe(cost.plates);
		expect(d.wells).toBe(cost.wells);
		expect(d.cost).toBeLessThanOrEqual(plan.budget.total);
		// replicates respect stock limits (kb201 96, kb402 64, kb801/kb802 48 wells)
		expect(cost.overStock).toEqual([]);
		// the frontier's last point is at least as sure as the recommendation
		expect(res.frontier.at(-1)!.assurance).toBeGreaterThanOrEqual(res.assurance!.p);
	});
});
