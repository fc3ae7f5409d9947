import { describe, expect, it } from 'vitest';
import { readdirSync } from 'node:fs';
import { DEMO_TEMPLATE, getTemplate, listTemplates } from '../../src/lib/templates';
import { validatePlan } from '../../src/lib/core/plan';

describe('templates offered by the app', () => {
	it('lists every templates/*.json file, the demo first, each a valid plan', () => {
		const files = readdirSync('templates').filter((f) => f.endsWith('.json')).map((f) => f.replace(/\.json$/, ''));
		const list = listTemplates();
		expect(list.map((t) => t.key).sort()).toEqual(files.sort());
		expect(list[0].key).toBe(DEMO_TEMPLATE);
		for (const t of list) {
			expect(validatePlan(t.plan)).toEqual([]);
			expect(t.title).toBe(t.plan.title);
			expect(t.blurb.length).toBeGreaterThan(10);
			expect(t.plan.notes.startsWith(t.blurb)).toBe(true);
		}
	});

	it('hands out fresh copies, so creating a plan never changes the template', () => {
		const a = getTemplate(DEMO_TEMPLATE)!;
		a.plan.factors.pop();
		expect(getTemplate(DEMO_TEMPLATE)!.plan.factors.length).toBe(6);
		expect(getTemplate('no-such-template')).toBeUndefined();
	});
});
