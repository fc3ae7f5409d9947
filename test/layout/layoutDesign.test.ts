import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { layoutCsv, layoutDesign, LayoutError, parseWellName, wellName, type Layout } from '../../src/lib/core/layout';
import { parsePlan, type Plan } from '../../src/lib/core/plan';
import { designCost, PLATE_GEOMETRY } from '../../src/lib/core/size/costModel';
import { planFromSpec, type PlanSpec } from './helpers';

/**
 * Checks every placement rule of the layout on `layout`, independently of the implementation:
 * returns a list of violations (empty = all rules hold).
 */
function violations(plan: Plan, layout: Layout): string[] {
	const d = plan.design!;
	const out: string[] = [];
	const { rows, columns } = PLATE_GEOMETRY[plan.budget.plateFormat];
	const off = plan.budget.excludeEdgeWells ? 1 : 0;
	const cost = designCost(plan, d);
	if (layout.plates.length !== cost.plates) out.push(`plates ${layout.plates.length} ≠ cost model ${cost.plates}`);
	const ctxLevel = new Map(plan.contexts.map((c) => [c.id, c.level]));
	const wellCtx = d.contexts.filter((c) => ctxLevel.get(c) === 'well');
	const expectedContexts: (string | null)[] = d.contexts.length === 0 ? [null] : d.contexts;
	// group key → plate index → wells
	const groups = new Map<string, Map<number, { r: number; c: number; rep: number }[]>>();
	layout.plates.forEach((plate, pi) => {
		if (plate.index !== pi + 1) out.push(`plate ${pi} has index ${plate.index}`);
		if (plate.wells.length !== rows * columns) out.push(`plate ${plate.index} has ${plate.wells.length} wells`);
		const ctlRow = new Array(rows).fill(0);
		const ctlCol = new Array(columns).fill(0);
		plate.wells.forEach((w, k) => {
			const r = Math.floor(k / columns);
			const c = k % columns;
			if (w.well !== wellName(r, c) || w.column !== c + 1 || w.plate !== plate.index) out.push(`plate ${plate.index} well ${k} is ${w.well}`);
			const edge = r < off || c < off || r >= rows - off || c >= columns - off;
			if (edge && w.role !== 'empty') out.push(`excluded edge well ${w.well} holds ${w.role}`);
			if (w.role === 'control') {
				ctlRow[r]++;
				ctlCol[c]++;
				const okCtx = plate.context !== null ? w.context === plate.context : wellCtx.length ? wellCtx.includes(w.context ?? '') : w.context === null;
				if (!okCtx) out.push(`control ${w.well} on plate ${plate.index} has context ${w.context}`);
			}
			if (w.role === 'treatment') {
				const okCtx = plate.context !== null ? w.context === plate.context : (wellCtx.length ? (wellCtx as (string | null)[]) : [null]).includes(w.context);
				if (!okCtx) out.push(`treatment ${w.well} on plate ${plate.index} (context ${plate.context}) has context ${w.context}`);
				const key = `${w.reagent}|${w.context}`;
				if (!groups.has(key)) groups.set(key, new Map());
				const m = groups.get(key)!;
				if (!m.has(pi)) m.set(pi, []);
				m.get(pi)!.push({ r, c, rep: w.replicate ?? -1 });
			} else if (w.reagent !== null || w.replicate !== null) out.push(`${w.role} well ${w.well} carries reagent/replicate`);
		});
		const controls = ctlRow.reduce((a, b) => a + b, 0);
		if (controls !== d.controlsPerPlate) out.push(`plate ${plate.index} has ${controls} controls`);
		const ur = ctlRow.slice(off, rows - off);
		const uc = ctlCol.slice(off, columns - off);
		if (Math.max(...ur) - Math.min(...ur) > 1) out.push(`plate ${plate.index} controls per row ${ur}`);
		if (Math.max(...uc) - Math.min(...uc) > 1) out.push(`plate ${plate.index} controls per column ${uc}`);
	});
	// Every (reagent, context) group: exactly `replicates` wells numbered 1..n, even over its plates,
	// distinct rows and columns within a plate.
	for (const reagent of d.reagents)
		for (const ctx of expectedContexts) {
			const m = groups.get(`${reagent}|${ctx}`);
			if (!m) {
				out.push(`group ${reagent}/${ctx} missing`);
				continue;
			}
			const reps = [...m.values()].flat().map((x) => x.rep).sort((a, b) => a - b);
			if (reps.join() !== Array.from({ length: d.replicates }, (_, i) => i + 1).join()) out.push(`group ${reagent}/${ctx} replicates ${reps}`);
			const platesOfBlock = layout.plates.filter((p) => p.context === (ctx !== null && ctxLevel.get(ctx) === 'plate' ? ctx : null)).map((p) => p.index - 1);
			const lo = Math.floor(d.replicates / platesOfBlock.length);
			const hi = Math.ceil(d.replicates / platesOfBlock.length);
			for (const pi of platesOfBlock) {
				const n = m.get(pi)?.length ?? 0;
				if (n < lo || n > hi) out.push(`group ${reagent}/${ctx} has ${n} wells on plate ${pi + 1}, expected ${lo}–${hi}`);
			}
			for (const [pi, wells] of m) {
				if (!platesOfBlock.includes(pi)) out.push(`group ${reagent}/${ctx} on foreign plate ${pi + 1}`);
				if (new Set(wells.map((w) => w.r)).size !== wells.length) out.push(`group ${reagent}/${ctx} repeats a row on plate ${pi + 1}`);
				if (new Set(wells.map((w) => w.c)).size !== wells.length) out.push(`group ${reagent}/${ctx} repeats a column on plate ${pi + 1}`);
			}
		}
	if (groups.size !== d.reagents.length * expectedContexts.length) out.push(`${groups.size} groups present`);
	const o = layout.diagnostics.optimiser!;
	if (o.finalScore > o.initialScore + 1e-9) out.push(`optimiser worsened ${o.initialScore} → ${o.finalScore}`);
	const s = layout.diagnostics.replicateSpread;
	if (d.reagents.length > 0 && (s.distinctPlates !== 1 || s.distinctRows !== 1 || s.distinctColumns !== 1)) out.push(`diagnostics spread ${JSON.stringify(s)}`);
	return out;
}

