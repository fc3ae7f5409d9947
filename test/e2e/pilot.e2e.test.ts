/**
 * The Pilot section in real Chromium against the built app (run `npx vite build` first):
 * import the demo pilot, compare its estimates with the core run directly in Node on the same
 * file, apply it as a new revision, see both revisions side by side, reload and find them; a
 * bad file is refused with its line and column; a large cells file streams through the worker
 * with progress while the page stays responsive, and can be cancelled.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createWriteStream, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { parsePlan } from '../../src/lib/core/plan';
import { analysePilot, parsePilotCsvText } from '../../src/lib/core/pilot';
import { createFromTemplate, renderedText, useApp, waitSaved } from './harness';

const app = useApp();
let dir: string;
beforeAll(() => {
	dir = mkdtempSync(path.join(tmpdir(), 'identiplate-pilot-e2e-'));
});
afterAll(() => {
	if (dir) rmSync(dir, { recursive: true, force: true });
});

const demoPlan = parsePlan(readFileSync('templates/demo.json', 'utf8'));
const demoCsv = readFileSync('static/demo-pilot.csv', 'utf8');

/**
 * The demo pilot as a cells file: every well row repeated `cells` times with a `cell` column and
 * a small deterministic offset on each value, so every well keeps its mean.
 */
async function writeCellsFile(file: string, cells: number): Promise<number> {
	const lines = demoCsv.trimEnd().split('\n');
	const out = createWriteStream(file);
	const write = (s: string) => new Promise<void>((resolve) => (out.write(s) ? resolve() : out.once('drain', () => resolve())));
	const header = lines[0].split(',');
	await write(['cell', ...header].join(',') + '\n');
	for (const line of lines.slice(1)) {
		const cellsOfLine = line.split(',');
		for (let c = 0; c < cells; c++) {
			const shift = ((c % 2 === 0 ? 1 : -1) * Math.floor(c / 2 + 1)) / 1000;
			const last = cells % 2 === 1 && c === cells - 1 ? 0 : shift;
			const values = cellsOfLine.map((v, j) => (j < 3 ? v : (Number(v) + last).toFixed(4)));
			await write([String(c + 1), ...values].join(',') + '\n');
		}
	}
	await new Promise<void>((resolve) => out.end(resolve));
	return (lines.length - 1) * cells;
}

