import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { checkPlan, type CheckResult } from '../../src/lib/core/identify';
import { parsePlan } from '../../src/lib/core/plan';
import { makePlan, type ContextSpec } from './planFixture';

const check = (r: CheckResult, id: string) => {
	const c = r.checks.find((x) => x.id === id);
	if (!c) throw new Error(`no check ${id}; have ${r.checks.map((x) => x.id).join(', ')}`);
	return c;
};
const verdicts = (r: CheckResult) => Object.fromEntries(r.factors.map((f) => [f.id, f.verdict === 'block' ? `block:${f.block.join(',')}` : f.verdict]));

describe('targeted route, linear mixing', () => {
	// Worked example (DESIGN.md): {f1,f2}, {f2,f3}, {f1,f3} separate every pair yet recover no
	// factor individually — block identifiability under sparse perturbations (Ahuja, Hartford &
	// Bengio 2022, NeurIPS) with the per-factor rank condition of support-pattern unmixing.
	const triangle = makePlan({
		factors: ['f1', 'f2', 'f3'],
		reagents: [
			{ id: 'a', targets: ['f1', 'f2'] },
			{ id: 'b', targets: ['f2', 'f3'] },
			{ id: 'c', targets: ['f1', 'f3'] }
		],
		route: 'targeted'
	});

	it('the triangle separates every pair but leaves all three factors in one block', () => {
		const r = checkPlan(triangle);
		expect(r.route).toBe('targeted');
		expect(check(r, 'targeted.separation').status).toBe('pass');
		expect(check(r, 'targeted.coverage').status).toBe('pass');
		expect(check(r, 'targeted.rank').status).toBe('fail');
		expect(check(r, 'targeted.rank').source).toMatch(/Ahuja, Hartford & Bengio 2022/);
		expect(verdicts(r)).toEqual({ f1: 'block:f1,f2,f3', f2: 'block:f1,f2,f3', f3: 'block:f1,f2,f3' });
		expect(r.factors.every((f) => f.route === 'targeted')).toBe(true);
	});

	it('the rank fix names the cheapest catalogue reagent that makes a factor individual, and adding it works', () => {
		const plan = makePlan({
			factors: ['f1', 'f2', 'f3'],
			reagents: [
				{ id: 'a', targets: ['f1', 'f2'] },
				{ id: 'b', targets: ['f2', 'f3'] },
				{ id: 'c', targets: ['f1', 'f3'] },
				{ id: 'solo1', targets: ['f1'], cost: 3 },
				{ id: 'solo1cheap', targets: ['f1'], cost: 2 },
				{ id: 'dear', targets: ['f1'], cost: 30 }
			],
			route: 'targeted',
			design: { reagents: ['a', 'b', 'c'] }
		});
		const r = checkPlan(plan);
		const fix = check(r, 'targeted.rank').fix!;
		// f2 and f3 each miss one direction among {f1, …}; a reagent on f1 alone adds it.
		expect(fix.reagentId).toBe('solo1cheap');
		expect(fix.cost).toBe(2 * 4); // cost per well × 4 replicate wells (no contexts)
		expect(fix.text).toMatch(/solo1cheap/);
		const after = checkPlan(plan, { ...plan.design!, reagents: ['a', 'b', 'c', 'solo1cheap'] });
		expect(verdicts(after)).toMatchObject({ f2: 'individual', f3: 'individual' });
	});

	it('coverage: an untargeted factor that the rank condition still pins down is a warning (Squires, Seigal, Bhate & Uhler 2023, ICML)', () => {
		const plan = makePlan({
			factors: ['f1', 'f2', 'f3'],
			reagents: [
				{ id: 'a', targets: ['f1'] },
				{ id: 'b', targets: ['f2'] },
				{ id: 'spare', targets: ['f3', 'f1'], cost: 7 },
				{ id: 'c3', targets: ['f3'], cost: 4 }
			],
			route: 'targeted',
			design: { reagents: ['a', 'b'] }
		});
		const r = checkPlan(plan);
		const cov = check(r, 'targeted.coverage');
		expect(cov.status).toBe('warn');
		expect(cov.factors).toEqual(['f3']);
		expect(cov.source).toMatch(/Squires, Seigal, Bhate & Uhler 2023/);
		expect(cov.fix?.reagentId).toBe('c3');
		// With f3 untargeted, f1 and f2 each stay mixed with f3.
		expect(verdicts(r)).toEqual({ f1: 'block:f1,f3', f2: 'block:f2,f3', f3: 'individual' });
	});

	it('coverage fails when an untargeted factor is not pinned down either', () => {
		const r = checkPlan(makePlan({ factors: ['f1', 'f2', 'f3'], reagents: [{ id: 'a', targets: ['f1'] }], route: 'targeted' }));
		expect(check(r, 'targeted.coverage').status).toBe('fail');
		expect(check(r, 'targeted.coverage').factors).toEqual(['f2', 'f3']);
	});

	it('separation: factors always targeted together fail with the cheapest splitting reagent as the fix', () => {
		const plan = makePlan({
			factors: ['f1', 'f2', 'f3'],
			reagents: [
				{ id: 'pair', targets: ['f1', 'f2'], effect: { f1: 1, f2: 0.6 } },
				{ id: 'three', targets: ['f3'] },
				{ id: 'samepair', targets: ['f1', 'f2'], cost: 0.5 },
				{ id: 'onlyF1', targets: ['f1'], cost: 5 },
				{ id: 'onlyF2', targets: ['f2'], cost: 2 }
			],
			route: 'targeted',
			design: { reagents: ['pair', 'three'] }
		});
		const r = checkPlan(plan);
		const sep = check(r, 'targeted.separation');
		expect(sep.status).toBe('fail');
		expect(sep.factors).toEqual(['f1', 'f2']);
		expect(sep.source).toMatch(/Ahuja, Hartford & Bengio 2022/);
		expect(sep.fix?.reagentId).toBe('onlyF2');
		expect(sep.fix?.text).toMatch(/targets Factor f2 \(f2\) without Factor f1 \(f1\)/);
		expect(verdicts(r)).toMatchObject({ f1: 'block:f1,f2', f2: 'block:f1,f2' });
	});

	it('separation without a catalogue reagent describes the reagent needed', () => {
		const r = checkPlan(makePlan({ factors: ['f3', 'f4'], reagents: [{ id: 'p', targets: ['f3', 'f4'] }], route: 'targeted' }));
		expect(check(r, 'targeted.separation').fix?.text).toBe('Add a reagent that targets Factor f3 (f3) without Factor f4 (f4).');
	});

	it('exact degeneracy: identical effect vectors give a warning and the verdict stays structural', () => {
		const r = checkPlan(
			makePlan({
				factors: ['f1', 'f2', 'f3'],
				reagents: [
					{ id: 'twinA', targets: ['f1', 'f2'], effect: { f1: 0.8, f2: 1.3 } },
					{ id: 'twinB', targets: ['f1', 'f2'], effect: { f1: 0.8, f2: 1.3 } },
					{ id: 's3', targets: ['f3'] }
				],
				route: 'targeted'
			})
		);
		const ex = check(r, 'targeted.exact');
		expect(ex.status).toBe('warn');
		expect(ex.factors).toEqual(['f3']);
		expect(ex.message).toMatch(/twinA .* and twinB .* have identical effects/);
		expect(ex.source).toMatch(/rank of the effect matrix/);
		expect(r.factors.find((f) => f.id === 'f3')!.verdict).toBe('individual');
	});

	it('exact degeneracy: the 4-cycle with equal effects (determinant 1 − 1 = 0 by the Leibniz formula)', () => {
		const r = checkPlan(
			makePlan({
				factors: ['f1', 'f2', 'f3', 'f4', 'f5'],
				reagents: [
					{ id: 'e12', targets: ['f1', 'f2'] },
					{ id: 'e23', targets: ['f2', 'f3'] },
					{ id: 'e34', targets: ['f3', 'f4'] },
					{ id: 'e14', targets: ['f1', 'f4'] },
					{ id: 'e5', targets: ['f5'] }
				],
				route: 'targeted'
			})
		);
		expect(check(r, 'targeted.exact').status).toBe('warn');
		expect(check(r, 'targeted.exact').factors).toEqual(['f5']);
	});

	it('unknown targets are left out with a warning; with only those, a named targeted route does not apply', () => {
		const mixed = checkPlan(makePlan({ factors: ['f1'], reagents: [{ id: 'k', targets: ['f1'] }, { id: 'u', targets: null }], route: 'targeted' }));
		expect(check(mixed, 'targeted.unknown').status).toBe('warn');
		expect(check(mixed, 'targeted.unknown').message).toMatch(/simulation with sparsity-seeking unmixing/);
		const only = checkPlan(makePlan({ factors: ['f1', 'f2'], reagents: [{ id: 'u', targets: null }], route: 'targeted' }));
		expect(check(only, 'targeted.applicable').status).toBe('fail');
		expect(verdicts(only)).toEqual({ f1: 'none', f2: 'none' });
		expect(only.factors.every((f) => f.route === null && f.block.length === 0)).toBe(true);
	});
});

