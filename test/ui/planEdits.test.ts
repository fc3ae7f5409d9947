import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { parsePlan, validatePlan, type Plan } from '../../src/lib/core/plan';
import {
	addContext,
	addFactor,
	addReagent,
	applyFix,
	fixAction,
	idProblem,
	removeContext,
	removeFactor,
	removeReagent,
	renameFactor,
	renameReagent,
	setContextValue,
	setDesignContext,
	setDesignFixed,
	setDesignReagent,
	setEffectMode,
	setTargets
} from '../../src/lib/ui/planEdits';

const load = (name: string): Plan => parsePlan(readFileSync(`templates/${name}.json`, 'utf8'));
const valid = (plan: Plan) => expect(validatePlan(plan)).toEqual([]);

describe('factor edits keep references valid', () => {
	it('removing a factor drops it from targets, per-target effects and contexts', () => {
		const plan = load('demo');
		const out = removeFactor(plan, 'mem');
		valid(plan);
		// kb101 and kb102 targeted only mem: removed. kb701 and kb704 keep their other target.
		expect(out.reagentsRemoved).toEqual(['kb101', 'kb102']);
		expect(out.reagentsChanged).toEqual(['kb701', 'kb704']);
		expect(plan.reagents.find((r) => r.id === 'kb701')).toMatchObject({ targets: ['resp'], effect: { resp: 1.2 } });
		expect(plan.factors.map((f) => f.id)).not.toContain('mem');
	});

	it('removing a factor clears context values and design entries', () => {
		const plan = load('multi-context');
		setDesignFixed(plan, true);
		const out = removeFactor(plan, 'stress');
		valid(plan);
		expect(out.contextsChanged).toEqual(['c_lowO2', 'c_cold']);
		expect(plan.contexts.every((c) => !('stress' in c.mean) && !('stress' in c.variance))).toBe(true);
		expect(plan.design!.reagents).not.toContain('g3');
	});

	it('lowers expected target counts above the new number of factors', () => {
		const plan = load('unknown-targets');
		setTargets(plan, 'lib07', null, 5);
		const out = removeFactor(plan, 'lip');
		valid(plan);
		expect(out.expectedTargetsLowered).toEqual(['lib07']);
		expect(plan.reagents.find((r) => r.id === 'lib07')!.expectedTargets).toBe(4);
	});

	it('resets a fixed design that loses its last reagent', () => {
		const plan = load('demo');
		setDesignFixed(plan, true);
		plan.design!.reagents = ['kb101'];
		const out = removeFactor(plan, 'mem');
		expect(out.designReset).toBe(true);
		expect(plan.design).toBeNull();
		valid(plan);
	});

	it('refuses to remove the last factor or an unknown one', () => {
		const plan = load('demo');
		expect(() => removeFactor(plan, 'zz')).toThrow(/no factor with id "zz"/);
		for (const f of plan.factors.slice(1).map((f) => f.id)) removeFactor(plan, f);
		expect(() => removeFactor(plan, plan.factors[0].id)).toThrow(/at least one factor/);
	});

	it('renames a factor id everywhere', () => {
		const plan = load('multi-context');
		renameFactor(plan, 'stress', 'oxstress');
		valid(plan);
		expect(JSON.stringify(plan)).not.toMatch(/"stress"/);
		expect(plan.contexts[1].variance).toHaveProperty('oxstress', 2);
		expect(() => renameFactor(plan, 'prol', 'diff')).toThrow(/already used/);
		expect(() => renameFactor(plan, 'prol', '9x')).toThrow(/starting with a letter/);
	});

	it('idProblem explains ids', () => {
		expect(idProblem('ok_1', ['a'])).toBeNull();
		expect(idProblem('a', ['a'], 'a')).toBeNull();
		expect(idProblem('a', ['a'])).toMatch(/already used/);
		expect(idProblem('', [])).toMatch(/^expected an id/);
	});

	it('adds factors with fresh ids', () => {
		const plan = load('demo');
		expect(addFactor(plan)).toBe('f1');
		expect(addFactor(plan)).toBe('f2');
		valid(plan);
	});
});

