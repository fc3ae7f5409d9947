import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { analysePilot, parsePilotCsvText, PilotError, simulatePilotRows } from '../../src/lib/core/pilot';
import { parsePlan, type Plan } from '../../src/lib/core/plan';
import { recoveryOptions, recoveryPlan, simulatedCsv, tinyDemoCsv, demoPlan, toCsv } from './fixtures';

/** Spearman rank correlation of two equal-length lists without ties. */
function spearman(a: number[], b: number[]): number {
	const rank = (v: number[]) => {
		const order = v.map((x, i) => [x, i] as const).sort((x, y) => x[0] - y[0]);
		const r = new Array(v.length);
		order.forEach(([, i], k) => (r[i] = k));
		return r;
	};
	const ra = rank(a);
	const rb = rank(b);
	const n = a.length;
	const d2 = ra.reduce((s, x, i) => s + (x - rb[i]) ** 2, 0);
	return 1 - (6 * d2) / (n * (n * n - 1));
}

// Truth of the recovery pilots (fixtures.recoveryOptions): τ = 0.3, measurement noise 0.25, plate
// effect 0.4, reagent effect norms below (efficacy 1); 3 plates × (16 controls + 6 reagents × 8).
const TRUE_EFFECT: Record<string, number> = { r1: 0.5, r6: Math.hypot(0.55, 0.55), r2: 1.1, r5: Math.hypot(1.1, 1.1), r3: 2.0, r4: 2.6 };
const SEEDS = [1, 2, 3, 4, 5];

describe('analysePilot recovers a known truth (simulated pilots, the plan model)', () => {
	const plan = recoveryPlan();
	const runs = SEEDS.map((seed) => analysePilot(plan, parsePilotCsvText(plan, simulatedCsv(plan, recoveryOptions(seed))), { seed }));

	it('signal dimension is exactly the rank of the effects (4) on every seed, and 4 noise directions', () => {
		for (const e of runs) {
			expect(e.signalDimension).toBe(4);
			expect(e.signal.dimensionByEdge).toBe(4);
			expect(e.noiseDimension).toBe(4);
			expect(e.signal.rule).toBe('permutation');
			expect(e.signal.singularValues[3]).toBeGreaterThan(e.signal.threshold!);
			expect(e.signal.singularValues[4]).toBeLessThan(e.signal.threshold!);
		}
	});

	it('replicate noise within ±15% of 0.3 (stated tolerance; seen ±8%)', () => {
		for (const e of runs) expect(Math.abs(e.replicateNoise! / 0.3 - 1)).toBeLessThan(0.15);
	});

	it('measurement noise within ±30% of 0.25 and plate effect within ±35% of 0.4 (3 plates: 2 degrees of freedom per feature)', () => {
		for (const e of runs) {
			expect(Math.abs(e.measurementNoise! / 0.25 - 1)).toBeLessThan(0.3);
			expect(Math.abs(e.plateEffect! / 0.4 - 1)).toBeLessThan(0.35);
		}
		const meanPlate = runs.reduce((s, e) => s + e.plateEffect!, 0) / runs.length;
		expect(Math.abs(meanPlate / 0.4 - 1)).toBeLessThan(0.15);
	});

	it('effect sizes come out in the right order: at most one adjacent swap per pilot, exact order on average, each within ±40%', () => {
		const ids = Object.keys(TRUE_EFFECT);
		const truth = ids.map((id) => TRUE_EFFECT[id]);
		const sums = new Array(ids.length).fill(0);
		for (const e of runs) {
			const est = ids.map((id) => e.reagents.find((r) => r.id === id)!.effect!);
			expect(spearman(est, truth)).toBeGreaterThanOrEqual(1 - 6 * 2 / (6 * 35)); // one adjacent swap: Σd² = 2
			est.forEach((v, i) => {
				sums[i] += v;
				expect(Math.abs(v / truth[i] - 1)).toBeLessThan(0.4);
			});
		}
		expect(spearman(sums, truth)).toBe(1);
	});

	it('stated effect norms, wells and Mahalanobis distances are reported per reagent', () => {
		const e = runs[0];
		expect(e.reagents.map((r) => r.id)).toEqual(['r1', 'r6', 'r2', 'r5', 'r3', 'r4']); // plan order
		for (const r of e.reagents) {
			expect(r.stated).toBeCloseTo(TRUE_EFFECT[r.id], 10);
			expect(r.wells).toBe(24);
			expect(r.distance).toBeGreaterThan(0);
		}
		// Distances grow with the effect (replicate noise is the same for all reagents).
		const d = e.reagents.map((r) => r.distance);
		expect(spearman(d, e.reagents.map((r) => TRUE_EFFECT[r.id]))).toBeGreaterThan(0.8);
		expect(e.covariance.method).toBe('pooled');
	});

	it('is reproducible under a seed and does not modify the table', () => {
		const table = parsePilotCsvText(plan, simulatedCsv(plan, recoveryOptions(1)));
		const copy = Float64Array.from(table.values);
		const a = analysePilot(plan, table, { seed: 4 });
		const b = analysePilot(plan, table, { seed: 4 });
		expect(b).toEqual(a);
		expect(Array.from(table.values)).toEqual(Array.from(copy));
		expect(JSON.parse(JSON.stringify(a))).toEqual(a); // plain data
	});

	it('cell-level pilots: one row per cell, averaged per well; τ recovered after removing the 1/n cell-averaging term', () => {
		const cellsPlan = recoveryPlan({ cellsPerWell: 20 });
		for (const seed of [1, 2]) {
			const table = parsePilotCsvText(cellsPlan, simulatedCsv(cellsPlan, recoveryOptions(seed, { cellsPerWell: 20 })));
			expect(table.kind).toBe('cells');
			const e = analysePilot(cellsPlan, table, { seed });
			expect(e.scale.cellsPerWell).toBeCloseTo(20, 10);
			expect(e.signalDimension).toBe(4);
			expect(Math.abs(e.replicateNoise! / 0.3 - 1)).toBeLessThan(0.15);
			expect(Math.abs(e.measurementNoise! / 0.25 - 1)).toBeLessThan(0.3);
		}
	});
});

