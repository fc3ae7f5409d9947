import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { checkPlan } from '../../src/lib/core/identify';
import { serializePlan } from '../../src/lib/core/plan';
import { buildReport, renderReportHtml, SECTION_ORDER, STANDING_CAUTIONS, type ReportInputs, type ReportModel } from '../../src/lib/core/report';
import { designCost, sizePlanSync } from '../../src/lib/core/size';
import { demoPlan, demoWithDesign, fullInputs, GENERATED_AT, minimalInputs, templatePlans } from './fixtures';

const EXPECTED_ORDER = ['question', 'inputs', 'verdicts', 'simulation', 'sizing', 'design', 'layout', 'pilot', 'revisions', 'cautions', 'reproducibility'];
const RESULT_SECTIONS = ['simulation', 'sizing', 'design', 'layout', 'pilot', 'revisions'];

function textOf(model: ReportModel, id: string): string {
	return JSON.stringify(model.sections.find((s) => s.id === id));
}

describe('buildReport', () => {
	it('has every section, in order, for every template plan; result sections without results say "No results yet"', () => {
		expect(SECTION_ORDER).toEqual(EXPECTED_ORDER);
		for (const { file, plan, text } of templatePlans()) {
			const model = buildReport({ ...minimalInputs(plan), planText: text });
			expect(model.sections.map((s) => s.id), file).toEqual(EXPECTED_ORDER);
			for (const s of model.sections) {
				const noResult = RESULT_SECTIONS.includes(s.id) && !(s.id === 'design' && plan.design);
				expect(s.hasResults, `${file} ${s.id}`).toBe(!noResult);
				if (noResult) expect(s.blocks[0]).toMatchObject({ kind: 'callout', tone: 'empty', title: 'No results yet' });
				else expect(s.blocks.length, `${file} ${s.id}`).toBeGreaterThan(0);
			}
			const html = renderReportHtml(model);
			for (const id of EXPECTED_ORDER) expect(html, `${file} ${id}`).toContain(`<section class="rp-section" id="${id}"`);
			expect((html.match(/No results yet: /g) ?? []).length, file).toBe(model.sections.filter((s) => !s.hasResults).length);
			// The plan's SHA-256 is the one of the file text (node:crypto as the reference).
			expect(model.planSha256, file).toBe(createHash('sha256').update(text, 'utf8').digest('hex'));
		}
	});

	it('fills every section when every result is given (fixed design, simulation, layout, pilot, revisions)', () => {
		const model = buildReport(fullInputs(demoWithDesign()));
		for (const s of model.sections) expect(s.hasResults, s.id).toBe(s.id !== 'sizing');
		expect(textOf(model, 'sizing')).toContain('the plan fixes its design');
		const charts = model.sections.flatMap((s) => s.blocks.filter((b) => b.kind === 'chart'));
		expect(charts.length).toBeGreaterThanOrEqual(2);
		const maps = model.sections.find((s) => s.id === 'layout')!.blocks.filter((b) => b.kind === 'plateMap');
		expect(maps.length).toBeGreaterThanOrEqual(1);
		// Revisions are sorted by number, and each later one lists its changes.
		const rev = textOf(model, 'revisions');
		expect(rev.indexOf('Revision 1: before ordering')).toBeLessThan(rev.indexOf('Revision 2: after the pilot'));
		expect(rev).toContain('observation.replicateNoise 0.5 → ');
		expect(rev).toContain('The plan in this report equals revision 2.');
	});

	it('states the sizing result, its frontier and curve charts, and the recommended design with its cost', () => {
		const plan = demoPlan();
		const sizing = sizePlanSync(plan, { seed: 2, maxReps: 50, maxSets: 1 });
		const model = buildReport({ ...minimalInputs(plan), sizing, seeds: { sizing: 2 } });
		const s = model.sections.find((x) => x.id === 'sizing')!;
		expect(s.hasResults).toBe(true);
		expect(s.blocks.filter((b) => b.kind === 'chart').length).toBe(sizing.curve.length ? 3 : 1);
		expect(JSON.stringify(s)).toContain(sizing.reason);
		const design = model.sections.find((x) => x.id === 'design')!;
		expect(design.hasResults).toBe(sizing.design !== null);
		if (sizing.design) expect(JSON.stringify(design)).toContain(sizing.feasible ? '(recommended)' : 'does not reach the goal');
	});

	it('prints the cost model’s breakdown of the adopted design, which adds up to the total', () => {
		const plan = demoWithDesign();
		const cost = designCost(plan, plan.design!);
		// Hand computation from the plan's stated prices (invented demo values): 8 reagents × 4 wells at their cost per
		// well, one 384-well plate at 140 EUR, 800 EUR fixed.
		const reagentCost = plan.design!.reagents.reduce((s, id) => s + 4 * plan.reagents.find((r) => r.id === id)!.costPerWell, 0);
		expect(cost.total).toBeCloseTo(reagentCost + cost.plates * 140 + 800, 10);
		const model = buildReport(minimalInputs(plan));
		const table = model.sections.find((s) => s.id === 'design')!.blocks.find((b) => b.kind === 'table');
		expect(table && table.kind === 'table' && table.table.rows.at(-1)).toEqual(['Total', String(cost.treatmentWells), '', `${cost.total.toFixed(2)} EUR`]);
	});

	it('always carries the standing cautions: model assumptions, the pilot, a statistician’s review, biosafety and approvals', () => {
		for (const { plan } of templatePlans()) {
			const html = renderReportHtml(buildReport(minimalInputs(plan)));
			for (const c of STANDING_CAUTIONS) expect(html).toContain(c.replace(/’/g, '’'));
			expect(html).toMatch(/statistician/);
			expect(html).toMatch(/biosafety/);
			expect(html).toMatch(/pilot/);
		}
	});

	it('prints the reproducibility block: version, date, seeds and the plan hash', () => {
		const inputs = { ...fullInputs(demoWithDesign()), appVersion: '9.8.7', command: 'identiplate report plan.json --seed 5' };
		const model = buildReport(inputs);
		const rep = textOf(model, 'reproducibility');
		expect(rep).toContain('identiplate 9.8.7');
		expect(rep).toContain(GENERATED_AT);
		expect(rep).toContain('simulation 5; layout 7; pilot 3');
		expect(rep).toContain(createHash('sha256').update(serializePlan(inputs.plan), 'utf8').digest('hex'));
		expect(rep).toContain('identiplate report plan.json --seed 5');
	});

	it('sets pilot estimates beside the plan the pilot was analysed against', () => {
		const inputs = fullInputs(demoWithDesign());
		const before = inputs.revisions!.find((r) => r.number === 1)!.plan;
		const table = (model: ReportModel) => {
			const b = model.sections.find((s) => s.id === 'pilot')!.blocks.find((x) => x.kind === 'table');
			return b && b.kind === 'table' ? b.table : null;
		};
		// Without pilotPlan the current plan (which already carries the pilot's values) is the baseline.
		const same = table(buildReport(inputs))!;
		expect(same.columns[1].label).toBe('Plan');
		expect(same.rows[0][1]).toBe(inputs.plan.observation.replicateNoise.toFixed(3));
		const withBase = table(buildReport({ ...inputs, pilotPlan: before }))!;
		expect(withBase.columns[1].label).toBe('Plan before the pilot');
		expect(withBase.rows[0][1]).toBe(before.observation.replicateNoise.toFixed(3));
		expect(() => buildReport({ ...inputs, pilotPlan: {} as never })).toThrow(/inputs\.pilotPlan/);
	});

	it('says why a result is missing when told', () => {
		const model = buildReport({ ...minimalInputs(demoPlan()), unavailable: { layout: 'the design does not fit its plates' } });
		expect(textOf(model, 'layout')).toContain('Why: the design does not fit its plates');
	});

	it('throws at once, naming the field, for caller mistakes', () => {
		const ok = minimalInputs(demoPlan());
		const bad: [Partial<ReportInputs>, RegExp][] = [
			[{ plan: undefined }, /inputs\.plan/],
			[{ check: undefined }, /inputs\.check/],
			[{ generatedAt: 'yesterday' }, /inputs\.generatedAt/],
			[{ generatedAt: '2025-01-31' }, /inputs\.generatedAt/],
			[{ appVersion: ' ' }, /inputs\.appVersion/],
			[{ seeds: { simulation: 1.5 } }, /inputs\.seeds\.simulation/],
			[{ maxPlateMaps: -1 }, /inputs\.maxPlateMaps/],
			[{ revisions: [{ number: 1, label: 'x', createdAt: 0, plan: undefined as never }] }, /inputs\.revisions\[0\]\.plan/]
		];
		for (const [patch, re] of bad) expect(() => buildReport({ ...ok, ...patch } as ReportInputs)).toThrow(re);
	});

	it('does not modify its inputs and gives the same model for the same inputs', () => {
		const inputs = fullInputs(demoWithDesign());
		const before = JSON.stringify(inputs);
		const a = buildReport(inputs);
		expect(JSON.stringify(inputs)).toBe(before);
		expect(JSON.stringify(buildReport(inputs))).toBe(JSON.stringify(a));
		expect(renderReportHtml(buildReport(inputs))).toBe(renderReportHtml(a));
		// The model is plain data: it survives structured cloning (a worker message) unchanged.
		expect(structuredClone(a)).toEqual(a);
	});

	it('limits the plate maps drawn and says where the rest are', () => {
		const inputs = fullInputs(demoWithDesign());
		const model = buildReport({ ...inputs, maxPlateMaps: 0 });
		const layout = model.sections.find((s) => s.id === 'layout')!;
		expect(layout.blocks.some((b) => b.kind === 'plateMap')).toBe(false);
		expect(JSON.stringify(layout)).toContain('Plate maps 1–');
	});

	it('reports the verdict of every factor and the source of every check', () => {
		const plan = demoWithDesign();
		const check = checkPlan(plan);
		const html = renderReportHtml(buildReport(minimalInputs(plan)));
		for (const c of check.checks) expect(html).toContain(c.source.replace(/&/g, '&amp;').replace(/'/g, '&#39;').replace(/"/g, '&quot;'));
		for (const f of plan.factors) expect(html).toContain(`${f.name} (${f.id})`);
	});
});
