/**
 * The sizing search against injected evaluators whose outcomes are known exactly, so the
 * search logic (sequential stopping, monotone search on replicates, budget, frontier, curve,
 * cancellation) is checked independently of the simulation engine.
 */
import { describe, expect, it } from 'vitest';
import { controlOptions, designCost, sizePlan, sizePlanSync, directEvaluator, SizingCancelled, type Evaluator, type EvalRequest } from '../../src/lib/core/size';
import type { Design, Plan } from '../../src/lib/core/plan';
import { wilson } from '../../src/lib/core/score';
import { smallPlan } from './smallPlan';

/** Outcomes from a rule: success → MCC just above the goal, failure → well below. */
function ruleEvaluator(plan: Plan, success: (design: Design, rep: number) => boolean): Evaluator & { requests: EvalRequest[] } {
	const requests: EvalRequest[] = [];
	const fn = async (batch: EvalRequest[]) => {
		requests.push(...batch);
		return batch.map((req) => req.reps.map((rep) => ({ rep, mcc: success(req.design, rep) ? Math.min(1, plan.goal.mcc + 0.05) : plan.goal.mcc - 0.3 })));
	};
	return Object.assign(fn, { requests });
}

/** A fixed permutation of 0..99: rep ↦ (37·rep mod 100)/100, so any 100 consecutive replicates hit every hundredth once. */
const u = (rep: number) => ((37 * rep) % 100) / 100;

const fixedSettings = { controls: [8], maxSets: 1, maxReplicates: 16 };

