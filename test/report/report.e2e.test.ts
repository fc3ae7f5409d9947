/**
 * The report in a real browser: opened from a file:// URL in Chromium (playwright-core, as
 * STACK.md describes; the app harness serves the built app, which a report file does not need),
 * screenshotted and printed to PDF. Saves report-demo.png / report-demo.pdf (see SCREENS) for a
 * person to look at.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { checkPlan } from '../../src/lib/core/identify';
import { layoutDesign } from '../../src/lib/core/layout';
import { applyPilot } from '../../src/lib/core/pilot';
import { buildReport, renderReportHtml, type ReportInputs } from '../../src/lib/core/report';
import { simulate } from '../../src/lib/core/simulate';
import { sizePlanSync } from '../../src/lib/core/size';
import { demoPlan, fullInputs, HOSTILE, hostilePlan, pilotOf } from './fixtures';

const CHROMIUM = existsSync('/usr/lib/chromium/chromium') ? '/usr/lib/chromium/chromium' : '/usr/bin/chromium';
const ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];
/** Where the pictures go: $REPORT_SCREENS_DIR, else /work/helpers/screens when /work/helpers exists, else the temp directory. */
const SCREENS = process.env.REPORT_SCREENS_DIR ?? (existsSync('/work/helpers') ? '/work/helpers/screens' : join(tmpdir(), 'identiplate-screens'));

let dir: string;
let context: BrowserContext;
const requests: string[] = [];
const dialogs: string[] = [];
const errors: string[] = [];

/** The demo story (invented): a first draft, an adopted design, then a pilot that raised the noise estimate. */
function demoInputs(): ReportInputs {
	const draft = demoPlan();
	const sizing = sizePlanSync(draft, { seed: 1, maxReps: 100 });
	const adopted = structuredClone(draft);
	adopted.design = { reagents: ['kb101', 'kb201', 'kb301', 'kb401', 'kb501', 'kb601', 'kb701', 'kb702', 'kb703', 'kb704'], replicates: 14, controlsPerPlate: 16, contexts: [] };
	adopted.sectionNotes = { design: 'Adopted 14 replicates so that every replicate of a reagent sits on its own row of the single plate.' };
	const pilot = pilotOf(adopted, 11);
	const current = applyPilot(adopted, pilot);
	return {
		plan: current,
		check: checkPlan(current),
		sizing,
		simulation: simulate(current, current.design!, { seed: 1, reps: 100 }),
		layout: layoutDesign(current, current.design, { seed: 1 }),
		pilot,
		pilotPlan: adopted,
		revisions: [
			{ number: 1, label: 'first draft', createdAt: '2025-01-06T09:00:00.000Z', plan: draft },
			{ number: 2, label: 'design adopted before ordering', createdAt: '2025-01-13T15:20:00.000Z', plan: adopted },
			{ number: 3, label: 'after the pilot', createdAt: '2025-01-27T11:05:00.000Z', plan: current }
		],
		generatedAt: '2025-01-31T09:30:00.000Z',
		appVersion: JSON.parse(readFileSync('package.json', 'utf8')).version,
		seeds: { sizing: 1, simulation: 1, layout: 1, pilot: 11 }
	};
}

async function open(html: string, name: string): Promise<{ page: Page; url: string }> {
	const file = join(dir, name);
	writeFileSync(file, html);
	const url = pathToFileURL(file).href;
	const page = await context.newPage();
	page.on('dialog', (d) => {
		dialogs.push(d.message());
		void d.dismiss();
	});
	page.on('pageerror', (e) => errors.push(e.message));
	await page.goto(url, { waitUntil: 'load' });
	return { page, url };
}

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'identiplate-report-e2e-'));
	context = await chromium.launchPersistentContext(join(dir, 'profile'), { executablePath: CHROMIUM, headless: true, args: ARGS, viewport: { width: 1200, height: 900 } });
	context.on('request', (r) => requests.push(r.url()));
});

afterAll(async () => {
	await context?.close();
	rmSync(dir, { recursive: true, force: true });
});

describe('the report in Chromium', () => {
	it('opens from a file with no request beyond the file itself, no script, and every section; screenshot and PDF saved', async () => {
		const model = buildReport(demoInputs());
		const { page, url } = await open(renderReportHtml(model), 'report-demo.html');
		expect(requests.filter((r) => r !== url)).toEqual([]);
		expect(errors).toEqual([]);
		const dom = await page.evaluate(() => ({
			scripts: document.scripts.length,
			images: document.images.length,
			sections: [...document.querySelectorAll('section.rp-section')].map((s) => [s.id, s.getAttribute('data-results')]),
			svgs: document.querySelectorAll('svg').length,
			title: document.title,
			overflowX: document.documentElement.scrollWidth > document.documentElement.clientWidth
		}));
		expect(dom.scripts).toBe(0);
		expect(dom.images).toBe(0);
		expect(dom.sections).toEqual(model.sections.map((s) => [s.id, s.hasResults ? 'yes' : 'no']));
		expect(dom.sections.every(([, r]) => r === 'yes')).toBe(true);
		expect(dom.svgs).toBeGreaterThanOrEqual(5);
		expect(dom.title).toContain(model.title);
		expect(dom.overflowX).toBe(false);

		// In print, every section after the first starts a new page.
		await page.emulateMedia({ media: 'print' });
		const breaks = await page.evaluate(() => [...document.querySelectorAll('section.rp-section')].map((s) => getComputedStyle(s).breakBefore));
		expect(breaks[0]).not.toBe('page');
		expect(breaks.slice(1).every((b) => b === 'page')).toBe(true);
		await page.emulateMedia({ media: null });

		mkdirSync(SCREENS, { recursive: true });
		await page.screenshot({ path: join(SCREENS, 'report-demo.png') });
		await page.screenshot({ path: join(SCREENS, 'report-demo-full.png'), fullPage: true });
		const pdf = await page.pdf({ path: join(SCREENS, 'report-demo.pdf'), format: 'A4', printBackground: true });
		const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
		expect(pages).toBeGreaterThanOrEqual(model.sections.length);
		expect(pages).toBeLessThan(60);
		writeFileSync(join(SCREENS, 'report-demo.html'), renderReportHtml(model));
		await page.close();
	});

	it('keeps hostile names, notes and labels as inert text: no dialog, no injected element or attribute', async () => {
		const before = requests.length;
		const { page, url } = await open(renderReportHtml(buildReport(fullInputs(hostilePlan()))), 'report-hostile.html');
		await page.mouse.move(300, 300);
		await page.keyboard.press('Tab');
		expect(requests.slice(before).filter((r) => r !== url)).toEqual([]);
		expect(dialogs).toEqual([]);
		expect(errors).toEqual([]);
		const dom = await page.evaluate(() => {
			const all = [...document.querySelectorAll('*')];
			return {
				scripts: document.scripts.length,
				injected: document.querySelectorAll('img, iframe, link, textarea, b#pwned-3, svg[onload], a[href^="javascript"], a[href^="http"]').length,
				handlers: all.filter((el) => [...el.attributes].some((a) => a.name.startsWith('on'))).length,
				styles: document.querySelectorAll('style').length,
				text: document.body.innerText
			};
		});
		expect(dom.scripts).toBe(0);
		expect(dom.injected).toBe(0);
		expect(dom.handlers).toBe(0);
		expect(dom.styles).toBe(1);
		for (const p of [HOSTILE.script, HOSTILE.img, HOSTILE.textarea, HOSTILE.attrDouble.trim()]) expect(dom.text).toContain(p);
		await page.close();
	});
});
