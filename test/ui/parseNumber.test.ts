import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { budgetRules, goalRules, observationRules, reagentRules, type NumberRule } from '../../src/lib/core/plan';
import { parseNumberEntry } from '../../src/lib/ui/fields/parseNumber';

const efficacy = reagentRules.efficacy as NumberRule; // (0, 1]
const controls = budgetRules.controlsPerPlate as NumberRule; // integer ≥ 0

describe('parseNumberEntry: what a number field writes', () => {
	it('accepts plain, signed, exponent and decimal-comma numbers within the rule', () => {
		expect(parseNumberEntry('0.9', efficacy, false)).toEqual({ kind: 'value', value: 0.9 });
		expect(parseNumberEntry(' 1 ', efficacy, false)).toEqual({ kind: 'value', value: 1 });
		expect(parseNumberEntry('0,75', efficacy, false)).toEqual({ kind: 'value', value: 0.75 });
		expect(parseNumberEntry('5e-1', efficacy, false)).toEqual({ kind: 'value', value: 0.5 });
		expect(parseNumberEntry('.5', efficacy, false)).toEqual({ kind: 'value', value: 0.5 });
		expect(parseNumberEntry('1.', efficacy, false)).toEqual({ kind: 'value', value: 1 });
	});

	it('explains out-of-range values with the rule text (same text as plan-file errors)', () => {
		expect(parseNumberEntry('0', efficacy, false)).toEqual({ kind: 'invalid', message: 'Expected a number in (0, 1], got 0.' });
		expect(parseNumberEntry('1.2', efficacy, false)).toEqual({ kind: 'invalid', message: 'Expected a number in (0, 1], got 1.2.' });
		expect(parseNumberEntry('2.5', controls, false)).toEqual({ kind: 'invalid', message: 'Expected an integer ≥ 0, got 2.5.' });
		expect(parseNumberEntry('1', goalRules.assurance as NumberRule, false)).toEqual({ kind: 'invalid', message: 'Expected a number in (0, 1), got 1.' });
	});

	it('refuses text that is not a number, and never yields NaN or Infinity', () => {
		for (const t of ['abc', '1..2', '1,2,3', 'NaN', 'Infinity', '0x10', '1 2', '--1']) {
			const entry = parseNumberEntry(t, observationRules.replicateNoise as NumberRule, false);
			expect(entry.kind, t).toBe('invalid');
		}
		fc.assert(
			fc.property(fc.string(), (t) => {
				const entry = parseNumberEntry(t, observationRules.replicateNoise as NumberRule, true);
				if (entry.kind === 'value' && entry.value !== undefined) expect(Number.isFinite(entry.value)).toBe(true);
			})
		);
	});

	it('treats unfinished text as incomplete, not as an error', () => {
		for (const t of ['-', '+', '.', '-.', '1e', '2.5e-']) expect(parseNumberEntry(t, reagentRules.costPerWell as NumberRule, false), t).toEqual({ kind: 'incomplete' });
	});

	it('empty text: "not set" for optional fields, a problem for required ones', () => {
		expect(parseNumberEntry('', reagentRules.maxWells as NumberRule, true)).toEqual({ kind: 'value', value: undefined });
		expect(parseNumberEntry('  ', efficacy, false)).toEqual({ kind: 'invalid', message: 'Expected a number in (0, 1]; this field cannot be empty.' });
	});

	it('applies an extra check after the rule', () => {
		const scale = (v: number) => (v <= -1 ? 'A scale effect must be above −1.' : null);
		expect(parseNumberEntry('-1', { kind: 'number', min: -20, max: 20, help: '' }, false, scale)).toEqual({ kind: 'invalid', message: 'A scale effect must be above −1.' });
	});

	it('every accepted value passes the rule (property, several rules)', () => {
		const rules = [efficacy, controls, observationRules.nonlinearity as NumberRule, budgetRules.total as NumberRule];
		fc.assert(
			fc.property(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), fc.nat(rules.length - 1), (x, i) => {
				const entry = parseNumberEntry(String(x), rules[i], false);
				if (entry.kind === 'value') {
					const v = entry.value!;
					const r = rules[i];
					if (r.integer) expect(Number.isInteger(v)).toBe(true);
					if (r.min !== undefined) expect(r.minExclusive ? v > r.min : v >= r.min).toBe(true);
					if (r.max !== undefined) expect(r.maxExclusive ? v < r.max : v <= r.max).toBe(true);
				}
			})
		);
	});
});
