import { describe, expect, it } from 'vitest';
import { analysePilot, applyPilot, parsePilotCsvText, type PilotEstimates } from '../../src/lib/core/pilot';
import { parsePlan, serializePlan, validatePlan } from '../../src/lib/core/plan';
import { demoPlan, recoveryOptions, recoveryPlan, simulatedCsv } from './fixtures';

function estimatesFor(seed = 1) {
	const plan = recoveryPlan();
	const e = analysePilot(plan, parsePilotCsvText(plan, simulatedCsv(plan, recoveryOptions(seed))), { seed, permutations: 50 });
	return { plan, e };
}

describe('applyPilot', () => {
	it('returns a valid plan with the measured noise, plate effect and effects, rounded to 3 significant digits', () => {
		const { plan, e } = estimatesFor();
		const next = applyPilot(plan, e);
		expect(validatePlan(next)).toEqual([]);
		expect(parsePlan(serializePlan(next))).toEqual(next); // round-trips as a plan file
		expect(next.observation.replicateNoise).toBe(Number(e.replicateNoise!.toPrecision(3)));
		expect(next.observation.measurementNoise).toBe(Number(e.measurementNoise!.toPrecision(3)));
		expect(next.observation.plateEffect).toBe(Number(e.plateEffect!.toPrecision(3)));
		const r1 = e.reagents.find((r) => r.id === 'r1')!;
		expect(next.reagents.find((r) => r.id === 'r1')!.effect).toBe(Number(r1.effect!.toPrecision(3)));
	});

	it('keeps the stated sign and the split between targets (only the norm is measured)', () => {
		const { plan, e } = estimatesFor(2);
		const next = applyPilot(plan, e);
		const r4 = next.reagents.find((r) => r.id === 'r4')!;
		expect(r4.effect as number).toBeLessThan(0); // stated −2.6
		const r6 = next.reagents.find((r) => r.id === 'r6')!.effect as Record<string, number>;
		expect(r6.c).toBe(r6.d); // stated 0.55 and 0.55
		const measured = e.reagents.find((r) => r.id === 'r6')!.effect!;
		expect(Math.hypot(r6.c, r6.d)).toBeCloseTo(measured, 2);
	});

	it('does not modify its input and never drops user text; appends to existing pilot notes', () => {
		const { plan, e } = estimatesFor(3);
		const withNotes = { ...plan, notes: 'User question text.', sectionNotes: { pilot: 'Ran on the old imager.', layout: 'keep column 1 empty' } };
		const before = JSON.stringify(withNotes);
		const next = applyPilot(withNotes, e);
		expect(JSON.stringify(withNotes)).toBe(before);
		expect(next.notes).toBe('User question text.');
		expect(next.sectionNotes!.layout).toBe('keep column 1 empty');
		expect(next.sectionNotes!.pilot).toMatch(/^Ran on the old imager.\n\nPilot applied: 192 wells \(3 plates, 30 features\)\./);
		expect(next.sectionNotes!.pilot).toMatch(/Signal dimension 4 \(plan: 4 factors\)\./);
		expect(next.sectionNotes!.pilot).toMatch(/reviewed before ordering/);
		expect(next.design).toEqual(plan.design);
		expect(next.factors).toEqual(plan.factors);
	});

	it('adds a factor-count note when the signal dimension differs from the number of factors', () => {
		const { plan, e } = estimatesFor(4);
		const next = applyPilot(plan, { ...e, signalDimension: 5 });
		expect(next.sectionNotes!.pilot).toMatch(/Signal dimension 5 \(plan: 4 factors\) — check the factor count: the pilot shows more independent effect directions than the plan has factors\./);
		const fewer = applyPilot(plan, { ...e, signalDimension: 3 });
		expect(fewer.sectionNotes!.pilot).toMatch(/shows fewer independent effect directions/);
	});

	it('null estimates keep the plan’s values; values are kept within the plan’s bounds', () => {
		const { plan, e } = estimatesFor(5);
		const none: PilotEstimates = { ...e, replicateNoise: null, measurementNoise: null, plateEffect: null, reagents: e.reagents.map((r) => ({ ...r, effect: null })) };
		const next = applyPilot(plan, none);
		expect(next.observation).toEqual(plan.observation);
		expect(next.reagents).toEqual(plan.reagents);
		expect(next.sectionNotes!.pilot).toMatch(/Noise and plate effect unchanged/);
		const huge = applyPilot(plan, { ...e, replicateNoise: 1e6, reagents: e.reagents.map((r) => ({ ...r, effect: r.stated * 100 })) });
		expect(huge.observation.replicateNoise).toBe(100);
		expect(huge.reagents.every((r) => typeof r.effect !== 'number' || Math.abs(r.effect) <= 20)).toBe(true);
		expect(validatePlan(huge)).toEqual([]);
	});

	it('works on the demo plan with unknown-target reagents (effect is one number)', () => {
		const plan = demoPlan();
		const csv = simulatedCsv(plan, {
			seed: 3,
			reagents: ['kb101', 'kb201', 'kb301', 'kb401', 'kb501', 'kb601', 'kb901'],
			plates: 2,
			replicatesPerPlate: 6,
			controlsPerPlate: 16,
			positivesPerPlate: 4,
			cellsPerWell: 0,
			truth: { replicateNoise: 0.3, measurementNoise: 0.3, plateEffect: 0.3, positive: { mem: 5 }, targets: { kb901: ['auto', 'cyc'] } }
		});
		const e = analysePilot(plan, parsePilotCsvText(plan, csv), { permutations: 50 });
		const next = applyPilot(plan, e);
		expect(typeof next.reagents.find((r) => r.id === 'kb901')!.effect).toBe('number');
		expect(validatePlan(next)).toEqual([]);
	});
});
