import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkPlan, compareVerdicts, targetedRankVerdicts, type EffectColumn } from '../../src/lib/core/identify';
import { makePlan, type PlanSpec, type ReagentSpec } from './planFixture';
import { referenceRank } from './referenceRank';

const SHAPES = ['gaussian', 'laplace', 'uniform', 'bimodal'];
const EFFECTS = [0.5, 1, 1.5, 2, -0.8];

/** Random plan spec over factors x0…x{d−1}: reagents with random targets, kinds and effects; random contexts. */
const planSpec = fc.integer({ min: 1, max: 5 }).chain((d) => {
	const ids = Array.from({ length: d }, (_, i) => `x${i}`);
	const reagent = (i: number) =>
		fc
			.record({
				mask: fc.array(fc.boolean(), { minLength: d, maxLength: d }),
				unknown: fc.integer({ min: 0, max: 9 }),
				kind: fc.constantFrom('shift', 'shift', 'clamp', 'scale'),
				effects: fc.array(fc.constantFrom(...EFFECTS), { minLength: d, maxLength: d }),
				cost: fc.integer({ min: 1, max: 9 })
			})
			.map(({ mask, unknown, kind, effects, cost }): ReagentSpec => {
				const targets = ids.filter((_, j) => mask[j]);
				if (targets.length === 0) targets.push(ids[i % d]);
				if (unknown === 0) return { id: `r${i}`, targets: null, effect: 1, cost };
				const effect = Object.fromEntries(targets.map((t) => [t, kind === 'scale' ? Math.abs(effects[ids.indexOf(t)]) : effects[ids.indexOf(t)]]));
				return { id: `r${i}`, targets, kind: kind as ReagentSpec['kind'], effect, cost };
			});
	const context = (e: number) =>
		fc
			.record({
				v: fc.array(fc.constantFrom(undefined, 0.5, 1.5, 2, 3), { minLength: d, maxLength: d }),
				m: fc.array(fc.constantFrom(undefined, undefined, 0.5, -1), { minLength: d, maxLength: d })
			})
			.map(({ v, m }) => ({
				id: `c${e}`,
				variance: Object.fromEntries(ids.flatMap((id, j) => (v[j] === undefined ? [] : [[id, v[j]!]]))),
				mean: Object.fromEntries(ids.flatMap((id, j) => (m[j] === undefined ? [] : [[id, m[j]!]])))
			}));
	return fc.record({
		d: fc.constant(d),
		shapes: fc.array(fc.constantFrom(...SHAPES), { minLength: d, maxLength: d }),
		reagents: fc.integer({ min: 0, max: 7 }).chain((n) => fc.tuple(...Array.from({ length: n }, (_, i) => reagent(i)))),
		contexts: fc.integer({ min: 0, max: 4 }).chain((n) => fc.tuple(...Array.from({ length: n }, (_, e) => context(e)))),
		mixing: fc.constantFrom('linear', 'linear', 'nonlinear'),
		route: fc.constantFrom('auto', 'targeted', 'contexts', 'observational')
	});
});

type Generated = {
	d: number;
	shapes: string[];
	reagents: ReagentSpec[];
	contexts: { id: string; variance: Record<string, number>; mean: Record<string, number> }[];
	mixing: string;
	route: string;
};

function toSpec(g: Generated, ids: string[] = Array.from({ length: g.d }, (_, i) => `x${i}`), design?: PlanSpec['design']): PlanSpec {
	return {
		factors: ids.map((id, i) => [id, g.shapes[i]] as [string, string]),
		reagents: g.reagents,
		contexts: g.contexts,
		mixing: g.mixing as 'linear' | 'nonlinear',
		route: g.route as PlanSpec['route'],
		design
	};
}

/** Renames factor ids everywhere in a generated plan and reorders the factor list by `order`. */
function renamedAndReordered(g: Generated, order: number[], rename: (id: string) => string): PlanSpec {
	const ids = Array.from({ length: g.d }, (_, i) => `x${i}`);
	const mapMap = (m: Record<string, number>) => Object.fromEntries(Object.entries(m).map(([k, v]) => [rename(k), v]));
	return {
		factors: order.map((i) => [rename(ids[i]), g.shapes[i]] as [string, string]),
		reagents: g.reagents.map((r) => ({
			...r,
			targets: r.targets ? r.targets.map(rename) : null,
			effect: typeof r.effect === 'object' ? mapMap(r.effect) : r.effect
		})),
		contexts: g.contexts.map((c) => ({ ...c, variance: mapMap(c.variance), mean: mapMap(c.mean) })),
		mixing: g.mixing as 'linear' | 'nonlinear',
		route: g.route as PlanSpec['route']
	};
}