describe('sizePlan search logic (injected evaluator)', () => {
	it('finds the fewest replicates by doubling and bisection; clear-cut designs stop after one batch', async () => {
		const plan = smallPlan({ budget: 1e6 });
		const ev = ruleEvaluator(plan, (d) => d.replicates >= 6);
		const res = await sizePlan(plan, { ...fixedSettings, curve: false }, ev);
		expect(res.feasible).toBe(true);
		expect(res.design!.replicates).toBe(6);
		// probes: 2, 4, 8 (doubling), then 6 (pass) and 5 (fail)
		expect(ev.requests.map((r) => r.design.replicates)).toEqual([2, 4, 8, 6, 5]);
		// Wilson 95 % interval of 25/25 is [0.8668, 1] > 0.8 and of 0/25 is [0, 0.1332] < 0.8: one batch each
		expect(ev.requests.every((r) => r.reps.length === 25 && r.reps[0] === 0)).toBe(true);
		expect(res.evaluations).toBe(125);
		expect(res.assurance).toMatchObject({ p: 1, reps: 25 });
		expect(res.assurance!.lo).toBeCloseTo(wilson(25, 25).lo, 12);
		// Wilson 1927 worked value (REFERENCES.md): 32/32 at 95 % → lower bound 0.8928208
		expect(wilson(32, 32).lo).toBeCloseTo(0.8928208, 7);
	});

	it('common random numbers: every design is evaluated on replicate indices 0, 1, 2, … with the same seed', async () => {
		const plan = smallPlan({ budget: 1e6 });
		const ev = ruleEvaluator(plan, (d) => d.replicates >= 3);
		await sizePlan(plan, { ...fixedSettings, seed: 17 }, ev);
		for (const r of ev.requests) {
			expect(r.options.seed).toBe(17);
			expect(r.options.route).toBe('targeted');
			expect(r.reps).toEqual(Array.from({ length: r.reps.length }, (_, i) => r.reps[0] + i));
		}
		expect(new Set(ev.requests.filter((r) => r.reps[0] === 0).map((r) => r.reps.length))).toEqual(new Set([25]));
	});

	it('a design whose interval never clears the goal runs to maxReps and is judged on its point estimate', async () => {
		const plan = smallPlan({ budget: 1e6, goalAssurance: 0.8 });
		// exactly 4 in every 5 replicates succeed: p̂ = 0.8 at every multiple of 25
		const ev = ruleEvaluator(plan, (_d, rep) => rep % 5 !== 0);
		const res = await sizePlan(plan, { ...fixedSettings, maxReps: 100, curve: false }, ev);
		expect(res.design!.replicates).toBe(2);
		expect(res.assurance).toMatchObject({ p: 0.8, reps: 100 });
		expect(res.feasible).toBe(true);
		expect(ev.requests.map((r) => r.reps[0])).toEqual([0, 25, 50, 75]);
	});

	it('a higher goal never gives a cheaper design (same outcomes, stricter goal)', async () => {
		const mccOf = (d: Design, rep: number) => 0.7 + 0.02 * d.replicates + 0.1 * u(rep);
		const cheapest = async (goalMcc: number, goalAssurance: number) => {
			const plan = smallPlan({ budget: 1e6, goalMcc, goalAssurance });
			const ev: Evaluator = async (batch) => batch.map((req) => req.reps.map((rep) => ({ rep, mcc: mccOf(req.design, rep) })));
			return (await sizePlan(plan, { controls: [8, 16], maxSets: 2, maxReplicates: 16, curve: false }, ev)).cheapest?.cost ?? Infinity;
		};
		const costs = [await cheapest(0.85, 0.8), await cheapest(0.9, 0.8), await cheapest(0.95, 0.8), await cheapest(0.95, 0.9)];
		for (let k = 1; k < costs.length; k++) expect(costs[k]).toBeGreaterThanOrEqual(costs[k - 1]);
		expect(costs[0]).toBeLessThan(costs[3]);
	});

	it('tiny budget: feasible false, the highest-assurance design the budget buys, and the budget needed', async () => {
		const probe = smallPlan();
		const cost = (r: number) => designCost(probe, { reagents: ['a1', 'a2', 'a3'], replicates: r, controlsPerPlate: 8, contexts: [] }).total;
		// success iff u < r/10: assurance r/10 on any 100 replicates; the goal 0.8 needs r = 8
		const plan = smallPlan({ budget: cost(5) });
		const ev = ruleEvaluator(plan, (d, rep) => u(rep) < d.replicates / 10);
		const res = await sizePlan(plan, { ...fixedSettings, maxReps: 100 }, ev);
		expect(res.feasible).toBe(false);
		expect(res.cheapest!.replicates).toBe(8);
		expect(res.budgetNeeded).toBe(cost(8));
		expect(res.design!.replicates).toBe(5);
		expect(res.design!.cost).toBeLessThanOrEqual(plan.budget.total);
		expect(res.cost!.total).toBe(res.design!.cost);
		expect(res.reason).toMatch(/above the budget/);
	});

	it('a budget below every design: no design, and the budget the goal needs', async () => {
		const plan = smallPlan({ budget: 50 });
		const ev = ruleEvaluator(plan, (d) => d.replicates >= 4);
		const res = await sizePlan(plan, fixedSettings, ev);
		expect(res.feasible).toBe(false);
		expect(res.design).toBeNull();
		expect(res.cost).toBeNull();
		expect(res.assurance).toBeNull();
		expect(res.budgetNeeded).toBe(res.cheapest!.cost);
		expect(res.reason).toMatch(/no candidate design fits the budget/);
	});

	it('factors only recoverable as a block: infeasible, no budget can help, reasons from the verdict engine', async () => {
		// reagents on {f1,f2}, {f2,f3}, {f1,f3}: DESIGN.md worked example (sparse-perturbation blocks, Ahuja et al. 2022)
		const plan = smallPlan({
			reagents: [
				{ id: 'p12', targets: ['f1', 'f2'] },
				{ id: 'p23', targets: ['f2', 'f3'] },
				{ id: 'p13', targets: ['f1', 'f3'] }
			]
		});
		const ev = ruleEvaluator(plan, () => true);
		const res = await sizePlan(plan, fixedSettings, ev);
		expect(res.feasible).toBe(false);
		expect(res.budgetNeeded).toBeNull();
		expect(res.cheapest).toBeNull();
		expect(res.unreachable.map((x) => x.id)).toEqual(['f1', 'f2', 'f3']);
		expect(res.unreachable[0].block).toEqual(['f1', 'f2', 'f3']);
		expect(res.reason).toMatch(/recovers f1, f2, f3 individually/);
		expect(res.reason).toMatch(/no number of replicates/);
		// the best the budget buys is still reported (the most replicates affordable)
		expect(res.design).not.toBeNull();
	});

	it('frontier is Pareto (cost and assurance strictly increase); curve is the chosen configuration by replicates', async () => {
		const plan = smallPlan({ budget: 1e6 });
		const ev = ruleEvaluator(plan, (d, rep) => u(rep) < Math.min(1, d.replicates / 10 + (d.reagents.length > 3 ? 0.1 : 0)));
		const res = await sizePlan(plan, { maxReps: 100, maxReplicates: 16 }, ev);
		expect(res.frontier.length).toBeGreaterThan(2);
		for (let k = 1; k < res.frontier.length; k++) {
			expect(res.frontier[k].cost).toBeGreaterThan(res.frontier[k - 1].cost);
			expect(res.frontier[k].assurance).toBeGreaterThan(res.frontier[k - 1].assurance);
		}
		for (const f of res.frontier) {
			expect(f.lo).toBeLessThanOrEqual(f.assurance);
			expect(f.hi).toBeGreaterThanOrEqual(f.assurance);
		}
		expect(res.curve.map((c) => c.replicates)).toEqual([...res.curve.map((c) => c.replicates)].sort((a, b) => a - b));
		expect(res.curve.map((c) => c.replicates)).toEqual(expect.arrayContaining([2, 3, 4, 6, 8]));
		for (const c of res.curve) {
			expect(c.p10).toBeLessThanOrEqual(c.median);
			expect(c.cost).toBe(designCost(plan, { reagents: res.design!.reagents, replicates: c.replicates, controlsPerPlate: res.design!.controlsPerPlate, contexts: [] }).total);
		}
	});

	it('cancels between batches', async () => {
		const plan = smallPlan();
		const ev = ruleEvaluator(plan, () => false);
		let asked = 0;
		await expect(sizePlan(plan, fixedSettings, ev, undefined, () => ++asked > 2)).rejects.toBeInstanceOf(SizingCancelled);
		expect(ev.requests.length).toBe(2);
	});

	it('reports progress before each batch', async () => {
		const plan = smallPlan({ budget: 1e6 });
		const seen: string[] = [];
		await sizePlan(plan, { ...fixedSettings, curve: false }, ruleEvaluator(plan, (d) => d.replicates >= 2), (p) => seen.push(`${p.phase}:${p.evaluations}`));
		expect(seen).toEqual(['search:0']);
	});

	it('a broken evaluator is an internal error, not a result', async () => {
		const plan = smallPlan();
		const short: Evaluator = async (batch) => batch.map((req) => req.reps.slice(1).map((rep) => ({ rep, mcc: 1 })));
		await expect(sizePlan(plan, fixedSettings, short)).rejects.toThrow(/returned 24 outcomes for 25 replicates/);
		const reordered: Evaluator = async (batch) => batch.map((req) => [...req.reps].reverse().map((rep) => ({ rep, mcc: 1 })));
		await expect(sizePlan(plan, fixedSettings, reordered)).rejects.toThrow(/outcome 0 is replicate 24, expected 0/);
	});

	it('caller mistakes throw naming the option', async () => {
		const plan = smallPlan();
		const ev = ruleEvaluator(plan, () => true);
		await expect(sizePlan(plan, { batch: 0 }, ev)).rejects.toThrow(/batch must be an integer in \[1, 10000\], got 0/);
		await expect(sizePlan(plan, { maxSets: 9 }, ev)).rejects.toThrow(/maxSets/);
		await expect(sizePlan(plan, { controls: [-1] }, ev)).rejects.toThrow(/controls/);
		await expect(sizePlan(plan, { power: 1.2 }, ev)).rejects.toThrow(/power/);
	});

	it('controls per plate tried: the plan value first, then the standard values of the format (common practice)', () => {
		expect(controlOptions(smallPlan({ controlsPerPlate: 6 }), null)).toEqual([6, 4, 8]);
		expect(controlOptions(smallPlan({ plateFormat: 384, controlsPerPlate: 16 }), null)).toEqual([16, 8, 24]);
		expect(controlOptions(smallPlan(), [12, 12, 20])).toEqual([12, 20]);
	});

	it('the per-reagent t-test check covers the recommended reagents', async () => {
		const plan = smallPlan({ budget: 1e6 });
		const res = await sizePlan(plan, fixedSettings, ruleEvaluator(plan, (d) => d.replicates >= 4));
		expect(res.tTest.map((t) => t.id)).toEqual(res.design!.reagents);
		expect(res.tTest.every((t) => t.replicatesNeeded !== null && t.replicatesNeeded >= 2)).toBe(true);
	});

	it('a plan that fixes a design keeps its reagents and contexts and sizes the replicates', async () => {
		const plan = { ...smallPlan({ budget: 1e6 }), design: { reagents: ['a1', 'a2', 'a3', 'p12'], replicates: 3, controlsPerPlate: 8, contexts: [] } };
		const ev = ruleEvaluator(plan, (d) => d.replicates >= 5);
		const res = await sizePlan(plan, { controls: [8], maxReplicates: 16 }, ev);
		expect(new Set(ev.requests.map((r) => r.design.reagents.join(',')))).toEqual(new Set(['a1,a2,a3,p12']));
		expect(res.design!.replicates).toBe(5);
		expect(res.warnings.join(' ')).toMatch(/fixes a design/);
	});

	it('targeted route where known targets fall short: reagents with unknown targets join and the Monte Carlo decides', async () => {
		const plan = smallPlan({
			budget: 1e6,
			reagents: [
				{ id: 'k1', targets: ['f1'] },
				{ id: 'u1', targets: null, expectedTargets: 1 },
				{ id: 'u2', targets: null, expectedTargets: 1 },
				{ id: 'u3', targets: null, expectedTargets: 2 }
			]
		});
		const ev = ruleEvaluator(plan, (d) => d.replicates >= 4);
		const res = await sizePlan(plan, { ...fixedSettings, curve: false }, ev);
		expect(res.unreachable).toEqual([]);
		expect(res.feasible).toBe(true);
		expect(res.design!.reagents).toEqual(['k1', 'u1', 'u2', 'u3']);
		expect(res.warnings.join(' ')).toMatch(/unknown targets are added/);
	});

	it('does not mutate the plan', async () => {
		const plan = smallPlan();
		const before = JSON.stringify(plan);
		await sizePlan(plan, fixedSettings, ruleEvaluator(plan, (d) => d.replicates >= 4));
		expect(JSON.stringify(plan)).toBe(before);
	});
});

describe('entry points agree (simulation engine)', () => {
	it('sizePlan with the direct evaluator gives exactly the sizePlanSync result', async () => {
		const plan = smallPlan({ goalMcc: 0.85 });
		const opts = { seed: 3, maxReplicates: 8, maxSets: 1, controls: [8], maxReps: 75 };
		const a = sizePlanSync(plan, opts);
		const b = await sizePlan(plan, opts, directEvaluator(plan));
		expect(b).toEqual(a);
		expect(a.evaluations).toBeGreaterThan(0);
	});
});
