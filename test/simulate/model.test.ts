import { describe, expect, it } from 'vitest';
import { effectiveDesign } from '../../src/lib/core/plan';
import { applyMixing, drawFactor, drawMixing, drawWorld, excessKurtosis, prepareSimulation, realiseReagent, rngFor, runReplicate, simulateWells } from '../../src/lib/core/simulate';
import { symEigen } from '../../src/lib/core/linalg';
import { smallPlan, template } from './helpers';

describe('factor shapes', () => {
	it.each(['gaussian', 'laplace', 'uniform', 'bimodal'] as const)('%s is standardised (mean 0, variance 1) with the stated excess kurtosis', (shape) => {
		// Excess kurtosis: normal 0, Laplace 3, uniform −6/5 (standard handbook values, e.g. Johnson, Kotz &
		// Balakrishnan, Continuous Univariate Distributions — from memory); bimodal from its mixture moments.
		const r = rngFor(77);
		const n = 200_000;
		let m = 0,
			v = 0,
			k = 0;
		const xs = new Float64Array(n);
		for (let i = 0; i < n; i++) m += xs[i] = drawFactor(shape, r);
		m /= n;
		for (let i = 0; i < n; i++) {
			const c = xs[i] - m;
			v += c * c;
			k += c ** 4;
		}
		v /= n;
		k = k / n / (v * v) - 3;
		expect(Math.abs(m)).toBeLessThan(0.01); // SE 1/√n = 0.0022
		expect(Math.abs(v - 1)).toBeLessThan(0.02); // SE √((κ+2)/n) ≤ 0.005
		expect(Math.abs(k - excessKurtosis(shape))).toBeLessThan(shape === 'laplace' ? 0.3 : 0.05);
	});
	it('the handbook kurtosis values are the ones used', () => {
		expect(excessKurtosis('laplace')).toBe(3);
		expect(excessKurtosis('uniform')).toBe(-1.2);
		expect(excessKurtosis('gaussian')).toBe(0);
	});
});

describe('mixing', () => {
	it('λ = 0 gives exactly A·z', () => {
		const mix = drawMixing(7, 3, rngFor(1), { nonlinearity: 0 });
		const z = [0.3, -1.2, 2.5];
		const x = new Float64Array(7);
		applyMixing(mix, z, 0, x, 0);
		for (let i = 0; i < 7; i++) expect(x[i]).toBe(mix.a[i * 3] * z[0] + mix.a[i * 3 + 1] * z[1] + mix.a[i * 3 + 2] * z[2]);
	});
	it('the residual branch λ·V·tanh(U·z) has Lipschitz constant ≤ λ < 1, so z ↦ z + branch is invertible', () => {
		// Invertible residual maps need Lip(branch) < 1 (Behrmann et al. 2019 — from memory).
		const d = 5;
		const lambda = 0.8;
		const mix = drawMixing(d, d, rngFor(2), { nonlinearity: lambda });
		const r = rngFor(3);
		const branch = (z: number[]) => {
			const h = Array.from({ length: d }, (_, i) => Math.tanh(z.reduce((s, v, j) => s + mix.u![i * d + j] * v, 0)));
			return Array.from({ length: d }, (_, i) => lambda * h.reduce((s, v, j) => s + mix.v![i * d + j] * v, 0));
		};
		let worst = 0;
		for (let t = 0; t < 2000; t++) {
			const z1 = Array.from({ length: d }, () => 2 * r.normal());
			const z2 = z1.map((v) => v + 0.5 * r.normal());
			const b1 = branch(z1);
			const b2 = branch(z2);
			worst = Math.max(worst, Math.hypot(...b1.map((v, i) => v - b2[i])) / Math.hypot(...z1.map((v, i) => v - z2[i])));
		}
		expect(worst).toBeLessThanOrEqual(lambda + 1e-12);
		expect(() => drawMixing(3, 2, rngFor(1), { nonlinearity: 1 })).toThrow(/nonlinearity must be in \[0, 1\)/);
	});
	it('a stated condition range resets the singular values (condition number = √(λmax/λmin) of AᵀA)', () => {
		const mix = drawMixing(20, 4, rngFor(5), { condition: [3, 3] });
		const g = new Float64Array(16);
		for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) for (let t = 0; t < 20; t++) g[i * 4 + j] += mix.a[t * 4 + i] * mix.a[t * 4 + j];
		const e = symEigen(g, 4);
		expect(Math.sqrt(e.values[3] / e.values[0])).toBeCloseTo(3, 8);
	});
	it('nonlinear mixing with λ = 0 reproduces the linear replicate exactly', () => {
		const lin = template('demo');
		const nl = template('demo');
		nl.observation.mixing = 'nonlinear';
		nl.observation.nonlinearity = 0;
		for (const fastPath of [true, false] as const) {
			const a = prepareSimulation(lin, effectiveDesign(lin), { seed: 5, fastPath, blocks: null });
			const b = prepareSimulation(nl, effectiveDesign(nl), { seed: 5, fastPath, blocks: null });
			expect(b.estimator).toBe(a.estimator);
			for (const rep of [0, 1, 2]) expect(runReplicate(b, rep)).toEqual(runReplicate(a, rep));
		}
	});
});