describe('targeted route, nonlinear mixing (hard interventions)', () => {
	// One single-target hard intervention per factor: Ahuja, Mahajan, Wang & Bengio 2023 (ICML,
	// polynomial decoders; one per latent is from memory) and Buchholz et al. 2023 (NeurIPS, linear
	// latent model); two distinct ones for the nonparametric case: von Kügelgen et al. 2023 (NeurIPS).
	const plan = (reagents: Parameters<typeof makePlan>[0]['reagents'], nonlinearity = 0.5) =>
		makePlan({ factors: ['f1', 'f2'], reagents, mixing: 'nonlinear', nonlinearity, route: 'targeted' });

	it('two clamps at different values pass; one clamp warns; both factors individual', () => {
		const r = checkPlan(
			plan([
				{ id: 'k1a', targets: ['f1'], kind: 'clamp', effect: 1.5 },
				{ id: 'k1b', targets: ['f1'], kind: 'clamp', effect: -1 },
				{ id: 'k2', targets: ['f2'], kind: 'clamp', effect: 2 }
			])
		);
		expect(check(r, 'targeted.hard').status).toBe('warn');
		expect(check(r, 'targeted.hard').factors).toEqual(['f2']);
		expect(check(r, 'targeted.hard').source).toMatch(/von Kügelgen et al\. 2023/);
		expect(verdicts(r)).toEqual({ f1: 'individual', f2: 'individual' });
		const both = checkPlan(
			plan([
				{ id: 'k1a', targets: ['f1'], kind: 'clamp', effect: 1.5 },
				{ id: 'k1b', targets: ['f1'], kind: 'clamp', effect: -1 },
				{ id: 'k2a', targets: ['f2'], kind: 'clamp', effect: 2 },
				{ id: 'k2b', targets: ['f2'], kind: 'clamp', effect: 0.5 }
			])
		);
		expect(check(both, 'targeted.hard').status).toBe('pass');
	});

	it('a factor with only shifts or multi-target clamps gets none, with the clamp fix', () => {
		const r = checkPlan(
			plan([
				{ id: 'k1', targets: ['f1'], kind: 'clamp', effect: 1 },
				{ id: 's2', targets: ['f2'], kind: 'shift', effect: 1 },
				{ id: 'k12', targets: ['f1', 'f2'], kind: 'clamp', effect: 1 }
			])
		);
		const hard = check(r, 'targeted.hard');
		expect(hard.status).toBe('fail');
		expect(hard.fix?.text).toBe('Add a clamp reagent that targets only Factor f2 (f2).');
		expect(verdicts(r)).toEqual({ f1: 'individual', f2: 'none' });
	});

	it('two clamps to the same value count as one intervention (our reading of "distinct" in von Kügelgen et al. 2023 — from memory)', () => {
		const r = checkPlan(
			plan([
				{ id: 'k1a', targets: ['f1'], kind: 'clamp', effect: 1 },
				{ id: 'k1b', targets: ['f1'], kind: 'clamp', effect: 1 },
				{ id: 'k2a', targets: ['f2'], kind: 'clamp', effect: 2 },
				{ id: 'k2b', targets: ['f2'], kind: 'clamp', effect: 0.5 }
			])
		);
		expect(check(r, 'targeted.hard').status).toBe('warn');
		expect(check(r, 'targeted.hard').factors).toEqual(['f1']);
	});

	it("mixing 'nonlinear' with nonlinearity 0 behaves exactly like linear", () => {
		const reagents = [
			{ id: 'a', targets: ['f1', 'f2'] },
			{ id: 'b', targets: ['f2'] }
		];
		const nl0 = checkPlan(plan(reagents, 0));
		const lin = checkPlan(makePlan({ factors: ['f1', 'f2'], reagents, route: 'targeted' }));
		expect(nl0.checks).toEqual(lin.checks);
		expect(nl0.factors).toEqual(lin.factors);
	});
});

