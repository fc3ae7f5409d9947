import { describe, expect, it } from 'vitest';
import pkg from 'jstat';
import { readFileSync } from 'node:fs';
import { reagentTTests } from '../../src/lib/core/size/reagentTTests';
import { parsePlan } from '../../src/lib/core/plan';
import { smallPlan } from './smallPlan';

const { jStat } = pkg;

/** Two-sided two-sample t-test power with jstat's noncentral t (df = 2n − 2, δ = d·√(n/2); Cohen 1988, ch. 2). */
function jstatPower(n: number, d: number): number {
	const df = 2 * n - 2;
	const tc = jStat.studentt.inv(0.975, df);
	const delta = d * Math.sqrt(n / 2);
	return 1 - jStat.noncentralt.cdf(tc, df, delta) + jStat.noncentralt.cdf(-tc, df, delta);
}

describe('reagentTTests: the classic per-reagent check', () => {
	const demo = parsePlan(readFileSync('templates/demo.json', 'utf8'));

	it('effect-size rule: d = efficacy · min |effect| / √(τ² + 1) at well level', () => {
		const byId = new Map(reagentTTests(demo).map((t) => [t.id, t]));
		const sd = Math.sqrt(0.5 ** 2 + 1); // demo: replicateNoise 0.5, cellsPerWell 0
		expect(byId.get('kb101')!.effect).toBeCloseTo((0.95 * 1.2) / sd, 12);
		// two targets: the weaker one counts (kb701: mem 0.6, resp 1.2, efficacy 0.9)
		expect(byId.get('kb701')!.effect).toBeCloseTo((0.9 * 0.6) / sd, 12);
		// clamp: |clamped value| from a baseline mean of 0 (kb801: −1.5, efficacy 0.95)
		expect(byId.get('kb801')!.effect).toBeCloseTo((0.95 * 1.5) / sd, 12);
	});

	it('wells needed is the smallest n with power ≥ 0.8, checked with jstat (reference library)', () => {
		for (const t of reagentTTests(demo)) {
			expect(t.replicatesNeeded).not.toBeNull();
			const n = t.replicatesNeeded!;
			expect(jstatPower(n, t.effect!)).toBeGreaterThanOrEqual(0.8 - 1e-6);
			if (n > 2) expect(jstatPower(n - 1, t.effect!)).toBeLessThan(0.8);
		}
	});

	it('with cells imaged, the factor spread averages over the cells: σ = √(τ² + 1/cells)', () => {
		const plan = smallPlan();
		const design = { reagents: ['a1'], replicates: 4, controlsPerPlate: 8, contexts: [], cellsPerWell: 100 };
		const [t] = reagentTTests(plan, design);
		expect(t.effect).toBeCloseTo((0.9 * 1.2) / Math.sqrt(0.25 + 0.01), 12);
	});

	it('more noise never needs fewer wells', () => {
		let prev = 0;
		for (const noise of [0.2, 0.5, 1, 2]) {
			const n = reagentTTests(smallPlan({ replicateNoise: noise }))[0].replicatesNeeded!;
			expect(n).toBeGreaterThanOrEqual(prev);
			prev = n;
		}
	});

	it('scale reagents have no mean shift: the check does not apply', () => {
		const plan = smallPlan({ reagents: [{ id: 's1', targets: ['f1'], kind: 'scale', effect: 0.5 }] });
		expect(reagentTTests(plan)).toEqual([{ id: 's1', effect: null, replicatesNeeded: null, exactN: null, note: expect.stringMatching(/spread, not the mean/) }]);
	});

	it('restricts to the design reagents in catalogue order', () => {
		const design = { reagents: ['kb202', 'kb101'], replicates: 4, controlsPerPlate: 16, contexts: [] };
		expect(reagentTTests(demo, design).map((t) => t.id)).toEqual(['kb101', 'kb202']);
	});
});
