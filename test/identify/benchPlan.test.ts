import { describe, expect, it } from 'vitest';
import { checksBenchPlan } from '../../bench/workloads/checks';
import { checkPlan } from '../../src/lib/core/identify';

describe('checks bench workload plans (BENCHMARK.md "checks")', () => {
	it('have d = 40 factors and R = 400 reagents targeting 1–3 distinct factors with effects in [0.5, 2)', () => {
		const plan = checksBenchPlan(3);
		expect(plan.factors).toHaveLength(40);
		expect(plan.reagents).toHaveLength(400);
		const counts = new Set<number>();
		for (const r of plan.reagents) {
			expect(r.targets).not.toBeNull();
			expect(new Set(r.targets).size).toBe(r.targets!.length);
			expect(r.targets!.length).toBeGreaterThanOrEqual(1);
			expect(r.targets!.length).toBeLessThanOrEqual(3);
			counts.add(r.targets!.length);
			for (const v of Object.values(r.effect as Record<string, number>)) {
				expect(v).toBeGreaterThanOrEqual(0.5);
				expect(v).toBeLessThan(2);
			}
		}
		expect([...counts].sort()).toEqual([1, 2, 3]);
	});

	it('get a full verdict: 400 random sparse reagents pin down all 40 factors, exact rank at the generic value', () => {
		const r = checkPlan(checksBenchPlan(1));
		expect(r.factors.filter((f) => f.verdict === 'individual')).toHaveLength(40);
		expect(r.checks.find((c) => c.id === 'targeted.exact')?.status).toBe('pass');
	});
});
