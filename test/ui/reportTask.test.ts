/**
 * The notebook's report task (src/lib/ui/report/reportTask.ts): which stored results go in,
 * what the report says about stale and missing ones, the command line it prints, and the
 * report built in the worker. Check values: the plan file's SHA-256 and the HTML's UTF-8 size
 * from Node's own crypto and Buffer (outside the project's SHA-256 code).
 */
import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { parsePlan, serializePlan, type Plan } from '../../src/lib/core/plan';
import { planInputHash } from '../../src/lib/core/plan/hashPlan';
import { layoutDesign } from '../../src/lib/core/layout';
import { analysePilot, parsePilotCsvText } from '../../src/lib/core/pilot';
import { SECTION_ORDER } from '../../src/lib/core/report';
import { makeReport, reportInputStates, reportRequest, type ResultLike } from '../../src/lib/ui/report/reportTask';

const plan = parsePlan(readFileSync('templates/demo.json', 'utf8'));
const layout = layoutDesign(plan, null, { seed: 4, effort: 0.2 });
const pilot = analysePilot(plan, parsePilotCsvText(plan, readFileSync('static/demo-pilot.csv', 'utf8')), { seed: 2, permutations: 40 });

function stored(kind: string, summary: unknown, seed: number, forPlan: Plan, settings: Record<string, unknown> = {}): ResultLike {
	return { kind, createdAt: Date.UTC(2031, 4, 6, 8, 30), seed, settings, summary, inputHash: planInputHash(forPlan) };
}

const other = structuredClone(plan);
other.observation.replicateNoise = 0.7;

const base = {
	revisions: [],
	now: new Date('2031-05-06T09:00:00.000Z'),
	appVersion: '9.9.9',
	planFileName: 'demo.plan.json',
	reportFileName: 'demo-report.html'
};

describe('reportInputStates', () => {
	it('tells included, stale and missing results apart by the input hash', () => {
		const states = reportInputStates(plan, { layout: stored('layout', layout, 4, plan), pilot: stored('pilot', pilot, 2, other) });
		expect(states.map((s) => [s.kind, s.section, s.state, s.seed])).toEqual([
			['simulate', 'simulation', 'missing', null],
			['size', 'sizing', 'missing', null],
			['layout', 'layout', 'included', 4],
			['pilot', 'pilot', 'stale', 2]
		]);
	});
});

describe('reportRequest', () => {
	it('takes current results with their seeds, leaves stale ones out with the reason, and prints the command', () => {
		const r = reportRequest({ ...base, plan, results: { layout: stored('layout', layout, 4, plan), pilot: stored('pilot', pilot, 2, other, { file: 'demo-pilot.csv' }) } });
		expect(r.layout).toBe(layout);
		expect(r.pilot).toBeNull();
		expect(r.simulation).toBeNull();
		expect(r.sizing).toBeNull();
		expect(r.seeds).toEqual({ layout: 4 });
		expect(r.unavailable).toEqual({
			pilot: 'the stored pilot analysis (2031-05-06 08:30 UTC) was computed before the plan’s inputs last changed, so it is left out; run it again in the notebook’s Pilot section.'
		});
		expect(r.generatedAt).toBe('2031-05-06T09:00:00.000Z');
		expect(r.commandLine).toBe('npm run plan -- report demo.plan.json --out demo-report.html --seed 4');
		expect(r.command).toBe(
			'npm run plan -- report demo.plan.json --out demo-report.html --seed 4 (seeds are not stored in the plan file: export the plan from the notebook and run this in the project folder to recompute every result)'
		);
	});

	it('names every seed when they differ, and passes the pilot file (quoted when needed)', () => {
		const r = reportRequest({
			...base,
			plan,
			results: { layout: stored('layout', layout, 4, plan), pilot: stored('pilot', pilot, 2, plan, { file: 'pilot run 1.csv' }) }
		});
		expect(r.seeds).toEqual({ layout: 4, pilot: 2 });
		expect(r.command).toBe(
			'npm run plan -- report demo.plan.json --out demo-report.html --seed 4 --pilot "pilot run 1.csv" (seeds are not stored in the plan file; this notebook used layout 4, pilot 2, and the command line uses one seed for all, so only the results with seed 4 are reproduced exactly)'
		);
	});
});

