import { describe, expect, it } from 'vitest';
import { targetedDesign, targetedPlan } from '../../bench/workloads/targeted';
import { prepareSimilar, prepareSimulation, runReplicate, type SimulationOptions } from '../../src/lib/core/simulate';
import { effectiveDesign } from '../../src/lib/core/plan';
import { smallPlan } from './helpers';

// Reference: prepareSimulation itself (the preparation prepareSimilar must reproduce field for field).
const OPTS: SimulationOptions = { seed: 8128, estimator: 'support', fastPath: true, scoreDraws: 0, blocks: null };

describe('prepareSimilar', () => {
	it('equals prepareSimulation when only reagent targets and effects change, and gives the same replicates', () => {
		let previous = prepareSimulation(targetedPlan(1), targetedDesign(targetedPlan(1)), OPTS);
		for (const rep of [2, 3, 4, 5]) {
			const plan = targetedPlan(rep);
			const reused = prepareSimilar(previous, plan, targetedDesign(plan), OPTS);
			const fresh = prepareSimulation(plan, targetedDesign(plan), OPTS);
			expect(reused.knownTargets).not.toEqual(previous.knownTargets);
			expect(reused).toEqual(fresh);
			expect(runReplicate(reused, rep)).toEqual(runReplicate(fresh, rep));
			previous = reused;
		}
	});

	it('prepares afresh when the options, the design or the plan outside reagent targets differ', () => {
		const plan = targetedPlan(1);
		const design = targetedDesign(plan);
		const previous = prepareSimulation(plan, design, OPTS);
		const cases: [typeof plan, typeof design, SimulationOptions][] = [
			[plan, design, { ...OPTS, fastPath: false, scoreDraws: 2000 }],
			[plan, { ...design, replicates: 3 }, OPTS],
			[{ ...plan, observation: { ...plan.observation, features: 30 } }, design, OPTS],
			[{ ...plan, budget: { ...plan.budget, plateFormat: 96 } }, design, OPTS]
		];
		for (const [p, d, o] of cases) expect(prepareSimilar(previous, p, d, o)).toEqual(prepareSimulation(p, d, o));
		expect(prepareSimilar(previous, plan, { ...design, replicates: 3 }, OPTS).wellReagent.length).toBe(24 * 3);
	});

	it('prepares afresh when blocks come from the identify module or a factor loses its known targets', () => {
		const plan = smallPlan();
		const design = effectiveDesign(plan);
		const auto = { seed: 1 };
		const previous = prepareSimulation(plan, design, auto);
		expect(prepareSimilar(previous, plan, design, auto)).toEqual(prepareSimulation(plan, design, auto));
		const opts = { seed: 1, blocks: null };
		const uncovered = { ...plan, reagents: plan.reagents.map((r, i) => (i === 0 ? { ...r, targets: [] } : r)) };
		const fresh = prepareSimulation(uncovered, design, opts);
		expect(fresh.estimator).toBe('sparse');
		expect(prepareSimilar(prepareSimulation(plan, design, opts), uncovered, design, opts)).toEqual(fresh);
	});

	it('starts from prepareSimulation without a previous preparation', () => {
		const plan = targetedPlan(7);
		expect(prepareSimilar(null, plan, targetedDesign(plan), OPTS)).toEqual(prepareSimulation(plan, targetedDesign(plan), OPTS));
	});
});