describe('contexts route', () => {
	const ctxPlan = (contexts: Parameters<typeof makePlan>[0]['contexts'], mixing: 'linear' | 'nonlinear' = 'linear', factors = ['f1', 'f2', 'f3'], design?: string[]) =>
		makePlan({ factors, contexts, mixing, route: 'contexts', reagents: [{ id: 'r', targets: [factors[0]] }], design: design ? { reagents: ['r'], contexts: design } : undefined });

	// Linear mixing: joint diagonalisation of per-context covariances separates factors whose
	// variance profiles are pairwise non-proportional (Pham & Cardoso 2001, IEEE TSP 49(9) — the
	// condition is stated from memory, not verified against the paper).
	it('linear: non-proportional variance profiles pass, every factor individual', () => {
		const r = checkPlan(ctxPlan([{ id: 'c0' }, { id: 'c1', variance: { f1: 2 } }, { id: 'c2', variance: { f2: 3 } }]));
		expect(check(r, 'contexts.variance').status).toBe('pass');
		expect(verdicts(r)).toEqual({ f1: 'individual', f2: 'individual', f3: 'individual' });
	});

	it('linear: proportional profiles (1, 2, 4) and (0.5, 1, 2) form a block (from memory: Pham & Cardoso 2001)', () => {
		const r = checkPlan(
			ctxPlan(
				[
					{ id: 'c0', variance: { f2: 0.5 } },
					{ id: 'c1', variance: { f1: 2, f2: 1, f3: 3 } },
					{ id: 'c2', variance: { f1: 4, f2: 2 } },
					{ id: 'c3', variance: { f2: 3 } }
				],
				'linear',
				['f1', 'f2', 'f3'],
				['c0', 'c1', 'c2']
			)
		);
		const v = check(r, 'contexts.variance');
		expect(v.status).toBe('fail');
		expect(v.factors).toEqual(['f1', 'f2']);
		expect(v.source).toMatch(/Pham & Cardoso 2001/);
		// The unused catalogue context c3 changes f2 but not f1: it splits the block.
		expect(v.fix?.text).toMatch(/^Add context c3 \(Context c3\)/);
		expect(verdicts(r)).toEqual({ f1: 'block:f1,f2', f2: 'block:f1,f2', f3: 'individual' });
	});

	it('linear without a catalogue context: the fix describes the context needed', () => {
		const r = checkPlan(ctxPlan([{ id: 'c0' }, { id: 'c1', variance: { f3: 2 } }]));
		expect(check(r, 'contexts.variance').fix?.text).toBe('Add a context that changes the variance of Factor f1 (f1) but not Factor f2 (f2).');
	});

	it('a named contexts route with one context does not apply', () => {
		const r = checkPlan(ctxPlan([{ id: 'c0' }]));
		expect(check(r, 'contexts.applicable').status).toBe('fail');
		expect(verdicts(r)).toEqual({ f1: 'none', f2: 'none', f3: 'none' });
	});

	// Nonlinear mixing: Khemakhem, Kingma, Monti & Hyvärinen 2020 (AISTATS), Theorem 1: n·k + 1
	// contexts with an invertible nk × nk modulation matrix (k = 1 variance only, k = 2 mean and variance).
	it('nonlinear, variance only (k = 1): n = 2 needs 3 contexts; 2 fail, 3 generic pass', () => {
		const two = checkPlan(ctxPlan([{ id: 'c0' }, { id: 'c1', variance: { f1: 2 } }], 'nonlinear', ['f1', 'f2']));
		const m = check(two, 'contexts.modulation');
		expect(m.status).toBe('fail');
		expect(m.message).toMatch(/at least n·k \+ 1 = 3 contexts/);
		expect(m.source).toMatch(/Khemakhem, Kingma, Monti & Hyvärinen 2020 \(AISTATS\), Theorem 1/);
		expect(verdicts(two)).toEqual({ f1: 'none', f2: 'none' });
		const three = checkPlan(ctxPlan([{ id: 'c0' }, { id: 'c1', variance: { f1: 2 } }, { id: 'c2', variance: { f2: 2 } }], 'nonlinear', ['f1', 'f2']));
		expect(check(three, 'contexts.modulation').status).toBe('pass');
		expect(verdicts(three)).toEqual({ f1: 'individual', f2: 'individual' });
	});

	it('nonlinear, means and variances (k = 2): n = 2 needs 5 contexts; 4 fail, 5 generic pass', () => {
		const contexts: ContextSpec[] = [
			{ id: 'c0' },
			{ id: 'c1', mean: { f1: 1 }, variance: { f1: 2 } },
			{ id: 'c2', mean: { f2: -1 }, variance: { f2: 3 } },
			{ id: 'c3', mean: { f1: 0.5, f2: 0.5 }, variance: { f1: 0.5 } },
			{ id: 'c4', variance: { f1: 1.5, f2: 0.5 } }
		];
		const four = checkPlan(ctxPlan(contexts.slice(0, 4), 'nonlinear', ['f1', 'f2']));
		expect(check(four, 'contexts.modulation').status).toBe('fail');
		expect(check(four, 'contexts.modulation').message).toMatch(/= 5 contexts/);
		const five = checkPlan(ctxPlan(contexts, 'nonlinear', ['f1', 'f2']));
		expect(check(five, 'contexts.modulation').status).toBe('pass');
	});

	it('nonlinear with enough contexts but a rank-deficient modulation matrix fails', () => {
		// f1 and f2 change their variance identically: the two rows of L coincide (rank 1 < 2).
		const r = checkPlan(ctxPlan([{ id: 'c0' }, { id: 'c1', variance: { f1: 2, f2: 2 } }, { id: 'c2', variance: { f1: 3, f2: 3 } }], 'nonlinear', ['f1', 'f2']));
		expect(check(r, 'contexts.modulation').status).toBe('fail');
		expect(check(r, 'contexts.modulation').message).toMatch(/rank 1, it needs 2/);
	});

	it('nonlinear with contexts that change only means: one block of all factors (Khemakhem et al. 2020, Proposition 1)', () => {
		const r = checkPlan(
			ctxPlan(
				[{ id: 'c0' }, { id: 'c1', mean: { f1: 1 } }, { id: 'c2', mean: { f2: 1 } }, { id: 'c3', mean: { f1: -1, f2: 2 } }, { id: 'c4', mean: { f2: -2 } }],
				'nonlinear',
				['f1', 'f2']
			)
		);
		const m = check(r, 'contexts.modulation');
		expect(m.status).toBe('fail');
		expect(m.source).toMatch(/Proposition 1/);
		expect(verdicts(r)).toEqual({ f1: 'block:f1,f2', f2: 'block:f1,f2' });
	});
});

