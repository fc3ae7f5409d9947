import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { designCost, edgeWellCount, PLATE_GEOMETRY, usableWellsPerPlate } from '../../src/lib/core/size';
import { parsePlan } from '../../src/lib/core/plan';

const demo = () => parsePlan(readFileSync('templates/demo.json', 'utf8'));
const multi = () => parsePlan(readFileSync('templates/multi-context.json', 'utf8'));

describe('plate geometry (ANSI/SLAS 4-2004 formats)', () => {
	it('rows × columns: 96 = 8 × 12, 384 = 16 × 24, 1536 = 32 × 48 (REFERENCES.md, secondary)', () => {
		expect(PLATE_GEOMETRY[96]).toEqual({ rows: 8, columns: 12 });
		expect(PLATE_GEOMETRY[384]).toEqual({ rows: 16, columns: 24 });
		expect(PLATE_GEOMETRY[1536]).toEqual({ rows: 32, columns: 48 });
	});
	it('edge ring: 36 of 96 wells (Mansoury et al. 2021, verified); 76 of 384 and 156 of 1536 (computed: 2·cols + 2·(rows − 2))', () => {
		expect(edgeWellCount(96)).toBe(36);
		expect(edgeWellCount(384)).toBe(76);
		expect(edgeWellCount(1536)).toBe(156);
	});
	it('usable wells after edge exclusion and controls', () => {
		expect(usableWellsPerPlate(384, true, 16)).toBe(384 - 76 - 16);
		expect(usableWellsPerPlate(96, false, 8)).toBe(88);
		expect(usableWellsPerPlate(96, true, 60)).toBe(0);
	});
});

describe('designCost: plates × plate cost + wells × reagent cost per well + fixed cost (worked by hand)', () => {
	it('demo plan, 8 reagents × 14 replicates, 24 controls per 384-well plate with the edge excluded', () => {
		const plan = demo();
		const reagents = ['kb101', 'kb102', 'kb202', 'kb302', 'kb401', 'kb502', 'kb602', 'kb703'];
		const c = designCost(plan, { reagents, replicates: 14, controlsPerPlate: 24, contexts: [] });
		// usable = 384 − 76 − 24 = 284 ≥ 112 treatment wells, 14 ≤ 14 usable rows → 1 plate
		expect(c.usableWellsPerPlate).toBe(284);
		expect(c.plates).toBe(1);
		expect(c.treatmentWells).toBe(112);
		expect(c.controlWells).toBe(24);
		expect(c.wells).toBe(136);
		// reagents: 14 × (3.2 + 1.1 + 2.4 + 3.5 + 2.8 + 1.6 + 2.2 + 1.5) = 14 × 18.3 = 256.2
		expect(c.reagentCost).toBeCloseTo(256.2, 10);
		expect(c.plateCost).toBe(140);
		expect(c.fixedCost).toBe(800);
		expect(c.total).toBeCloseTo(1196.2, 10);
		expect(c.problem).toBeNull();
	});
	it('replicates beyond the usable rows need another plate: 25 replicates > 14 rows of a 384-well plate without its edge', () => {
		const plan = demo();
		const reagents = ['kb101', 'kb102', 'kb202', 'kb302', 'kb401', 'kb502', 'kb602', 'kb703'];
		const c = designCost(plan, { reagents, replicates: 25, controlsPerPlate: 24, contexts: [] });
		// 200 treatment wells fit 284 usable wells, but 25 replicates on distinct rows need ceil(25 / 14) = 2 plates
		expect(c.plates).toBe(2);
		expect(c.controlWells).toBe(48);
		expect(c.total).toBeCloseTo(25 * 18.3 + 2 * 140 + 800, 10);
	});
	it('wells beyond one plate need another: 20 reagents × 15 replicates = 300 > 284', () => {
		const plan = demo();
		const c = designCost(plan, { reagents: plan.reagents.map((r) => r.id), replicates: 15, controlsPerPlate: 24, contexts: [] });
		expect(c.plates).toBe(2);
		expect(c.controlWells).toBe(48);
	});
	it('plate-level contexts get plates of their own; reagent wells repeat per context', () => {
		const plan = multi();
		const c = designCost(plan, { reagents: ['g1', 'g2', 'g3', 'g4'], replicates: 2, controlsPerPlate: 8, contexts: ['c_lowO2', 'c_serum'] });
		expect(c.groups.map((g) => g.context)).toEqual(['c_lowO2', 'c_serum']);
		expect(c.plates).toBe(2);
		// 4 reagents × 2 replicates × 2 contexts = 16 wells; (2 + 2.5 + 1.5 + 3) × 2 × 2 = 36; 2 × 60 + 36 + 500 = 656
		expect(c.treatmentWells).toBe(16);
		expect(c.total).toBe(656);
	});
	it('stock limits: wells beyond maxWells are reported', () => {
		const plan = demo();
		const c = designCost(plan, { reagents: ['kb801', 'kb101'], replicates: 50, controlsPerPlate: 16, contexts: [] });
		expect(c.overStock).toEqual([{ id: 'kb801', wells: 50, maxWells: 48 }]);
	});
	it('controls that fill the plate leave no room: a problem, not a number', () => {
		const plan = demo();
		const c = designCost(plan, { reagents: ['kb101'], replicates: 2, controlsPerPlate: 308, contexts: [] });
		expect(c.usableWellsPerPlate).toBe(0);
		expect(c.problem).toMatch(/no treatment wells fit/);
		expect(c.plates).toBe(Infinity);
	});
	it('unknown reagent ids throw with the field named', () => {
		expect(() => designCost(demo(), { reagents: ['nope'], replicates: 2, controlsPerPlate: 16, contexts: [] })).toThrow(/design\.reagents: unknown reagent "nope"/);
	});
});