/** Why a spec cannot be laid out, computed from the rules (null = it can). */
function expectedProblem(spec: PlanSpec, plan: Plan): 'stock' | 'room' | 'rows' | null {
	const nCtx = Math.max(1, spec.contexts.length);
	if (spec.maxWells?.some((m, i) => i < spec.reagents && m !== undefined && spec.replicates * nCtx > m)) return 'stock';
	const cost = designCost(plan, plan.design!);
	if (cost.problem) return 'room';
	const usableRows = PLATE_GEOMETRY[spec.format].rows - (spec.excludeEdgeWells ? 2 : 0);
	if (spec.reagents > 0 && cost.groups.some((g) => Math.ceil(spec.replicates / g.plates) > usableRows)) return 'rows';
	return null;
}

const specArb: fc.Arbitrary<PlanSpec> = fc
	.record({
		format: fc.constantFrom(96, 96, 384, 384, 1536) as fc.Arbitrary<96 | 384 | 1536>,
		excludeEdgeWells: fc.boolean(),
		controlsPerPlate: fc.integer({ min: 0, max: 24 }),
		reagents: fc.integer({ min: 1, max: 14 }),
		replicates: fc.integer({ min: 1, max: 12 }),
		contexts: fc.array(fc.constantFrom('plate', 'well') as fc.Arbitrary<'plate' | 'well'>, { maxLength: 3 }),
		maxWells: fc.array(fc.option(fc.integer({ min: 1, max: 40 }), { nil: undefined, freq: 4 }), { maxLength: 14 }),
		plates: fc.option(fc.integer({ min: 1, max: 4 }), { nil: undefined })
	})
	.map((s) => s as PlanSpec);