describe('analysePilot findings', () => {
	it('a reagent acting on a factor missing from the plan raises the dimension and says so', () => {
		const plan = recoveryPlan();
		const csv = simulatedCsv(plan, recoveryOptions(6, { replicatesPerPlate: 12, truth: { replicateNoise: 0.3, measurementNoise: 0.25, plateEffect: 0.4, positive: {}, hiddenFactors: [{ name: 'extra', effects: { r5: 1.5 } }] } }));
		const e = analysePilot(plan, parsePilotCsvText(plan, csv), { seed: 1 });
		expect(e.signalDimension).toBe(5);
		expect(e.notes.join(' ')).toMatch(/5 independent effect directions but the plan has 4 factors: a factor may be missing/);
	});

	it('one plate: plate effect null with a note; permutations 0 uses the edge rule', () => {
		const plan = recoveryPlan();
		const e = analysePilot(plan, parsePilotCsvText(plan, simulatedCsv(plan, recoveryOptions(2, { plates: 1, replicatesPerPlate: 10, controlsPerPlate: 24 }))), { permutations: 0 });
		expect(e.plateEffect).toBeNull();
		expect(e.featureSpace.plateVariance).toBeNull();
		expect(e.notes.join(' ')).toMatch(/plate effect cannot be estimated/);
		expect(e.signal.rule).toBe('edge');
		expect(e.signal.threshold).toBeNull();
		expect(e.signalDimension).toBe(e.signal.dimensionByEdge);
		expect(e.replicateNoise).not.toBeNull();
	});

	it('constant features are dropped with a note; a file of constant features is an input error', () => {
		const plan = demoPlan();
		const text = tinyDemoCsv().replace('plate,well,reagent,f1,f2,f3', 'plate,well,reagent,f1,f2,f3,flat').replace(/\n(P1[^\n]*)/g, '\n$1,7');
		const e = analysePilot(plan, parsePilotCsvText(plan, text), { permutations: 10 });
		expect(e.features).toEqual({ total: 4, kept: 3, dropped: ['flat'] });
		expect(e.notes[0]).toBe('Dropped 1 feature constant over all wells: flat.');
		const flat = 'plate,well,reagent,a\nP1,B2,control,1\nP1,B3,control,1\nP1,B4,control,1\nP1,C2,kb101,1\nP1,C3,kb101,1\n';
		expect(() => analysePilot(plan, parsePilotCsvText(plan, flat))).toThrow(PilotError);
		expect(() => analysePilot(plan, parsePilotCsvText(plan, flat))).toThrow(/line 1: column "a": expected at least one feature that varies between wells/);
	});

	it('no positive controls: Z′ null with a note; an unknown Z′ feature is an input error', () => {
		const plan = recoveryPlan();
		const table = parsePilotCsvText(plan, simulatedCsv(plan, recoveryOptions(3)));
		const e = analysePilot(plan, table, { permutations: 10 });
		expect(e.zPrime).toBeNull();
		expect(e.zPrimeByPlate).toEqual([]);
		expect(e.notes.join(' ')).toMatch(/No positive controls: Z′ is not computed/);
		expect(() => analysePilot(plan, table, { zPrimeFeature: 'nope' })).toThrow(/column "nope": expected a feature column of the file for Z′/);
	});

	it('a well-level context shifting all its wells does not count as a signal direction', () => {
		const base = recoveryPlan();
		const plan: Plan = parsePlan({ ...JSON.parse(JSON.stringify(base)), contexts: [{ id: 'warm', name: 'Warm', level: 'well', mean: {}, variance: {} }] });
		const rows = [...simulatePilotRows(plan, recoveryOptions(4))];
		const header = [...rows[0].slice(0, 3), 'context', ...rows[0].slice(3)];
		// Every second well of each reagent (and of the controls) is in the warm context, shifted by +40 raw units.
		const counts = new Map<string, number>();
		const body = rows.slice(1).map((r) => {
			const key = `${r[0]}|${r[2]}`;
			const k = (counts.get(key) ?? 0) + 1;
			counts.set(key, k);
			const warm = k % 2 === 0;
			return [...r.slice(0, 3), warm ? 'warm' : '', ...r.slice(3).map((v) => String(Number(v) + (warm ? 40 : 0)))];
		});
		const e = analysePilot(plan, parsePilotCsvText(plan, toCsv([header, ...body])), { seed: 2 });
		expect(e.signalDimension).toBe(4);
		expect(e.notes.join(' ')).toMatch(/centred on their context's control mean/);
	});

	it('scale reagents are not measured from means; the plan keeps their value', () => {
		const base = JSON.parse(JSON.stringify(recoveryPlan()));
		base.reagents.push({ id: 'r7', name: 'R7', targets: ['a'], kind: 'scale', effect: 0.8, efficacy: 1, costPerWell: 1 });
		const plan = parsePlan(base);
		const csv = simulatedCsv(plan, recoveryOptions(5, { reagents: ['r1', 'r2', 'r3', 'r4', 'r5', 'r6', 'r7'] }));
		const e = analysePilot(plan, parsePilotCsvText(plan, csv), { permutations: 20 });
		const r7 = e.reagents.find((r) => r.id === 'r7')!;
		expect(r7.effect).toBeNull();
		expect(e.scale.anchorReagents).not.toContain('r7');
		expect(e.notes.join(' ')).toMatch(/r7 is a scale reagent/);
	});

	it('caller mistakes throw RangeError at once', () => {
		const plan = demoPlan();
		const table = parsePilotCsvText(plan, tinyDemoCsv());
		expect(() => analysePilot(plan, table, { permutations: -1 })).toThrow(RangeError);
		expect(() => analysePilot(plan, table, { alpha: 0.9 })).toThrow(/alpha/);
		expect(() => analysePilot(plan, table, { seed: NaN })).toThrow(/seed/);
		expect(() => analysePilot(plan, { ...table, values: new Float64Array(2) })).toThrow(/table.values/);
		expect(() => analysePilot(plan, table, { scaling: 'row' as 'plate' })).toThrow(/scaling/);
	});

	it('per-plate MAD scaling is available and gives the same dimension on same-gain plates', () => {
		const plan = recoveryPlan();
		const table = parsePilotCsvText(plan, simulatedCsv(plan, recoveryOptions(1)));
		const e = analysePilot(plan, table, { scaling: 'plate' });
		expect(e.signalDimension).toBe(4);
		expect(Papa.unparse([[e.replicateNoise]])).toMatch(/^0\.\d+/);
	});
});
