import { describe, expect, it } from 'vitest';
import { checkPlan } from '../../src/lib/core/identify';
import { effectiveDesign, type Plan } from '../../src/lib/core/plan';
import { prepareSimulation, runReplicate, simulate } from '../../src/lib/core/simulate';
import { meanSe, smallPlan, template } from './helpers';

/** Paired MCC difference (b − a) over reps, same seed (common random numbers). */
function pairedGain(planA: Plan, designA: Plan['design'], planB: Plan, designB: Plan['design'], reps: number) {
	const a = prepareSimulation(planA, designA!, { seed: 31, blocks: null });
	const b = prepareSimulation(planB, designB!, { seed: 31, blocks: null });
	const diffs: number[] = [];
	for (let rep = 0; rep < reps; rep++) diffs.push(runReplicate(b, rep).mcc - runReplicate(a, rep).mcc);
	return meanSe(diffs);
}

describe('recovery behaves as the design changes', () => {
	// "Never lowers beyond Monte Carlo error": the paired mean gain must exceed −3 SE.
	it('more replicate wells never lower the expected MCC (2 → 4 → 8 replicates, demo plan)', () => {
		const plan = template('demo');
		const base = effectiveDesign(plan);
		const designs = [2, 4, 8].map((replicates) => ({ ...base, replicates }));
		for (let i = 0; i + 1 < designs.length; i++) {
			const g = pairedGain(plan, designs[i], plan, designs[i + 1], 60);
			expect(g.mean).toBeGreaterThan(-3 * g.se);
		}
		// and the gain from 2 to 8 is real, not just "not negative"
		const g = pairedGain(plan, designs[0], plan, designs[2], 60);
		expect(g.mean).toBeGreaterThan(3 * g.se);
	});

	it('less replicate or measurement noise never lowers the expected MCC', () => {
		const noisy = template('demo');
		noisy.observation.replicateNoise = 0.8;
		noisy.observation.measurementNoise = 0.5;
		const quiet = template('demo');
		quiet.observation.replicateNoise = 0.4;
		quiet.observation.measurementNoise = 0.25;
		const g = pairedGain(noisy, effectiveDesign(noisy), quiet, effectiveDesign(quiet), 60);
		expect(g.mean).toBeGreaterThan(3 * g.se);
	});

	it('a design the verdict engine calls `block` ({f1,f2}, {f2,f3}, {f1,f3}) scores a low MCC but a high block R²', () => {
		// Example from DESIGN.md "Identifiability checks": three reagents on {1,2}, {2,3}, {1,3} separate every pair yet recover no factor individually.
		const plan = smallPlan({ replicateNoise: 0.3, measurementNoise: 0.1 });
		plan.reagents = [
			['a', ['f1', 'f2']],
			['b', ['f2', 'f3']],
			['c', ['f1', 'f3']]
		].map(([id, targets]) => ({ id: id as string, name: `reagent ${id}`, targets: targets as string[], kind: 'shift' as const, effect: 1.2, efficacy: 1, costPerWell: 1 }));
		const design = { reagents: ['a', 'b', 'c'], replicates: 8, controlsPerPlate: 16, contexts: [] };
		expect(checkPlan(plan, design).factors.map((f) => f.verdict)).toEqual(['block', 'block', 'block']);
		const s = simulate(plan, design, { seed: 1, reps: 40 });
		expect(s.mcc.mean).toBeLessThan(0.85);
		for (const f of s.factors) expect(f.blockR2).toBeGreaterThan(0.97);
		// the same noise with one reagent per factor recovers each factor individually
		const single = { ...plan, reagents: plan.reagents.map((r, j) => ({ ...r, targets: [`f${j + 1}`] })) };
		expect(simulate(single, design, { seed: 1, reps: 40 }).mcc.mean).toBeGreaterThan(0.95);
	});

	it('the summary is the same whatever order the replicates arrive in', async () => {
		const { summarise } = await import('../../src/lib/core/simulate');
		const plan = template('demo');
		const prep = prepareSimulation(plan, effectiveDesign(plan), { seed: 2, blocks: null });
		const results = [0, 1, 2, 3, 4, 5].map((r) => runReplicate(prep, r));
		expect(summarise(prep, [...results].reverse())).toEqual(summarise(prep, results));
	});

	it('assurance is the Wilson interval of the replicates reaching the goal', async () => {
		const { summarise, wilson } = await import('../../src/lib/core/simulate');
		const plan = template('demo');
		const s = simulate(plan, effectiveDesign(plan), { seed: 4, reps: 30, blocks: null });
		const hits = s.mccs.filter((m) => m >= plan.goal.mcc).length;
		expect(s.assurance).toEqual(wilson(hits, 30));
		expect(s.mcc.p10).toBeLessThanOrEqual(s.mcc.median);
		expect(s.mcc.median).toBeLessThanOrEqual(s.mcc.p90);
		expect(typeof summarise).toBe('function');
	});
});