describe('observational route', () => {
	it('two Gaussian factors form a block, the others are individual (Comon 1994, Signal Processing 36:287–314)', () => {
		const r = checkPlan(makePlan({ factors: [['g1', 'gaussian'], ['l', 'laplace'], ['g2', 'gaussian']], route: 'observational', reagents: [{ id: 'r', targets: ['l'] }] }));
		const g = check(r, 'observational.gaussian');
		expect(g.status).toBe('fail');
		expect(g.factors).toEqual(['g1', 'g2']);
		expect(g.source).toMatch(/Comon 1994/);
		expect(verdicts(r)).toEqual({ g1: 'block:g1,g2', l: 'individual', g2: 'block:g1,g2' });
	});

	it('one Gaussian factor is fine', () => {
		const r = checkPlan(makePlan({ factors: [['g1', 'gaussian'], ['u', 'uniform'], ['b', 'bimodal']], route: 'observational', reagents: [{ id: 'r', targets: ['u'] }] }));
		expect(check(r, 'observational.gaussian').status).toBe('pass');
		expect(verdicts(r)).toEqual({ g1: 'individual', u: 'individual', b: 'individual' });
	});

	it('nonlinear mixing without auxiliary information recovers nothing (Hyvärinen & Pajunen 1999; Locatello et al. 2019)', () => {
		const r = checkPlan(makePlan({ factors: ['f1', 'f2'], mixing: 'nonlinear', route: 'observational', reagents: [{ id: 'r', targets: ['f1'] }] }));
		const c = check(r, 'observational.nonlinear');
		expect(c.status).toBe('fail');
		expect(c.source).toMatch(/Hyvärinen & Pajunen 1999/);
		expect(verdicts(r)).toEqual({ f1: 'none', f2: 'none' });
	});
});