describe('properties of the verdicts (fast-check)', () => {
	it('renaming and reordering factors permutes the verdicts and keeps every check status', () => {
		fc.assert(
			fc.property(planSpec, fc.integer({ min: 0, max: 1e9 }), (g, seed) => {
				const gen = g as unknown as Generated;
				const order = Array.from({ length: gen.d }, (_, i) => i);
				for (let i = order.length - 1; i > 0; i--) {
					const j = (seed + i * 7919) % (i + 1);
					[order[i], order[j]] = [order[j], order[i]];
				}
				const rename = (id: string) => `q${(Number(id.slice(1)) * 37 + 11) % 1000}`;
				const a = checkPlan(makePlan(toSpec(gen)));
				const b = checkPlan(makePlan(renamedAndReordered(gen, order, rename)));
				expect(b.route).toBe(a.route);
				for (const fa of a.factors) {
					const fb = b.factors.find((f) => f.id === rename(fa.id))!;
					expect(fb.verdict).toBe(fa.verdict);
					expect(fb.route).toBe(fa.route);
					expect([...fb.block].sort()).toEqual(fa.block.map(rename).sort());
				}
				expect(b.checks.map((c) => [c.id, c.status])).toEqual(a.checks.map((c) => [c.id, c.status]));
			}),
			{ numRuns: 150 }
		);
	});

	it('adding a reagent to the design never worsens any factor verdict', () => {
		fc.assert(
			fc.property(planSpec, fc.array(fc.boolean(), { minLength: 8, maxLength: 8 }), fc.nat(), (g, keep, pick) => {
				const gen = g as unknown as Generated;
				if (gen.reagents.length === 0) return;
				const all = gen.reagents.map((r) => r.id);
				const extra = all[pick % all.length];
				const base = all.filter((id, i) => keep[i] && id !== extra);
				if (base.length === 0) return; // a design needs at least one reagent
				const contexts = gen.contexts.map((c) => c.id);
				const before = checkPlan(makePlan(toSpec(gen, undefined, { reagents: base, contexts })));
				const after = checkPlan(makePlan(toSpec(gen, undefined, { reagents: [...base, extra], contexts })));
				after.factors.forEach((f, j) => expect(compareVerdicts(f, before.factors[j])).toBeGreaterThanOrEqual(0));
			}),
			{ numRuns: 200 }
		);
	});

	it('structural rank ≥ exact rank, and the exact rank equals the definition (mathjs det of minors)', () => {
		const columns = fc.integer({ min: 1, max: 4 }).chain((d) =>
			fc.record({
				d: fc.constant(d),
				cols: fc.array(
					fc.array(fc.tuple(fc.boolean(), fc.constantFrom(0, 1, 2, -1, 0.5, 1.5)), { minLength: d, maxLength: d }).map((entries) => {
						const rows: number[] = [];
						const values: number[] = [];
						entries.forEach(([on, v], r) => {
							if (on) {
								rows.push(r);
								values.push(v);
							}
						});
						return { rows, values };
					}),
					{ maxLength: 6 }
				)
			})
		);
		fc.assert(
			fc.property(columns, ({ d, cols }) => {
				const clean = cols.filter((c: EffectColumn) => c.rows.length > 0);
				for (const exact of ['fraction', 'modular'] as const) {
					const res = targetedRankVerdicts(d, clean, { exact });
					for (let j = 0; j < d; j++) {
						expect(res.structuralRank[j]).toBeGreaterThanOrEqual(res.exactRank[j]);
						const m = Array.from({ length: d }, () => [] as number[]);
						clean.filter((c) => !c.rows.includes(j)).forEach((c) => m.forEach((row, i) => row.push(c.rows.includes(i) ? c.values[c.rows.indexOf(i)] : 0)));
						expect(res.exactRank[j]).toBe(m[0].length ? referenceRank(m) : 0);
					}
				}
			}),
			{ numRuns: 200 }
		);
	});
});