describe('reportRequest and the design behind a layout', () => {
	// A sizing result that recommends a design (only the fields reportRequest reads matter here).
	const sizing = { feasible: true, design: { reagents: ['kb101'], replicates: 6, controlsPerPlate: 16, contexts: [], plates: 1, wells: 22, cost: 900 } };

	it('leaves out a default-design layout when sizing recommends another design', () => {
		const r = reportRequest({ ...base, plan, results: { layout: stored('layout', layout, 4, plan), size: stored('size', sizing, 3, plan) } });
		expect(r.layout).toBeNull();
		expect(r.sizing).toBe(sizing);
		expect(r.seeds).toEqual({ sizing: 3 });
		expect(reportInputStates(plan, { layout: stored('layout', layout, 4, plan), size: stored('size', sizing, 3, plan) }).find((x) => x.kind === 'layout')!.state).toBe('other-design');
		expect(r.unavailable.layout).toMatch(/^the stored layout is of the default design \(every reagent and context, 4 replicates\), not of the design sizing recommends/);
	});

	it('keeps the layout of an adopted design', () => {
		const adopted = structuredClone(plan);
		adopted.design = { reagents: plan.reagents.map((x) => x.id), replicates: 4, controlsPerPlate: 16, contexts: [] };
		const own = layoutDesign(adopted, adopted.design, { seed: 4, effort: 0 });
		const r = reportRequest({ ...base, plan: adopted, results: { layout: stored('layout', own, 4, adopted), size: stored('size', sizing, 3, adopted) } });
		expect(r.layout).toBe(own);
		expect(r.unavailable).toEqual({});
	});
});

describe('makeReport', () => {
	const results = { layout: stored('layout', layout, 4, plan), pilot: stored('pilot', pilot, 2, plan, { file: 'demo-pilot.csv' }) };
	const revisions = [{ number: 1, label: 'Before pilot', createdAt: Date.UTC(2031, 4, 1), plan: other }];
	const out = makeReport(reportRequest({ ...base, plan, results, revisions }));

	it('renders every section, with results where the notebook has them', () => {
		for (const id of SECTION_ORDER) expect(out.html).toContain(`data-section="${id}"`);
		expect(out.sections.map((s) => s.id)).toEqual(SECTION_ORDER);
		const has = Object.fromEntries(out.sections.map((s) => [s.id, s.hasResults]));
		expect(has).toMatchObject({ layout: true, pilot: true, revisions: true, simulation: false, sizing: false, verdicts: true });
		expect(out.html).toContain('data-section="simulation" data-results="no"');
		expect(out.html).toContain('data-section="layout" data-results="yes"');
	});

	it('prints the plan file’s SHA-256, the seeds and the command, and measures its own size', () => {
		const sha = createHash('sha256').update(serializePlan(plan), 'utf8').digest('hex');
		expect(out.planSha256).toBe(sha);
		expect(out.html).toContain(sha);
		expect(out.html).toContain('layout 4; pilot 2');
		expect(out.html).toContain('npm run plan -- report demo.plan.json --out demo-report.html --seed 4 --pilot demo-pilot.csv');
		expect(out.html).toContain('identiplate 9.9.9');
		expect(out.bytes).toBe(Buffer.byteLength(out.html, 'utf8'));
		expect(out.html).not.toMatch(/<script\b/i);
	});

	it('says why a stale result is missing', () => {
		const stale = makeReport(reportRequest({ ...base, plan, results: { layout: stored('layout', layout, 4, other) } }));
		expect(stale.sections.find((s) => s.id === 'layout')!.hasResults).toBe(false);
		expect(stale.html).toContain('the stored plate layout (2031-05-06 08:30 UTC) was computed before the plan’s inputs last changed');
	});
});