describe('route auto', () => {
	it('keeps the best verdict per factor and names the route that gives it', () => {
		// Targeted: g1, g2 individual, l in a block of all three; observational: g1, g2 Gaussian block, l individual.
		const r = checkPlan(
			makePlan({
				factors: [['g1', 'gaussian'], ['g2', 'gaussian'], ['l', 'laplace']],
				reagents: [
					{ id: 'A', targets: ['g2', 'l'] },
					{ id: 'B', targets: ['g1', 'l'] },
					{ id: 'C', targets: ['l'] }
				]
			})
		);
		expect(r.routes.map((x) => [x.route, x.applicable])).toEqual([
			['targeted', true],
			['contexts', false],
			['observational', true]
		]);
		expect(verdicts(r)).toEqual({ g1: 'individual', g2: 'individual', l: 'individual' });
		expect(r.factors.map((f) => f.route)).toEqual(['targeted', 'targeted', 'observational']);
		expect(r.route).toBe('targeted'); // 2 individual against 1
		// Checks of the inapplicable contexts route are left out.
		expect(r.checks.some((c) => c.route === 'contexts')).toBe(false);
	});

	it('ties between routes go to targeted first', () => {
		const r = checkPlan(makePlan({ factors: ['f1', 'f2'], reagents: [{ id: 'a', targets: ['f1'] }, { id: 'b', targets: ['f2'] }] }));
		expect(r.route).toBe('targeted');
		expect(r.factors.every((f) => f.route === 'targeted')).toBe(true);
	});

	it('a factor no route recovers is none with the reasons of every route', () => {
		const r = checkPlan(makePlan({ factors: ['f1', 'f2'], mixing: 'nonlinear', reagents: [{ id: 'a', targets: ['f1'], kind: 'clamp', effect: 1 }] }));
		expect(verdicts(r)).toEqual({ f1: 'individual', f2: 'none' });
		expect(r.factors[1].reason).toMatch(/^No route recovers it/);
		expect(r.route).toBe('targeted');
	});
});

