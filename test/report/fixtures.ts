/** Invented plans and report inputs shared by the report tests (demo data only). */
import { readdirSync, readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { checkPlan } from '../../src/lib/core/identify';
import { layoutDesign } from '../../src/lib/core/layout';
import { analysePilot, applyPilot, parsePilotCsvText, simulatePilotRows, type PilotEstimates } from '../../src/lib/core/pilot';
import { parsePlan, type Plan } from '../../src/lib/core/plan';
import type { ReportInputs } from '../../src/lib/core/report';
import { simulate } from '../../src/lib/core/simulate';

export const GENERATED_AT = '2025-01-31T09:30:00.000Z';

/** Every template plan file, by file name. */
export function templatePlans(): { file: string; text: string; plan: Plan }[] {
	return readdirSync('templates')
		.filter((f) => f.endsWith('.json'))
		.sort()
		.map((file) => {
			const text = readFileSync(`templates/${file}`, 'utf8');
			return { file, text, plan: parsePlan(text) };
		});
}

export const demoPlan = (): Plan => parsePlan(readFileSync('templates/demo.json', 'utf8'));

/** The demo plan with a fixed design: one known-target reagent per factor plus two pairs, 4 replicates. */
export function demoWithDesign(): Plan {
	const plan = demoPlan();
	plan.design = { reagents: ['kb102', 'kb202', 'kb302', 'kb401', 'kb502', 'kb602', 'kb701', 'kb703'], replicates: 4, controlsPerPlate: 16, contexts: [] };
	return plan;
}

/** Text meant to break out of element content, attributes, raw-text elements and SVG. */
export const HOSTILE = {
	script: '<script>alert("pwned-1")</script>',
	img: '<img src=x onerror=alert(2)>',
	textarea: '</textarea><b id="pwned-3">bold</b>',
	attrDouble: 'x" onmouseover="alert(4)" data-x="',
	attrSingle: "y' onfocus='alert(5)' data-y='",
	style: '</style><style>body{background:url(https://example.invalid/track.png)}</style>',
	svg: '</svg><svg onload=alert(6)><a href="https://example.invalid/">',
	link: '<a href="javascript:alert(7)">click</a><link rel=stylesheet href=//example.invalid/x.css>'
};

/** A plan whose every free text (title, notes, names, currency, section notes) is hostile. */
export function hostilePlan(): Plan {
	const plan = demoWithDesign();
	const h = Object.values(HOSTILE);
	plan.title = `Screen ${HOSTILE.script} ${HOSTILE.attrDouble}`;
	plan.notes = h.join('\n') + '\n@import url(https://example.invalid/a.css);';
	plan.factors.forEach((f, i) => (f.name = `${h[i % h.length]} factor ${i}`.slice(0, 200)));
	plan.reagents.forEach((r, i) => (r.name = `${h[(i + 3) % h.length]} reagent ${i}`.slice(0, 200)));
	plan.budget.currency = '<b>€</b>"\'';
	plan.sectionNotes = { verdicts: HOSTILE.textarea, [HOSTILE.attrSingle.slice(0, 30)]: HOSTILE.img };
	return plan;
}

/** Pilot estimates from a simulated pilot of `plan` (two plates, four wells per reagent). */
export function pilotOf(plan: Plan, seed = 3): PilotEstimates {
	const rows = [
		...simulatePilotRows(plan, {
			seed,
			reagents: plan.design ? plan.design.reagents : plan.reagents.filter((r) => r.targets).map((r) => r.id),
			plates: 2,
			replicatesPerPlate: 4,
			controlsPerPlate: 12,
			positivesPerPlate: 4,
			cellsPerWell: 0,
			truth: { replicateNoise: 0.62, measurementNoise: 0.3, plateEffect: 0.3, positive: { [plan.factors[0].id]: 3 } }
		})
	];
	const table = parsePilotCsvText(plan, Papa.unparse(rows, { newline: '\n' }) + '\n');
	return analysePilot(plan, table, { seed, permutations: 50 });
}

/** Inputs with every result present: check, simulation (small), layout, pilot and two revisions. */
export function fullInputs(plan: Plan, opts: { reps?: number; pilot?: PilotEstimates } = {}): ReportInputs {
	const design = plan.design!;
	const pilot = opts.pilot ?? pilotOf(plan);
	const revised = applyPilot(plan, pilot);
	const first = structuredClone(plan);
	return {
		plan: revised,
		check: checkPlan(revised),
		simulation: simulate(revised, design, { seed: 5, reps: opts.reps ?? 30 }),
		layout: layoutDesign(revised, design, { seed: 7, effort: 0.2 }),
		pilot,
		revisions: [
			{ number: 2, label: `after the pilot ${HOSTILE.script}`, createdAt: Date.parse('2025-01-20T10:00:00Z'), plan: revised },
			{ number: 1, label: 'before ordering', createdAt: '2025-01-10T08:00:00.000Z', plan: first }
		],
		generatedAt: GENERATED_AT,
		appVersion: '0.1.0',
		seeds: { simulation: 5, layout: 7, pilot: 3 }
	};
}

/** Inputs with only the required fields: every result section says it has no results yet. */
export function minimalInputs(plan: Plan): ReportInputs {
	return { plan, check: checkPlan(plan), generatedAt: GENERATED_AT, appVersion: '0.1.0', seeds: {} };
}

export interface Tag {
	name: string;
	attrs: [string, string][];
	raw: string;
}

/**
 * Start tags of an HTML text whose user text is escaped (so every raw "<" begins markup):
 * name and attributes with their (still entity-encoded) values. Comments and the doctype are skipped.
 */
export function startTags(html: string): Tag[] {
	const out: Tag[] = [];
	const tagRe = /<([A-Za-z][^\s/>]*)((?:\s+[^\s"'>/=]+(?:\s*=\s*(?:"[^"]*"|'[^']*'|[^\s"'=<>`]+))?)*)\s*\/?>/g;
	const attrRe = /([^\s"'>/=]+)(?:\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s"'=<>`]+)))?/g;
	for (const m of html.matchAll(tagRe)) {
		const attrs: [string, string][] = [];
		for (const a of m[2].matchAll(attrRe)) attrs.push([a[1].toLowerCase(), a[2] ?? a[3] ?? a[4] ?? '']);
		out.push({ name: m[1].toLowerCase(), attrs, raw: m[0] });
	}
	return out;
}

/** Every `<` that starts something other than a start tag, an end tag, a comment or the doctype. */
export function strayAngles(html: string): number {
	return (html.match(/<(?![A-Za-z/!])/g) ?? []).length;
}