describe('reagent edits', () => {
	it('setting targets keeps per-target effects in step', () => {
		const plan = load('demo');
		setTargets(plan, 'kb701', ['mem', 'resp', 'cyc']);
		expect(plan.reagents.find((r) => r.id === 'kb701')!.effect).toEqual({ mem: 0.6, resp: 1.2, cyc: 0.9 });
		setTargets(plan, 'kb701', ['cyc']);
		expect(plan.reagents.find((r) => r.id === 'kb701')!.effect).toEqual({ cyc: 0.9 });
		valid(plan);
	});

	it('targets are kept in plan factor order', () => {
		const plan = load('demo');
		setTargets(plan, 'kb101', ['nuc', 'mem']);
		expect(plan.reagents[0].targets).toEqual(['mem', 'nuc']);
	});

	it('unknown targets collapse a per-target effect to its mean and need a count', () => {
		const plan = load('demo');
		setTargets(plan, 'kb701', null, 2);
		expect(plan.reagents.find((r) => r.id === 'kb701')).toMatchObject({ targets: null, expectedTargets: 2, effect: 0.9 });
		valid(plan);
		setTargets(plan, 'kb701', ['auto']);
		expect(plan.reagents.find((r) => r.id === 'kb701')!.expectedTargets).toBeUndefined();
		valid(plan);
		expect(() => setTargets(plan, 'kb701', null, 7)).toThrow(/expectedTargets: expected an integer in \[1, 6\], got 7/);
		expect(() => setTargets(plan, 'kb701', [])).toThrow(/at least one target/);
	});

	it('switches between one effect and per-target effects', () => {
		const plan = load('demo');
		setEffectMode(plan, 'kb702', 'single');
		expect(plan.reagents.find((r) => r.id === 'kb702')!.effect).toBe(0.85);
		setEffectMode(plan, 'kb702', 'perTarget');
		expect(plan.reagents.find((r) => r.id === 'kb702')!.effect).toEqual({ cyc: 0.85, nuc: 0.85 });
		valid(plan);
		expect(() => setEffectMode(plan, 'kb901', 'perTarget')).toThrow(/known targets/);
	});

	it('adding and removing reagents updates a fixed design', () => {
		const plan = load('demo');
		setDesignFixed(plan, true);
		const id = addReagent(plan);
		expect(plan.design!.reagents).toContain(id);
		valid(plan);
		removeReagent(plan, id);
		expect(plan.design!.reagents).not.toContain(id);
		renameReagent(plan, 'kb101', 'kb101b');
		expect(plan.design!.reagents[0]).toBe('kb101b');
		valid(plan);
	});
});

describe('context and design edits', () => {
	it('sets and clears context values', () => {
		const plan = load('demo');
		const id = addContext(plan);
		setContextValue(plan, id, 'variance', 'mem', 2);
		setContextValue(plan, id, 'mean', 'resp', -0.5);
		valid(plan);
		expect(plan.contexts[0]).toMatchObject({ mean: { resp: -0.5 }, variance: { mem: 2 } });
		setContextValue(plan, id, 'variance', 'mem', undefined);
		expect(plan.contexts[0].variance).toEqual({});
		expect(() => setContextValue(plan, id, 'mean', 'nope', 1)).toThrow(/no factor/);
		setDesignFixed(plan, true);
		expect(plan.design!.contexts).toEqual([id]);
		removeContext(plan, id);
		expect(plan.design!.contexts).toEqual([]);
		valid(plan);
	});

	it('a fixed design starts from the default one and refuses to lose its last reagent', () => {
		const plan = load('multi-context');
		setDesignFixed(plan, true);
		expect(plan.design).toEqual({ reagents: ['g1', 'g2', 'g3', 'g4'], replicates: 4, controlsPerPlate: plan.budget.controlsPerPlate, contexts: plan.contexts.map((c) => c.id) });
		for (const r of ['g1', 'g2', 'g3']) setDesignReagent(plan, r, false);
		expect(() => setDesignReagent(plan, 'g4', false)).toThrow(/at least one reagent/);
		setDesignContext(plan, 'c_cold', false);
		setDesignContext(plan, 'c_base', false);
		setDesignContext(plan, 'c_base', true);
		expect(plan.design!.contexts).toEqual(['c_base', 'c_lowO2', 'c_serum', 'c_48h']);
		valid(plan);
		setDesignFixed(plan, false);
		expect(plan.design).toBeNull();
	});
});

