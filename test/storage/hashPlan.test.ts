import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { parsePlan } from '../../src/lib/core/plan';
import { canonicalJson, fnv1a64, planInputHash } from '../../src/lib/core/plan/hashPlan';

const demo = () => parsePlan(readFileSync('templates/demo.json', 'utf8'));

describe('fnv1a64 matches the published FNV-1a 64-bit test vectors', () => {
	// Source: FNV reference test suite test_fnv.c (L. C. Noll, public domain), the vectors also
	// listed in the IETF draft draft-eastlake-fnv ("FNV-1a 64-bit" results).
	it.each([
		['', 'cbf29ce484222325'],
		['a', 'af63dc4c8601ec8c'],
		['b', 'af63df4c8601f1a5'],
		['c', 'af63de4c8601eff2'],
		['d', 'af63d94c8601e773'],
		['e', 'af63d84c8601e5c0']
	])('%j → %s', (text, expected) => {
		expect(fnv1a64(text)).toBe(expected);
	});

	it('hashes UTF-8 bytes: a two-byte character equals its byte sequence hashed one by one', () => {
		// "é" is U+00E9 → UTF-8 C3 A9 (RFC 3629); hashing the same bytes as Latin-1 text must agree.
		const viaLatin1 = fnv1a64('é');
		let h = 0xcbf29ce484222325n;
		for (const b of [0xc3, 0xa9]) h = BigInt.asUintN(64, (h ^ BigInt(b)) * 0x100000001b3n);
		expect(viaLatin1).toBe(h.toString(16).padStart(16, '0'));
	});
});

describe('canonicalJson', () => {
	it('sorts keys at every level and drops undefined members', () => {
		expect(canonicalJson({ b: 1, a: { d: [2, { z: 1, y: 2 }], c: undefined } })).toBe('{"a":{"d":[2,{"y":2,"z":1}]},"b":1}');
	});
	it('agrees with JSON.parse for any JSON value (property)', () => {
		fc.assert(
			fc.property(fc.jsonValue(), (v) => {
				expect(JSON.parse(canonicalJson(v))).toEqual(JSON.parse(JSON.stringify(v)));
			})
		);
	});
});

describe('planInputHash', () => {
	it('ignores title, notes and section notes', () => {
		const a = demo();
		const b = demo();
		b.title = 'Another title';
		b.notes = 'Other notes';
		b.sectionNotes = { factors: 'x' };
		expect(planInputHash(b)).toBe(planInputHash(a));
	});
	it('ignores key order inside objects', () => {
		const a = demo();
		const b = demo();
		b.budget = Object.fromEntries(Object.entries(b.budget).reverse()) as typeof b.budget;
		expect(planInputHash(b)).toBe(planInputHash(a));
	});
	it('changes when any input changes', () => {
		const base = planInputHash(demo());
		const edits: ((p: ReturnType<typeof demo>) => void)[] = [
			(p) => (p.factors[0].shape = 'gaussian'),
			(p) => (p.reagents[2].targets = ['resp', 'mem']),
			(p) => (p.reagents[0].effect = 1.25),
			(p) => (p.observation.replicateNoise = 0.55),
			(p) => (p.budget.total = 15001),
			(p) => (p.goal.mcc = 0.85),
			(p) => (p.design = { reagents: ['kb101'], replicates: 3, controlsPerPlate: 16, contexts: [] }),
			(p) => p.reagents.reverse()
		];
		for (const edit of edits) {
			const p = demo();
			edit(p);
			expect(planInputHash(p)).not.toBe(base);
		}
	});
});