describe('layoutDesign: placement rules on random designs (property)', () => {
	it('either lays the design out obeying every rule, or refuses for exactly the expected reason', () => {
		fc.assert(
			fc.property(specArb, fc.integer({ min: 0, max: 1000 }), (spec, seed) => {
				const plan = planFromSpec(spec);
				const problem = expectedProblem(spec, plan);
				let layout: Layout;
				try {
					layout = layoutDesign(plan, plan.design, { seed, effort: 0.25 });
				} catch (err) {
					expect(err).toBeInstanceOf(LayoutError);
					const msg = (err as Error).message;
					if (problem === 'stock') expect(msg).toMatch(/not enough stock/);
					else if (problem === 'room') expect(msg).toMatch(/no treatment wells fit/);
					else if (problem === 'rows') expect(msg).toMatch(/distinct rows and columns/);
					else throw new Error(`unexpected refusal: ${msg}`);
					return;
				}
				expect(problem).toBeNull();
				expect(violations(plan, layout)).toEqual([]);
			}),
			{ numRuns: 60 }
		);
	});
});

describe('layoutDesign', () => {
	const demo = () => parsePlan(readFileSync('templates/demo.json', 'utf8'));

	it('same seed gives an identical CSV; another seed gives a different one', () => {
		const plan = planFromSpec({ format: 384, excludeEdgeWells: true, controlsPerPlate: 16, reagents: 30, replicates: 12, contexts: ['well', 'plate'] });
		const a = layoutCsv(layoutDesign(plan, plan.design, { seed: 7 }));
		const b = layoutCsv(layoutDesign(plan, plan.design, { seed: 7 }));
		const c = layoutCsv(layoutDesign(plan, plan.design, { seed: 8 }));
		expect(a).toBe(b);
		expect(c).not.toBe(a);
	});

	it('lays out the default design of the demo template and does not mutate the plan', () => {
		const plan = demo();
		const before = JSON.stringify(plan);
		const layout = layoutDesign(plan);
		expect(JSON.stringify(plan)).toBe(before);
		expect(layout.plates).toHaveLength(1);
		expect(layout.diagnostics.counts).toEqual({ treatment: 20 * 4, control: 16, empty: 384 - 96, excluded: 76 });
		expect(violations({ ...plan, design: { reagents: plan.reagents.map((r) => r.id), replicates: 4, controlsPerPlate: 16, contexts: [] } }, layout)).toEqual([]);
	});

	it('the optimiser lowers the association of treatments with edge distance, row and column', () => {
		// 40 reagents × 8 replicates over 2 shared plates of 384 with the edge excluded.
		const plan = planFromSpec({ format: 384, excludeEdgeWells: true, controlsPerPlate: 16, reagents: 40, replicates: 8, contexts: [] });
		const raw = layoutDesign(plan, plan.design, { seed: 3, effort: 0 });
		const opt = layoutDesign(plan, plan.design, { seed: 3 });
		const o = opt.diagnostics.optimiser!;
		expect(o.initialScore).toBe(raw.diagnostics.optimiser!.finalScore);
		// A random placement scores a few units (up to about 6: two terms of up to about 1 for each
		// of three variables); 0 is as balanced as whole wells allow.
		expect(o.initialScore).toBeGreaterThan(2);
		expect(o.finalScore).toBeLessThan(o.initialScore / 4);
		expect(opt.diagnostics.maxAssociation.edge.statistic).toBeLessThan(raw.diagnostics.maxAssociation.edge.statistic / 4);
		expect(opt.diagnostics.maxAssociation.row.statistic).toBeLessThan(raw.diagnostics.maxAssociation.row.statistic);
		expect(opt.diagnostics.maxAssociation.column.statistic).toBeLessThan(raw.diagnostics.maxAssociation.column.statistic);
	});

	it('stock error names the reagent, its stock and the wells needed', () => {
		const plan = planFromSpec({ format: 96, excludeEdgeWells: false, controlsPerPlate: 8, reagents: 3, replicates: 4, contexts: ['plate', 'plate'], maxWells: [undefined, 6] });
		expect(() => layoutDesign(plan, plan.design)).toThrow(LayoutError);
		expect(() => layoutDesign(plan, plan.design)).toThrow(/"t2" \(Test reagent 2\) needs 8 wells \(4 replicates × 2 contexts\) but its stock covers 6.*at most 3/);
	});

	it('replicates beyond the usable rows get more plates from the cost model, and the layout obeys every rule', () => {
		// 96-well plate, edge excluded: 6 usable rows; 10 replicates cannot sit on distinct rows of one plate,
		// so designCost gives ceil(10 / 6) = 2 plates.
		const plan = planFromSpec({ format: 96, excludeEdgeWells: true, controlsPerPlate: 4, reagents: 2, replicates: 10, contexts: [] });
		const layout = layoutDesign(plan, plan.design);
		expect(layout.plates.length).toBe(2);
		expect(violations(plan, layout)).toEqual([]);
	});

	it('no room for treatments is refused with the cost model reason', () => {
		const plan = planFromSpec({ format: 96, excludeEdgeWells: true, controlsPerPlate: 60, reagents: 2, replicates: 2, contexts: [] });
		expect(() => layoutDesign(plan, plan.design)).toThrow(/design\.controlsPerPlate: no treatment wells fit/);
	});

	it('refuses unknown ids, the reserved id "control" and bad options', () => {
		const plan = planFromSpec({ format: 96, excludeEdgeWells: false, controlsPerPlate: 4, reagents: 2, replicates: 2, contexts: ['well'] });
		expect(() => layoutDesign(plan, { ...plan.design!, reagents: ['t1', 'zz'] })).toThrow(/design\.reagents\[1\]: unknown reagent "zz"/);
		expect(() => layoutDesign(plan, { ...plan.design!, contexts: ['e9'] })).toThrow(/design\.contexts\[0\]: unknown context "e9"/);
		expect(() => layoutDesign(plan, { ...plan.design!, reagents: ['t1', 't1'] })).toThrow(/listed twice/);
		const reserved = { ...plan, reagents: [...plan.reagents, { ...plan.reagents[0], id: 'control' }] };
		expect(() => layoutDesign(reserved, { ...plan.design!, reagents: ['control'] })).toThrow(/reserved for control wells/);
		expect(() => layoutDesign(plan, plan.design, { seed: -1 })).toThrow(/options\.seed/);
		expect(() => layoutDesign(plan, plan.design, { effort: NaN })).toThrow(/options\.effort/);
	});

	it('well-level contexts mix on shared plates; controls take the contexts in turn', () => {
		const plan = planFromSpec({ format: 384, excludeEdgeWells: true, controlsPerPlate: 16, reagents: 10, replicates: 4, contexts: ['well', 'well', 'plate'] });
		const layout = layoutDesign(plan, plan.design, { seed: 2 });
		expect(violations(plan, layout)).toEqual([]);
		expect(layout.plates.map((p) => p.context)).toEqual([null, 'e3']);
		const shared = layout.plates[0].wells;
		const ctl = shared.filter((w) => w.role === 'control');
		expect(ctl.filter((w) => w.context === 'e1')).toHaveLength(8);
		expect(ctl.filter((w) => w.context === 'e2')).toHaveLength(8);
		expect(new Set(shared.filter((w) => w.role === 'treatment').map((w) => w.context))).toEqual(new Set(['e1', 'e2']));
		expect(layout.diagnostics.warnings.some((w) => /"e3".*single plate/.test(w))).toBe(true);
	});

	it('replicates ≤ plates land on distinct plates', () => {
		const plan = planFromSpec({ format: 96, excludeEdgeWells: false, controlsPerPlate: 8, reagents: 4, replicates: 3, contexts: [], plates: 4 });
		const layout = layoutDesign(plan, plan.design, { seed: 5 });
		for (const r of ['t1', 't2', 't3', 't4']) {
			const plates = layout.plates.flatMap((p) => p.wells.filter((w) => w.reagent === r).map((w) => w.plate));
			expect(new Set(plates).size).toBe(3);
		}
	});

	it('works on 1536-well plates with the edge in use (32 rows, AA…AF)', () => {
		const plan = planFromSpec({ format: 1536, excludeEdgeWells: false, controlsPerPlate: 64, reagents: 20, replicates: 32, contexts: [] });
		const layout = layoutDesign(plan, plan.design, { seed: 1, effort: 0.5 });
		expect(violations(plan, layout)).toEqual([]);
		expect(layout.plates[0].wells.at(-1)!.well).toBe('AF48');
		expect(layout.plates[0].wells.filter((w) => parseWellName(w.well).row0 === 31 && w.role === 'control')).toHaveLength(2);
	});
});
