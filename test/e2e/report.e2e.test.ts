/**
 * The Report section in real Chromium against the built app (run `npx vite build` first):
 * build the report of the demo plan with a layout and a pilot, find every section in the
 * sandboxed preview, download it, check the plan file's SHA-256 it prints against Node's crypto
 * on the exported plan file, print the preview, and see the report marked outdated after an edit.
 */
import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { SECTION_ORDER } from '../../src/lib/core/report';
import { createFromTemplate, downloadFile, renderedText, useApp, waitSaved } from './harness';

const app = useApp();

describe('report section', () => {
	it('builds the demo plan’s report with every section, downloads and prints it', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		await page.getByTestId('layout-run').click();
		await page.getByTestId('layout-summary').waitFor();
		await page.getByTestId('pilot-demo').click();
		await page.getByTestId('pilot-estimates').waitFor();
		await waitSaved(page);

		await page.locator('#report').scrollIntoViewIfNeeded();
		expect(await renderedText(page, 'report-input-layout')).toMatch(/Plate layout included 1 /);
		expect(await renderedText(page, 'report-input-pilot')).toMatch(/Pilot findings included 1 /);
		expect(await renderedText(page, 'report-input-simulate')).toMatch(/not run yet/);
		await page.getByTestId('report-build').click();
		await page.getByTestId('report-preview').waitFor();
		expect(await page.getByTestId('report-preview').getAttribute('sandbox')).toBe('allow-same-origin allow-modals');

		// Every section of the report is in the preview; those with notebook results say so.
		const frame = page.frameLocator('[data-testid="report-preview"]');
		for (const id of SECTION_ORDER) await frame.locator(`section[data-section="${id}"]`).waitFor({ state: 'attached' });
		for (const id of ['question', 'inputs', 'verdicts', 'layout', 'pilot', 'cautions', 'reproducibility'])
			expect(await frame.locator(`section[data-section="${id}"]`).getAttribute('data-results')).toBe('yes');
		for (const id of ['simulation', 'sizing'])
			expect(await frame.locator(`section[data-section="${id}"]`).getAttribute('data-results')).toBe('no');
		expect(await frame.locator('section[data-section="layout"] svg').count()).toBeGreaterThan(0);
		expect(await frame.locator('script').count()).toBe(0);
		const reproducibility = (await frame.locator('section[data-section="reproducibility"]').innerText()).replace(/\s+/g, ' ');
		expect(reproducibility).toMatch(/layout 1; pilot 1/);
		expect(reproducibility).toContain('npm run plan -- report stress-response-factors-in-fibroblast-imaging-demo.plan.json --out stress-response-factors-in-fibroblast-imaging-demo-report.html --seed 1 --pilot demo-pilot.csv');
		expect(await renderedText(page, 'report-command')).toContain('--seed 1 --pilot demo-pilot.csv');

		// The downloaded file is the previewed report.
		const file = await downloadFile(page, () => page.getByTestId('report-download').click());
		expect(file.name).toBe('stress-response-factors-in-fibroblast-imaging-demo-report.html');
		expect(file.text).toMatch(/^<!doctype html>/i);
		for (const id of SECTION_ORDER) expect(file.text).toContain(`data-section="${id}"`);
		const srcdoc = await page.getByTestId('report-preview').getAttribute('srcdoc');
		expect(srcdoc).toBe(file.text);

		// Its plan SHA-256 is the SHA-256 of the exported plan file (Node's crypto as the reference).
		const plan = await downloadFile(page, () => page.getByTestId('export-plan').click());
		const sha = createHash('sha256').update(plan.text, 'utf8').digest('hex');
		expect(file.text).toContain(sha);

		// Print prints the preview's own window.
		await page.evaluate(() => {
			const f = document.querySelector<HTMLIFrameElement>('[data-testid="report-preview"]')!;
			(f.contentWindow as unknown as { print: () => void }).print = () => {
				(window as unknown as { __printed: string }).__printed = f.contentDocument!.title;
			};
		});
		await page.getByTestId('report-print').click();
		expect(await page.evaluate(() => (window as unknown as { __printed?: string }).__printed)).toContain('Stress-response factors in fibroblast imaging');

		// An input change makes the built report outdated and the stored results stale.
		await page.getByTestId('replicate-noise').fill('0.65');
		await page.getByTestId('report-outdated').waitFor();
		expect(await renderedText(page, 'report-input-layout')).toMatch(/stale — left out/);
		await page.getByTestId('report-build').click();
		await page.getByTestId('report-outdated').waitFor({ state: 'detached' });
		const layoutSection = page.frameLocator('[data-testid="report-preview"]').locator('section[data-section="layout"]');
		expect(await layoutSection.getAttribute('data-results')).toBe('no');
		expect((await layoutSection.innerText()).replace(/\s+/g, ' ')).toMatch(/computed before the plan’s inputs last changed/);
		expect(app.errors).toEqual([]);
		await page.close();
	});
});