describe('pilot section', () => {
	it('refuses a bad file with its line and column and stores nothing', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		const lines = demoCsv.split('\n');
		const cells = lines[4].split(',');
		cells[3] = 'twelve';
		lines[4] = cells.join(',');
		await page.getByTestId('pilot-file').setInputFiles({ name: 'bad-pilot.csv', mimeType: 'text/csv', buffer: Buffer.from(lines.join('\n')) });
		await page.getByTestId('pilot-error').waitFor();
		// Line 5 of the file (header = line 1); column 4 is the first feature, nucleus_area.
		expect(await renderedText(page, 'pilot-error')).toContain('bad-pilot.csv, line 5, column “nucleus_area”: expected a finite number (decimal point, optional exponent), got "twelve".');
		expect(await page.getByTestId('pilot-estimates').count()).toBe(0);
		expect(app.errors).toEqual([]);
		await page.close();
	});

	it('imports the demo pilot, applies it as a new revision, shows both side by side and keeps them over a reload', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		await page.locator('#pilot').scrollIntoViewIfNeeded();
		await page.getByTestId('pilot-demo').click();
		await page.getByTestId('pilot-estimates').waitFor();

		// The worker's estimates are the core's, computed here in Node from the same file and seed.
		const direct = analysePilot(demoPlan, parsePilotCsvText(demoPlan, demoCsv), { seed: 1 });
		expect(await renderedText(page, 'pilot-wells')).toMatch(new RegExp(`^${direct.wells} wells on 2 plates`));
		expect(await renderedText(page, 'pilot-row-replicate')).toContain(direct.replicateNoise!.toFixed(3));
		expect(await renderedText(page, 'pilot-row-plate')).toContain(direct.plateEffect!.toFixed(3));
		expect(await renderedText(page, 'pilot-row-dimension')).toContain(`6 factors ${direct.signalDimension}`);
		// Z′ ≥ 0.5 reads as an excellent assay (Zhang, Chung & Oldenburg 1999).
		expect(direct.zPrime!).toBeGreaterThanOrEqual(0.5);
		expect(await renderedText(page, 'pilot-zprime')).toContain(`Z′ = ${direct.zPrime!.toFixed(2)} excellent assay`);
		for (const r of direct.reagents) expect(await renderedText(page, `pilot-reagent-${r.id}`)).toContain(r.distance.toFixed(2));
		await page.getByTestId('pilot-singular-values').waitFor();

		// Apply: the plan before stays as a revision, the re-planned plan is the next one.
		await page.getByTestId('pilot-apply').click();
		await page.getByTestId('pilot-applied').waitFor();
		await page.getByTestId('revision-compare').waitFor();
		expect(await renderedText(page, 'compare-head-a')).toBe('Revision 1: Before pilot (demo-pilot.csv)');
		expect(await renderedText(page, 'compare-head-b')).toBe('Revision 2: After pilot (demo-pilot.csv)');
		const noise = Number(direct.replicateNoise!.toPrecision(3));
		expect(await renderedText(page, 'compare-changes')).toContain(`observation.replicateNoise 0.5 → ${noise}`);
		await page.getByTestId('compare-verdicts').filter({ hasNotText: 'checking' }).waitFor();
		expect(await renderedText(page, 'compare-verdicts')).toMatch(/Verdicts \d of 6 factors individually.* \d of 6 factors individually/);
		expect(await renderedText(page, 'compare-sizing')).toBe('Sizing not sized not sized');
		expect(await renderedText(page, 'compare-resize')).toContain('Revision 2 is not sized for its inputs yet.');
		expect(await page.getByTestId('replicate-noise').inputValue()).toBe(String(noise));
		await page.getByTestId('revision-2').waitFor();
		expect(await renderedText(page, 'revision-1')).toContain('Before pilot (demo-pilot.csv)');

		// Re-size jumps to the Sizing section's run button.
		await page.getByTestId('compare-resize-button').click();
		await page.waitForFunction(() => document.activeElement?.getAttribute('data-testid') === 'size-run');

		// After a reload the pilot, the applied state and the side-by-side view are all there.
		await waitSaved(page);
		await page.reload();
		await page.getByTestId('pilot-estimates').waitFor();
		expect(await renderedText(page, 'pilot-applied')).toContain('Applied as revision 2');
		expect(await renderedText(page, 'compare-head-a')).toBe('Revision 1: Before pilot (demo-pilot.csv)');
		expect(await renderedText(page, 'compare-head-b')).toBe('Revision 2: After pilot (demo-pilot.csv)');
		expect(await renderedText(page, 'compare-changes')).toContain(`observation.replicateNoise 0.5 → ${noise}`);
		expect(await page.getByTestId('pilot-apply').count()).toBe(0);
		expect(app.errors).toEqual([]);
		await page.close();
	});

	it('streams a large cells file in the worker with progress, keeps the page responsive, and can be cancelled', async () => {
		const file = path.join(dir, 'pilot-cells.csv');
		const rows = await writeCellsFile(file, 301);
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		await page.locator('#pilot').scrollIntoViewIfNeeded();

		// First run: cancel while reading.
		await page.getByTestId('pilot-file').setInputFiles(file);
		await page.getByTestId('pilot-progress').filter({ hasText: /Reading pilot-cells\.csv: [1-9]\d? % of \d+\.\d MB/ }).waitFor({ timeout: 30_000 });
		await page.getByTestId('pilot-cancel').click();
		await page.getByText('Reading cancelled.').waitFor();
		expect(await page.getByTestId('pilot-estimates').count()).toBe(0);

		// Second run: to the end, while the main thread keeps ticking (largest gap between timer ticks).
		await page.evaluate(() => {
			const w = window as unknown as { __gaps: number[]; __stop: boolean };
			w.__gaps = [];
			w.__stop = false;
			let last = performance.now();
			const tick = () => {
				const now = performance.now();
				w.__gaps.push(now - last);
				last = now;
				if (!w.__stop) setTimeout(tick, 10);
			};
			setTimeout(tick, 10);
		});
		await page.getByTestId('pilot-file').setInputFiles(file);
		await page.getByTestId('pilot-progress').waitFor();
		await page.getByTestId('pilot-estimates').waitFor({ timeout: 90_000 });
		const gaps = await page.evaluate(() => {
			const w = window as unknown as { __gaps: number[]; __stop: boolean };
			w.__stop = true;
			return w.__gaps;
		});
		expect(gaps.length).toBeGreaterThan(20);
		// Reading the whole file and parsing it in one go on the main thread would block it for
		// seconds; streamed in the worker, the page's timers keep running (a loaded 2-core machine
		// still answers within half a second).
		expect(Math.max(...gaps)).toBeLessThan(500);
		expect(await renderedText(page, 'pilot-wells')).toContain(`208 wells (${rows.toLocaleString('en-GB')} cell rows averaged per well) on 2 plates`);
		// Each well's cells average back to its row in the demo file, so the estimates match the wells file.
		const direct = analysePilot(demoPlan, parsePilotCsvText(demoPlan, demoCsv), { seed: 1 });
		expect(await renderedText(page, 'pilot-row-dimension')).toContain(`6 factors ${direct.signalDimension}`);
		expect(app.errors).toEqual([]);
		await page.close();
	});
});