describe('practical checks', () => {
	const base = (design: { replicates?: number; controlsPerPlate?: number; contexts?: string[]; reagents?: string[] }, budget = {}, maxWells?: number) =>
		makePlan({
			factors: ['f1', 'f2'],
			reagents: [
				{ id: 'a', targets: ['f1'], cost: 1, maxWells },
				{ id: 'b', targets: ['f2'], cost: 1 },
				{ id: 'c', targets: ['f1'], cost: 50 }
			],
			contexts: [{ id: 'c0' }, { id: 'c1', variance: { f1: 2 } }],
			route: 'targeted',
			design: { reagents: design.reagents ?? ['a', 'b'], replicates: design.replicates, controlsPerPlate: design.controlsPerPlate, contexts: design.contexts },
			budget
		});

	it('replicates: 1 fails, 2 passes (common practice)', () => {
		expect(check(checkPlan(base({ replicates: 1 })), 'practical.replicates').status).toBe('fail');
		expect(check(checkPlan(base({ replicates: 2 })), 'practical.replicates').status).toBe('pass');
	});

	it('controls: 0 fails, 4 warns, 8 passes (common practice: 8–16 per plate)', () => {
		expect(check(checkPlan(base({ controlsPerPlate: 0 })), 'practical.controls').status).toBe('fail');
		expect(check(checkPlan(base({ controlsPerPlate: 4 })), 'practical.controls').status).toBe('warn');
		expect(check(checkPlan(base({ controlsPerPlate: 8 })), 'practical.controls').status).toBe('pass');
	});

	it('stock: replicates × contexts above maxWells fails, naming the reagent', () => {
		const r = checkPlan(base({ replicates: 4, contexts: ['c0', 'c1'] }, {}, 6));
		const s = check(r, 'practical.stock');
		expect(s.status).toBe('fail');
		expect(s.message).toMatch(/a \(Reagent a\) needs 8 wells but stock covers 6/);
		expect(s.fix?.text).toMatch(/at most 3 replicate wells/);
		expect(check(checkPlan(base({ replicates: 3, contexts: ['c0', 'c1'] }, {}, 6)), 'practical.stock').status).toBe('pass');
	});

	it('capacity: a 96-well plate with the edge excluded and 60 controls has no treatment wells (ANSI/SLAS 4-2004: 8 × 12, 36 edge wells)', () => {
		const r = checkPlan(base({ controlsPerPlate: 60 }, { plateFormat: 96, excludeEdgeWells: true }));
		expect(check(r, 'practical.capacity').status).toBe('fail');
		expect(check(r, 'practical.budget').message).toMatch(/cannot be costed/);
	});

	it('budget: over budget fails with the amounts and suggests dropping the most expensive redundant reagent', () => {
		// Cost model arithmetic (DESIGN.md "Sizing"): 1 plate × 100 + 4 wells × (1 + 1 + 50) = 308 EUR.
		const r = checkPlan(base({ reagents: ['a', 'b', 'c'] }, { total: 200 }));
		const b = check(r, 'practical.budget');
		expect(b.status).toBe('fail');
		expect(b.message).toBe('The design costs 308 EUR, over the budget of 200 EUR by 108 EUR.');
		expect(b.fix?.reagentId).toBe('c');
		expect(b.fix?.cost).toBe(-200);
		expect(b.fix?.text).toMatch(/^Drop c \(Reagent c\), which no verdict needs \(the design then costs 108 EUR\)/);
		expect(check(checkPlan(base({ reagents: ['a', 'b', 'c'] }, { total: 308 })), 'practical.budget').status).toBe('pass');
	});

	it('budget: fewer replicates are suggested when no reagent is redundant', () => {
		// 100 + 6 reps × 2 wells… : a and b each needed; 6 replicates cost 112, 2 replicates cost 104.
		const r = checkPlan(base({ reagents: ['a', 'b'], replicates: 6 }, { total: 105 }));
		expect(check(r, 'practical.budget').fix?.text).toBe('Use 2 replicate wells instead of 6 (the design then costs 104 EUR).');
	});
});

