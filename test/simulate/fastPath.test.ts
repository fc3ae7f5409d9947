import { describe, expect, it } from 'vitest';
import pkg from 'jstat';
import { effectiveDesign, type Design } from '../../src/lib/core/plan';
import { drawEffectStatistics, drawWorld, effectsFromWells, prepareSimulation, runReplicate, simulateWells } from '../../src/lib/core/simulate';
import { targetedDesign, targetedPlan } from '../../bench/workloads/targeted';
import { meanSe, template } from './helpers';

const { jStat } = pkg;

/**
 * The fast path draws the plate-corrected reagent effects Δ from their sampling distribution;
 * it must agree in distribution with simulating every well. For a fixed world (mixing, realised
 * reagents) each entry's mean and variance over independent draws are compared: z-tests with a
 * Bonferroni bound for the number of entries (family-wise error 0.2 %; Bonferroni 1936,
 * common practice). Log variance ratio SE √(4/(N−1)) for normal data (from memory).
 */
function compareDelta(plan: ReturnType<typeof template>, design: Design, draws: number) {
	const prep = prepareSimulation(plan, design, { seed: 3, blocks: null });
	expect(prep.fastPath).toBe(true);
	const world = drawWorld(prep, 0);
	const fast: Float64Array[] = [];
	const full: Float64Array[] = [];
	for (let k = 1; k <= draws; k++) {
		fast.push(drawEffectStatistics(prep, world, k));
		full.push(effectsFromWells(prep, simulateWells(prep, world, k)));
	}
	const entries = fast[0].length;
	const step = 5;
	const m = Math.ceil(entries / step);
	const bound = jStat.normal.inv(1 - 0.001 / m, 0, 1); // two-sided Bonferroni bound, family-wise 0.2 %
	let worstMean = 0;
	let worstVar = 0;
	for (let e = 0; e < entries; e += step) {
		const a = fast.map((x) => x[e]);
		const b = full.map((x) => x[e]);
		const ma = a.reduce((s, v) => s + v, 0) / draws;
		const mb = b.reduce((s, v) => s + v, 0) / draws;
		const va = a.reduce((s, v) => s + (v - ma) ** 2, 0) / (draws - 1);
		const vb = b.reduce((s, v) => s + (v - mb) ** 2, 0) / (draws - 1);
		worstMean = Math.max(worstMean, Math.abs(ma - mb) / Math.sqrt((va + vb) / draws));
		worstVar = Math.max(worstVar, Math.abs(Math.log(va / vb)) / Math.sqrt(4 / (draws - 1)));
	}
	return { worstMean, worstVar, bound, prep };
}

describe('fast path (exact sampling distribution of the reagent effects)', () => {
	it('matches the full well simulation on the demo plan with several plates, well- and plate-level contexts, clamps and partial efficacy', () => {
		const plan = template('demo');
		plan.budget.plateFormat = 96;
		plan.budget.excludeEdgeWells = true;
		plan.contexts = [
			{ id: 'cw', name: 'well context', level: 'well', mean: { mem: 0.7, cyc: -0.4 }, variance: { resp: 2 } },
			{ id: 'cw2', name: 'second well context', level: 'well', mean: { auto: 0.3 }, variance: {} },
			{ id: 'cp', name: 'plate context', level: 'plate', mean: { nuc: 1.1 }, variance: {} }
		];
		const design = { ...effectiveDesign(plan), contexts: ['cw', 'cw2', 'cp'], replicates: 3, controlsPerPlate: 7 };
		const r = compareDelta(plan, design, 300);
		expect(r.prep.plates).toBeGreaterThan(2);
		expect(r.worstMean).toBeLessThan(r.bound);
		expect(r.worstVar).toBeLessThan(r.bound);
	});

	it('matches the full cell-level simulation when every factor is Gaussian (cell means are then exactly normal)', () => {
		const plan = template('demo');
		plan.factors.forEach((f) => (f.shape = 'gaussian'));
		const design = { ...effectiveDesign(plan), cellsPerWell: 5 };
		const r = compareDelta(plan, design, 250);
		expect(r.worstMean).toBeLessThan(r.bound);
		expect(r.worstVar).toBeLessThan(r.bound);
	});

	it('is not used where it would not be exact: non-Gaussian cells, nonlinear mixing, no controls', () => {
		const plan = template('demo');
		expect(prepareSimulation(plan, { ...effectiveDesign(plan), cellsPerWell: 10 }, { seed: 1, blocks: null }).fastPath).toBe(false);
		expect(prepareSimulation(plan, { ...effectiveDesign(plan), controlsPerPlate: 0 }, { seed: 1, blocks: null }).fastPath).toBe(false);
		const nl = template('demo');
		nl.observation.mixing = 'nonlinear';
		nl.observation.nonlinearity = 0.3;
		expect(prepareSimulation(nl, effectiveDesign(nl), { seed: 1, blocks: null }).fastPath).toBe(false);
		expect(() => prepareSimulation(nl, effectiveDesign(nl), { seed: 1, fastPath: true, blocks: null })).toThrow(/fastPath: true needs linear mixing/);
	});

	it('the targeted workload scores the same mean MCC with the shortcuts (fast path + exact population score) as with the full specification (every well, 2,000 scoring draws)', () => {
		// BENCHMARK.md `targeted`: expected mcc_mean ≈ 0.86. Independent random numbers in the two arms;
		// agreement within 3.5 SE of the difference (common practice for Monte Carlo comparisons).
		const reps = 120;
		const fast: number[] = [];
		const full: number[] = [];
		for (let rep = 0; rep < reps; rep++) {
			const plan = targetedPlan(rep);
			const design = targetedDesign(plan);
			fast.push(runReplicate(prepareSimulation(plan, design, { seed: 11, estimator: 'support', blocks: null }), rep).mcc);
			full.push(runReplicate(prepareSimulation(plan, design, { seed: 12, estimator: 'support', fastPath: false, scoreDraws: 2000, blocks: null }), rep).mcc);
		}
		const a = meanSe(fast);
		const b = meanSe(full);
		expect(Math.abs(a.mean - b.mean)).toBeLessThan(3.5 * Math.hypot(a.se, b.se));
		expect(a.mean).toBeGreaterThan(0.8);
		expect(a.mean).toBeLessThan(0.92);
	});
});
