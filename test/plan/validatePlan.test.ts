import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { parsePlan, PlanError, serializePlan, validatePlan } from '../../src/lib/core/plan';

const templates = readdirSync('templates').filter((f) => f.endsWith('.json'));
const demo = () => JSON.parse(readFileSync('templates/demo.json', 'utf8'));

function firstMessage(mutate: (p: any) => void): string {
	const p = demo();
	mutate(p);
	try {
		parsePlan(p);
	} catch (err) {
		expect(err).toBeInstanceOf(PlanError);
		return (err as Error).message;
	}
	throw new Error('expected a PlanError');
}

describe('plan templates', () => {
	it.each(templates)('%s is a valid plan and round-trips byte for byte', (file) => {
		const text = readFileSync(`templates/${file}`, 'utf8');
		const plan = parsePlan(text);
		expect(validatePlan(plan)).toEqual([]);
		expect(serializePlan(plan)).toBe(text);
	});
	it('ships at least three templates', () => expect(templates.length).toBeGreaterThanOrEqual(3));
});

describe('parsePlan errors name the path and the expectation', () => {
	it('unknown target factor', () => {
		expect(firstMessage((p) => (p.reagents[3].targets = ['resp', 'f9']))).toMatch(/^reagents\[3\]\.targets\[1\]: unknown factor "f9"/);
	});
	it('unknown field', () => {
		expect(firstMessage((p) => (p.budget.colour = 'red'))).toMatch(/^budget\.colour: unknown field/);
	});
	it('duplicate ids', () => {
		expect(firstMessage((p) => (p.reagents[1].id = p.reagents[0].id))).toMatch(/reagents\[1\]\.id: duplicate reagent id "kb101"/);
	});
	it('negative cost', () => {
		expect(firstMessage((p) => (p.reagents[0].costPerWell = -1))).toBe('reagents[0].costPerWell: expected a number ≥ 0, got -1');
	});
	it('efficacy outside (0, 1]', () => {
		expect(firstMessage((p) => (p.reagents[2].efficacy = 0))).toMatch(/reagents\[2\]\.efficacy: expected a number in \(0, 1\], got 0/);
		expect(firstMessage((p) => (p.reagents[2].efficacy = 1.2))).toMatch(/got 1\.2/);
	});
	it('NaN and Infinity', () => {
		expect(firstMessage((p) => (p.observation.replicateNoise = NaN))).toMatch(/observation\.replicateNoise: .* got NaN/);
		expect(firstMessage((p) => (p.budget.total = Infinity))).toMatch(/budget\.total: .* got Infinity/);
	});
	it('newer version is refused with a clear message', () => {
		expect(firstMessage((p) => (p.version = 2))).toMatch(/^version: this file was written by a newer Identiplate/);
	});
	it('design referring to unknown reagents', () => {
		expect(firstMessage((p) => (p.design = { reagents: ['kb101', 'zz'], replicates: 3, controlsPerPlate: 8, contexts: [] }))).toMatch(
			/^design\.reagents\[1\]: unknown reagent "zz"/
		);
	});
	it('reserved reagent ids', () => {
		expect(firstMessage((p) => (p.reagents[0].id = 'control'))).toMatch(/^reagents\[0\]\.id: "control" is reserved/);
	});
	it('invalid JSON text and non-objects', () => {
		expect(() => parsePlan('{')).toThrow(/not valid JSON/);
		expect(() => parsePlan(42)).toThrow(PlanError);
		expect(() => parsePlan(null)).toThrow(PlanError);
	});
	it('does not mutate its input', () => {
		const p = demo();
		const copy = structuredClone(p);
		parsePlan(p);
		expect(p).toEqual(copy);
	});
});