describe('checkPlan — inputs, templates, cautions', () => {
	it('throws on a design naming unknown reagents or contexts', () => {
		const plan = makePlan({ factors: ['f1'], reagents: [{ id: 'a', targets: ['f1'] }] });
		expect(() => checkPlan(plan, { reagents: ['zz'], replicates: 2, controlsPerPlate: 8, contexts: [] })).toThrow(/design\.reagents\[0\]: unknown reagent "zz"/);
		expect(() => checkPlan(plan, { reagents: ['a'], replicates: 2, controlsPerPlate: 8, contexts: ['nope'] })).toThrow(/design\.contexts\[0\]: unknown context "nope"/);
	});

	it('does not mutate the plan', () => {
		const plan = makePlan({ factors: ['f1', 'f2'], reagents: [{ id: 'a', targets: ['f1', 'f2'] }] });
		const copy = structuredClone(plan);
		checkPlan(plan);
		expect(plan).toEqual(copy);
	});

	it('every result carries the standing cautions (pilot, statistician, biosafety)', () => {
		const r = checkPlan(makePlan({ factors: ['f1'], reagents: [{ id: 'a', targets: ['f1'] }] }));
		const text = r.cautions.join(' ');
		expect(text).toMatch(/pilot/);
		expect(text).toMatch(/statistician/);
		expect(text).toMatch(/biosafety/);
	});

	it('the shipped templates check as their scenarios intend', () => {
		const load = (f: string) => parsePlan(readFileSync(`templates/${f}`, 'utf8'));
		const demo = checkPlan(load('demo.json'));
		expect(demo.route).toBe('targeted');
		expect(demo.factors.every((f) => f.verdict === 'individual')).toBe(true);
		const multi = checkPlan(load('multi-context.json'));
		expect(multi.route).toBe('contexts');
		expect(multi.factors.every((f) => f.verdict === 'individual')).toBe(true);
		const unknown = checkPlan(load('unknown-targets.json'));
		expect(unknown.route).toBe('observational');
		expect(check(unknown, 'targeted.unknown').status).toBe('warn');
	});
});
