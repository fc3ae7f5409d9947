import { describe, expect, it } from 'vitest';
import { applyPilot } from '../../src/lib/core/pilot';
import { serializePlan, parsePlan } from '../../src/lib/core/plan';
import { diffPlans, showValue } from '../../src/lib/core/report';
import { demoPlan, demoWithDesign, pilotOf, templatePlans } from './fixtures';

describe('diffPlans', () => {
	it('finds no change between a plan and itself, or its canonical re-serialisation (key order does not count)', () => {
		for (const { file, plan } of templatePlans()) {
			expect(diffPlans(plan, structuredClone(plan)), file).toEqual([]);
			expect(diffPlans(plan, parsePlan(serializePlan(plan))), file).toEqual([]);
		}
	});

	it('writes a changed number as "path before → after"', () => {
		const a = demoPlan();
		const b = structuredClone(a);
		b.observation.replicateNoise = 0.62;
		expect(diffPlans(a, b)).toEqual([{ path: 'observation.replicateNoise', kind: 'changed', before: 0.5, after: 0.62, text: 'observation.replicateNoise 0.5 → 0.62' }]);
	});

	it('names added and removed collection members by id and name, and member fields by id', () => {
		const a = demoPlan();
		const b = structuredClone(a);
		const kb703 = b.reagents.find((r) => r.id === 'kb703')!;
		a.reagents = a.reagents.filter((r) => r.id !== 'kb703');
		b.reagents = b.reagents.filter((r) => r.id !== 'kb902');
		b.reagents.find((r) => r.id === 'kb101')!.effect = 1.0;
		b.factors[0].name = 'Membrane damage';
		const texts = diffPlans(a, b).map((c) => c.text);
		expect(texts).toContain('factors.mem.name "Membrane stress" → "Membrane damage"');
		expect(texts).toContain('reagents: removed kb902 (KB-902 library hit B (targets unknown))');
		expect(texts).toContain(`reagents: added kb703 (${kb703.name})`);
		expect(texts).toContain('reagents.kb101.effect 1.2 → 1');
		expect(texts).toHaveLength(4);
	});

	it('reports an optional field set or removed, and a reorder of the same members', () => {
		const a = demoPlan();
		const b = structuredClone(a);
		b.reagents[0].maxWells = 40;
		delete b.reagents[1].effectCv;
		[b.factors[0], b.factors[1]] = [b.factors[1], b.factors[0]];
		const changes = diffPlans(a, b);
		expect(changes.map((c) => [c.path, c.kind])).toEqual([
			['factors', 'reordered'],
			['reagents.kb101.maxWells', 'added'],
			['reagents.kb102.effectCv', 'removed']
		]);
	});

	it('compares designs: fixed, cleared, and reagent lists as sets', () => {
		const a = demoPlan();
		const b = demoWithDesign();
		expect(diffPlans(a, b).map((c) => [c.path, c.kind])).toEqual([['design', 'added']]);
		expect(diffPlans(b, a)).toEqual([expect.objectContaining({ path: 'design', kind: 'removed', text: 'design cleared (the plan is sized again)' })]);
		const c = structuredClone(b);
		c.design!.reagents = [...c.design!.reagents.filter((r) => r !== 'kb703'), 'kb704'];
		c.design!.replicates = 6;
		expect(diffPlans(b, c).map((x) => x.text)).toEqual(['design.reagents: removed kb703', 'design.reagents: added kb704', 'design.replicates 4 → 6']);
		const d = structuredClone(b);
		d.design!.reagents.reverse();
		expect(diffPlans(b, d).map((x) => x.kind)).toEqual(['reordered']);
	});

	it('lists title, notes and section-note edits, with long text cut', () => {
		const a = demoPlan();
		const b = structuredClone(a);
		b.title = 'New title';
		b.notes = 'x'.repeat(500);
		b.sectionNotes = { layout: 'use the stacker' };
		const changes = diffPlans(a, b);
		expect(changes.map((c) => c.path)).toEqual(['title', 'notes', 'sectionNotes.layout']);
		expect(changes[1].text.length).toBeLessThan(250);
		expect(changes[2].text).toBe('sectionNotes.layout written: "use the stacker"');
	});

	it('shows what applying a pilot changed (the plan’s noise estimates), and does not modify either plan', () => {
		const a = demoWithDesign();
		const b = applyPilot(a, pilotOf(a));
		const before = [JSON.stringify(a), JSON.stringify(b)];
		const changes = diffPlans(a, b);
		expect(changes.length).toBeGreaterThan(0);
		expect(changes.some((c) => c.path === 'observation.replicateNoise' && c.kind === 'changed')).toBe(true);
		for (const c of changes) expect(c.text.startsWith(c.path)).toBe(true);
		expect([JSON.stringify(a), JSON.stringify(b)]).toEqual(before);
	});
});

describe('showValue', () => {
	it('formats values compactly', () => {
		expect(showValue(null)).toBe('none');
		expect(showValue(undefined)).toBe('(absent)');
		expect(showValue(['mem', 'resp'])).toBe('["mem", "resp"]');
		expect(showValue({ mem: 0.6, resp: 1.2 })).toBe('{mem: 0.6, resp: 1.2}');
		expect(showValue('a\n  b')).toBe('"a b"');
	});
});