describe('fixes one click away', () => {
	it('adds a catalogue reagent that is not in the design', () => {
		const plan = load('demo');
		setDesignFixed(plan, true);
		setDesignReagent(plan, 'kb102', false);
		expect(fixAction(plan, { reagentId: 'kb102' })).toMatchObject({ action: 'add' });
		expect(applyFix(plan, { reagentId: 'kb102' })).toEqual({ action: 'add', reagentId: 'kb102' });
		expect(plan.design!.reagents).toContain('kb102');
		valid(plan);
	});

	it('removes a reagent that is in the design (budget fix), fixing the default design first', () => {
		const plan = load('demo');
		expect(applyFix(plan, { reagentId: 'kb402' })).toEqual({ action: 'remove', reagentId: 'kb402' });
		expect(plan.design!.reagents.length).toBe(19);
		expect(plan.design!.replicates).toBe(4);
		valid(plan);
	});

	it('text-only and stale fixes do nothing', () => {
		const plan = load('demo');
		expect(applyFix(plan, { reagentId: undefined })).toBeNull();
		expect(applyFix(plan, null)).toBeNull();
		expect(applyFix(plan, { reagentId: 'gone' })).toBeNull();
		expect(plan.design).toBeNull();
	});
});

describe('any sequence of edits leaves a valid plan (property)', () => {
	type Op = { kind: number; a: number; b: number; c: number };
	const op = fc.record({ kind: fc.integer({ min: 0, max: 11 }), a: fc.nat(50), b: fc.nat(50), c: fc.nat(50) });
	const pick = <T>(xs: T[], i: number): T | undefined => (xs.length ? xs[i % xs.length] : undefined);

	function apply(plan: Plan, { kind, a, b, c }: Op) {
		const f = pick(plan.factors, a)?.id;
		const r = pick(plan.reagents, b)?.id;
		const e = pick(plan.contexts, c)?.id;
		try {
			switch (kind) {
				case 0: addFactor(plan); break;
				case 1: if (f && plan.factors.length > 1) removeFactor(plan, f); break;
				case 2: addReagent(plan); break;
				case 3: if (r) removeReagent(plan, r); break;
				case 4: if (r) setTargets(plan, r, plan.factors.filter((_, i) => (a >> i) & 1 || i === c % plan.factors.length).map((x) => x.id)); break;
				case 5: if (r) setTargets(plan, r, null, 1 + (a % plan.factors.length)); break;
				case 6: if (r) setEffectMode(plan, r, a % 2 ? 'single' : 'perTarget'); break;
				case 7: addContext(plan); break;
				case 8: if (e) removeContext(plan, e); break;
				case 9: if (e && f) setContextValue(plan, e, a % 2 ? 'mean' : 'variance', f, b % 3 === 0 ? undefined : 0.5 + (b % 4)); break;
				case 10: setDesignFixed(plan, a % 2 === 0); break;
				case 11: if (plan.design && r) setDesignReagent(plan, r, a % 2 === 0); else if (plan.design && e) setDesignContext(plan, e, a % 2 === 0); break;
			}
		} catch (err) {
			// Refusals are allowed only for the documented caller mistakes.
			expect((err as Error).message).toMatch(/per-target effects need known targets|at least one reagent/);
		}
	}

	it.each(['demo', 'multi-context', 'unknown-targets'])('%s', (name) => {
		fc.assert(
			fc.property(fc.array(op, { maxLength: 25 }), (ops) => {
				const plan = load(name);
				for (const o of ops) {
					apply(plan, o);
					expect(validatePlan(plan)).toEqual([]);
				}
			}),
			{ numRuns: 60 }
		);
	});
});
