/**
 * The notebook in real Chromium against the built app (run `npx vite build` first):
 * templates, live verdicts, autosave across reloads, export/import round trip, delete with
 * undo, duplicate, invalid imports and entries, one-click fixes, labels and keyboard use,
 * offline start.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { parsePlan, serializePlan } from '../../src/lib/core/plan';
import { createFromTemplate, downloadFile, useApp, waitSaved, waitVerdicts } from './harness';

const app = useApp();

const verdictOf = (page: Page, factor: string) => page.getByTestId(`verdict-${factor}`);

/** Waits until a factor's final verdict cell shows `text`. */
async function expectVerdict(page: Page, factor: string, text: string | RegExp) {
	await verdictOf(page, factor).filter({ hasText: text }).waitFor({ timeout: 10_000 });
	await waitVerdicts(page);
}

describe('plans list', () => {
	it('starts with the demo plan on first start', async () => {
		const page = await app.newPage('/');
		const cards = page.getByTestId('plan-list').locator('.plan-card');
		await cards.first().waitFor();
		expect(await cards.count()).toBe(1);
		expect(await cards.first().textContent()).toContain('Stress-response factors in fibroblast imaging (demo)');
		await page.close();
	});
});

describe('notebook', () => {
	it('creates a plan from a template and shows its verdicts', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'multi-context');
		expect(await page.getByTestId('notebook-title').textContent()).toBe('Organoid states across culture conditions (demo)');
		await waitVerdicts(page);
		expect(await page.getByTestId('verdict-status').textContent()).toMatch(/4 of 4 factors recovered individually/);
		await page.close();
	});

	it('changing a reagent’s targets (by keyboard) changes the verdict, and everything survives a reload', async () => {
		const page = await app.newPage('/');
		const id = await createFromTemplate(page, 'multi-context');
		await page.getByTestId('goal-route').selectOption('targeted');
		await expectVerdict(page, 'diff', 'individual');

		// Open g1's editor and tick "Differentiation" with the keyboard only.
		await page.getByTestId('edit-g1').focus();
		await page.keyboard.press('Enter');
		await page.getByTestId('target-g1-diff').focus();
		await page.keyboard.press('Space');
		// Only g3 and g4 avoid diff now: they cannot span the three other factors, so diff is
		// recovered only jointly with prol (per-factor rank condition, DESIGN.md).
		await expectVerdict(page, 'diff', /block\s*with Proliferation/);
		await expectVerdict(page, 'prol', 'individual');

		await page.getByTestId('notes-factors').evaluate((el) => el.closest('details')!.setAttribute('open', ''));
		await page.getByTestId('notes-factors').fill('Motility is read from time-lapse, not the end point.');
		await waitSaved(page);

		await page.reload();
		await page.getByTestId('notebook-title').waitFor();
		expect(new URL(page.url()).pathname).toBe(`/plan/${id}`);
		await expectVerdict(page, 'diff', /block\s*with Proliferation/);
		expect(await page.getByTestId('goal-route').inputValue()).toBe('targeted');
		expect(await page.getByTestId('notes-factors').inputValue()).toBe('Motility is read from time-lapse, not the end point.');
		await page.getByTestId('edit-g1').click();
		expect(await page.getByTestId('target-g1-diff').isChecked()).toBe(true);
		await page.close();
	});

	it('an invalid entry shows the rule beside the field and is not written into the plan', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		const field = page.getByTestId('replicate-noise');
		await field.fill('-0.4');
		const error = page.locator(`#${await field.getAttribute('aria-describedby').then((d) => d!.split(' ').find((x) => x.endsWith('-error')))}`);
		expect(await error.textContent()).toMatch(/Expected a number in \[0, 100\], got -0\.4\. The plan keeps 0\.5\./);
		expect(await field.getAttribute('aria-invalid')).toBe('true');
		await field.fill('abc');
		expect(await page.locator('.error').first().textContent()).toMatch(/Expected a number in \[0, 100\], got "abc"/);
		await page.getByTestId('plan-notes').fill('touch the plan so autosave runs');
		await waitSaved(page);
		await page.reload();
		expect(await page.getByTestId('replicate-noise').inputValue()).toBe('0.5');
		await page.close();
	});

	it('a failing check offers its fix one click away, and the fix restores the verdict', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'multi-context');
		await page.getByTestId('goal-route').selectOption('targeted');
		await page.getByTestId('design-fixed').check();
		await page.getByTestId('design-reagent-g3').uncheck();
		await expectVerdict(page, 'prol', /block\s*with Oxidative stress/);
		const fix = page.getByTestId('fix-targeted.rank');
		expect(await fix.textContent()).toMatch(/^Add GX-3 redox cycler to the design \(\+30 EUR\)$/);
		await fix.click();
		await expectVerdict(page, 'prol', 'individual');
		expect(await page.getByTestId('design-reagent-g3').isChecked()).toBe(true);
		expect(await page.getByTestId('verdict-status').textContent()).toMatch(/4 of 4 factors recovered individually/);
		await page.close();
	});

	it('every input, select and text area has a label', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		await page.getByTestId('edit-kb701').click();
		await waitVerdicts(page);
		const unlabelled = await page.evaluate(() =>
			[...document.querySelectorAll('input, select, textarea')]
				.filter((el) => (el as HTMLInputElement).type !== 'hidden')
				.filter((el) => !((el as HTMLInputElement).labels?.length || el.getAttribute('aria-label') || el.getAttribute('aria-labelledby')))
				.map((el) => el.outerHTML.slice(0, 120))
		);
		expect(unlabelled).toEqual([]);
		expect(app.errors).toEqual([]);
		await page.close();
	});
});