describe('realised reagents', () => {
	it('unknown targets are drawn without replacement; effect uncertainty is log-normal with the stated CV', () => {
		const plan = template('unknown-targets');
		const reagent = plan.reagents.find((r) => r.targets === null && (r.expectedTargets ?? 1) === 2)!;
		const ids = plan.factors.map((f) => f.id);
		const values: number[] = [];
		for (let rep = 0; rep < 4000; rep++) {
			const rr = realiseReagent({ ...reagent, effect: 1, effectCv: 0.3 }, 0, ids, 9, rep);
			expect(rr.targets.length).toBe(2);
			expect(new Set(rr.targets).size).toBe(2);
			values.push(rr.effect[rr.targets[0]]);
		}
		const mean = values.reduce((s, v) => s + v, 0) / values.length;
		const sd = Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (values.length - 1));
		expect(mean).toBeGreaterThan(0.98); // mean 1, SE 0.3/√4000 = 0.005
		expect(mean).toBeLessThan(1.02);
		expect(sd / mean).toBeGreaterThan(0.27);
		expect(sd / mean).toBeLessThan(0.33);
		expect(Math.min(...values)).toBeGreaterThan(0); // sign kept
	});
});

describe('common random numbers', () => {
	it('changing the design leaves the mixing, every other reagent’s realised effect and every other well’s draws unchanged', () => {
		const plan = smallPlan({ plateEffect: 0 });
		plan.reagents.push({ id: 'x1', name: 'extra', targets: ['f1', 'f2'], kind: 'shift', effect: 0.8, efficacy: 1, costPerWell: 1 });
		const small = { reagents: ['r1', 'r2', 'r3'], replicates: 3, controlsPerPlate: 8, contexts: [] };
		const large = { reagents: ['r1', 'x1', 'r2', 'r3'], replicates: 5, controlsPerPlate: 8, contexts: [] };
		const a = prepareSimulation(plan, small, { seed: 21, fastPath: false, blocks: null });
		const b = prepareSimulation(plan, large, { seed: 21, fastPath: false, blocks: null });
		const wa = drawWorld(a, 4);
		const wb = drawWorld(b, 4);
		expect(wb.mixing.a).toEqual(wa.mixing.a);
		expect(wb.reagents[0]).toEqual(wa.reagents[0]);
		expect(wb.reagents[2]).toEqual(wa.reagents[1]);
		const da = simulateWells(a, wa, 4);
		const db = simulateWells(b, wb, 4);
		// with one plate and no plate effect, r2's first three replicate wells are identical
		const p = plan.observation.features;
		const rowA = a.wellReagent.findIndex((k, w) => k === 1 && a.wellReplicate[w] === 2);
		const rowB = b.wellReagent.findIndex((k, w) => k === 2 && b.wellReplicate[w] === 2);
		expect(Array.from(db.profiles.subarray(rowB * p, rowB * p + p))).toEqual(Array.from(da.profiles.subarray(rowA * p, rowA * p + p)));
	});
	it('replicates are deterministic in (seed, rep) and independent of the order they run in', () => {
		const plan = template('demo');
		const prep = prepareSimulation(plan, effectiveDesign(plan), { seed: 8, blocks: null });
		const forward = [0, 1, 2, 3].map((r) => runReplicate(prep, r));
		const backward = [3, 2, 1, 0].map((r) => runReplicate(prep, r)).reverse();
		expect(backward).toEqual(forward);
		expect(JSON.parse(JSON.stringify(prep))).toEqual(prep); // plain serialisable data
	});
});

describe('prepareSimulation', () => {
	it('resolves route and estimator as documented', () => {
		const demo = template('demo');
		const p1 = prepareSimulation(demo, effectiveDesign(demo), { seed: 1, blocks: null });
		expect([p1.route, p1.estimator]).toEqual(['targeted', 'support']);
		const unk = template('unknown-targets');
		const p2 = prepareSimulation(unk, effectiveDesign(unk), { seed: 1, blocks: null });
		expect([p2.route, p2.estimator]).toEqual(['targeted', 'sparse']);
		const ctx = template('multi-context');
		const p3 = prepareSimulation(ctx, effectiveDesign(ctx), { seed: 1, blocks: null });
		expect([p3.route, p3.estimator]).toEqual(['contexts', 'jointdiag']);
		const p4 = prepareSimulation(ctx, { ...effectiveDesign(ctx), reagents: [], contexts: [] }, { seed: 1, route: 'auto', blocks: null });
		expect([p4.route, p4.estimator]).toEqual(['observational', 'fastica']);
		demo.observation.mixing = 'nonlinear';
		demo.observation.nonlinearity = 0.4;
		const p5 = prepareSimulation(demo, effectiveDesign(demo), { seed: 1, blocks: null });
		expect([p5.estimator, p5.linearStep, p5.scoreMethod]).toEqual(['contrastive', 'support', 'spearman']);
	});
	it('names the field in caller mistakes', () => {
		const demo = template('demo');
		expect(() => prepareSimulation(demo, { ...effectiveDesign(demo), reagents: ['nope'] }, { seed: 1 })).toThrow(/design.reagents\[0\]: unknown reagent "nope"/);
		expect(() => prepareSimulation(demo, effectiveDesign(demo), { seed: 1, estimator: 'magic' as never })).toThrow(/estimator must be one of/);
		expect(() => prepareSimulation(demo, effectiveDesign(demo), { seed: 1, blocks: [['mem', 'zzz']] })).toThrow(/blocks\[0\]\[1\]: unknown factor "zzz"/);
		expect(() => runReplicate(prepareSimulation(demo, effectiveDesign(demo), { seed: 1, blocks: null }), -1)).toThrow(/rep must be an integer ≥ 0/);
	});
	it('warns where the route needs cells but the plan simulates well means only', () => {
		const ctx = template('multi-context');
		const prep = prepareSimulation(ctx, { ...effectiveDesign(ctx), cellsPerWell: 0 }, { seed: 1, blocks: null });
		expect(prep.warnings.join(' ')).toMatch(/cellsPerWell is 0/);
	});
});