describe('plan files and the plans list', () => {
	it('export then import gives an identical plan file', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'unknown-targets');
		await page.getByTestId('plan-title').fill('Library triage, exported');
		await waitSaved(page);
		const first = await downloadFile(page, () => page.getByTestId('export-plan').click());
		expect(first.name).toBe('library-triage-exported.plan.json');
		// The file is a valid plan in canonical form.
		expect(serializePlan(parsePlan(first.text))).toBe(first.text);
		expect(parsePlan(first.text).title).toBe('Library triage, exported');

		await page.goto('/');
		await page.getByTestId('plan-list').waitFor();
		const before = await page.locator('.plan-card').count();
		await page.getByTestId('import-file').setInputFiles({ name: first.name, mimeType: 'application/json', buffer: Buffer.from(first.text) });
		await page.locator('.plan-card').nth(before).waitFor();
		const imported = page.locator('.plan-card.highlight');
		const importedId = (await imported.getAttribute('data-testid'))!.replace(/^plan-/, '');
		const second = await downloadFile(page, () => page.getByTestId(`export-${importedId}`).click());
		expect(second.text).toBe(first.text);
		await page.close();
	});

	it('an invalid plan file is refused with the JSON path of the problem', async () => {
		const page = await app.newPage('/');
		await page.getByTestId('plan-list').waitFor();
		const count = await page.locator('.plan-card').count();
		const bad = JSON.parse(readFileSync('templates/demo.json', 'utf8'));
		bad.reagents[3].targets = ['resp', 'f9'];
		await page.getByTestId('import-file').setInputFiles({ name: 'broken.plan.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
		const error = page.getByTestId('import-error');
		await error.waitFor();
		expect(await error.textContent()).toContain('broken.plan.json was not imported');
		expect(await error.textContent()).toContain('reagents[3].targets[1]: unknown factor "f9"');
		expect(await page.locator('.plan-card').count()).toBe(count);
		await page.close();
	});

	it('duplicates a plan, deletes it and brings it back with undo', async () => {
		const page = await app.newPage('/');
		await page.getByTestId('plan-list').waitFor();
		const demoCard = page.locator('.plan-card', { hasText: 'Stress-response factors in fibroblast imaging (demo)' }).first();
		const count = await page.locator('.plan-card').count();
		await demoCard.getByRole('button', { name: /^Duplicate/ }).click();
		const copy = page.locator('.plan-card', { hasText: 'Stress-response factors in fibroblast imaging (demo) (copy)' });
		await copy.waitFor();
		expect(await page.locator('.plan-card').count()).toBe(count + 1);

		await copy.getByRole('button', { name: /^Delete/ }).click();
		await copy.waitFor({ state: 'detached' });
		expect(await page.locator('.plan-card').count()).toBe(count);
		await page.getByTestId('toast-action').filter({ hasText: 'Undo' }).click();
		await copy.waitFor();
		await page.reload();
		await copy.waitFor();
		expect(await page.locator('.plan-card').count()).toBe(count + 1);
		await page.close();
	});
});

describe('offline', () => {
	it('opens the plans list and a notebook with the network gone, once loaded', async () => {
		const page = await app.newPage('/');
		await page.getByTestId('plan-list').waitFor();
		await page.evaluate(async () => {
			await navigator.serviceWorker.ready;
		});
		const href = (await page.locator('.plan-card h2 a').first().getAttribute('href'))!;
		await app.context.setOffline(true);
		try {
			// The network really is gone for the service worker too: an uncached address fails.
			expect(await page.evaluate(() => fetch(`/not-cached-${Date.now()}`).then(() => 'reached', () => 'failed'))).toBe('failed');
			await page.reload();
			await page.getByTestId('plan-list').waitFor();
			await page.goto(app.url + href);
			await waitVerdicts(page);
			expect(await page.getByTestId('verdict-status').textContent()).toMatch(/recovered individually/);
		} finally {
			await app.context.setOffline(false);
		}
		await page.close();
	});
});
