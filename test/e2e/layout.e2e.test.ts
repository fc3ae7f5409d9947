/**
 * The Layout section in real Chromium against the built app (run `npx vite build` first): lay
 * out the demo design, page through its plates by mouse and keyboard, read a well's contents on
 * hover and focus, download the CSV and check it against ANSI/SLAS 4-2004 well naming, find the
 * stored layout after a reload, see it marked stale after an edit, and see a stock problem
 * explained.
 */
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { createFromTemplate, downloadFile, textOf, useApp, waitSaved } from './harness';

const app = useApp();

/** ANSI/SLAS 4-2004: a 96-well plate has rows A–H and columns 1–12. */
const ROWS_96 = ['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H'];
const COLUMNS_96 = 12;

describe('layout section', () => {
	it('lays out the demo design on 96-well plates, pages through them and downloads the CSV', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		// The demo's default design (20 reagents × 4 replicates, 16 controls per plate) fills one
		// 384-well plate; on 96-well plates with the edge left empty it needs two.
		await page.getByLabel('Plate format').selectOption('96');
		await waitSaved(page);
		const section = page.locator('#layout');
		await section.scrollIntoViewIfNeeded();
		expect(await page.getByTestId('layout-design').textContent()).toMatch(/default design/);
		await page.getByTestId('layout-seed').fill('7');
		await page.getByTestId('layout-run').click();
		await page.getByTestId('layout-summary').waitFor();
		expect(await textOf(page, 'layout-summary')).toMatch(/2 plates of 96 wells, edge wells excluded: 80 treatment and 32 control wells · seed 7/);

		// Paging: buttons, the keyboard on the buttons, and Page Down inside the plate.
		const position = page.getByTestId('plate-position');
		expect(await position.textContent()).toBe('Plate 1 of 2');
		expect(await page.getByTestId('plate-prev').isDisabled()).toBe(true);
		await page.getByTestId('plate-next').click();
		expect(await position.textContent()).toBe('Plate 2 of 2');
		expect(await page.getByTestId('plate-map').getAttribute('data-plate')).toBe('2');
		expect(await page.getByTestId('plate-next').isDisabled()).toBe(true);
		await page.getByTestId('plate-prev').focus();
		await page.keyboard.press('Enter');
		expect(await position.textContent()).toBe('Plate 1 of 2');

		// Hover shows a treatment well's contents.
		const treated = page.locator('[data-testid="plate-map"] [data-role="treatment"]').first();
		const treatedName = await treated.getAttribute('data-well');
		await treated.hover();
		const info = page.getByTestId('well-info');
		await info.filter({ hasText: `Well ${treatedName}` }).waitFor();
		expect(await textOf(page, 'well-info')).toMatch(/Role\s*treatment/);
		expect(await textOf(page, 'well-info')).toMatch(/Replicate\s*\d/);
		expect(await textOf(page, 'well-info')).toMatch(/Reagent\s*KB-\d{3}/);
		await page.mouse.move(0, 0);

		// Keyboard: Tab stop on A1 (an excluded edge well here), arrows move, Page Down turns the plate.
		await page.locator('[data-testid="plate-map"] [data-index="0"]').focus();
		await info.filter({ hasText: 'Well A1' }).waitFor();
		expect(await textOf(page, 'well-info')).toMatch(/Role\s*empty/);
		await page.keyboard.press('ArrowDown');
		await page.keyboard.press('ArrowRight');
		await info.filter({ hasText: 'Well B2' }).waitFor();
		await page.keyboard.press('PageDown');
		expect(await position.textContent()).toBe('Plate 2 of 2');
		await page.keyboard.press('PageUp');
		expect(await position.textContent()).toBe('Plate 1 of 2');

		// The CSV of all plates.
		const csv = await downloadFile(page, () => page.getByTestId('layout-csv-all').click());
		expect(csv.name).toMatch(/-layout-seed7\.csv$/);
		const lines = csv.text.split('\r\n');
		expect(lines[0]).toBe('plate,well,row,column,role,reagent,context,replicate');
		expect(lines.at(-1)).toBe(''); // RFC 4180 CRLF after the last record
		expect(lines.length - 2).toBe(2 * 96); // every well of both plates, empty ones included
		// Read back with papaparse (a general-purpose CSV reader) and check the well names against
		// ANSI/SLAS 4-2004 (rows A–H, columns 1–12, name = row letter + column number).
		const parsed = Papa.parse<Record<string, string>>(csv.text, { header: true, skipEmptyLines: true });
		expect(parsed.errors).toEqual([]);
		const rows = parsed.data;
		for (const plate of ['1', '2']) {
			const names = rows.filter((r) => r.plate === plate).map((r) => r.well);
			const expected = ROWS_96.flatMap((r) => Array.from({ length: COLUMNS_96 }, (_, c) => `${r}${c + 1}`));
			expect(names).toEqual(expected);
		}
		for (const r of rows) expect(r.well).toBe(`${r.row}${r.column}`);
		// 20 reagents × 4 replicates, each replicate numbered 1–4 once; 16 controls on each plate.
		const treatments = rows.filter((r) => r.role === 'treatment');
		expect(treatments.length).toBe(80);
		const perReagent = new Map<string, string[]>();
		for (const t of treatments) perReagent.set(t.reagent, [...(perReagent.get(t.reagent) ?? []), t.replicate]);
		expect(perReagent.size).toBe(20);
		for (const reps of perReagent.values()) expect([...reps].sort()).toEqual(['1', '2', '3', '4']);
		expect(rows.filter((r) => r.role === 'control' && r.plate === '1').length).toBe(16);
		expect(rows.filter((r) => r.role === 'control' && r.plate === '2').length).toBe(16);
		// Edge exclusion: nothing in row A or H or column 1 or 12.
		expect(rows.filter((r) => r.role !== 'empty' && (r.row === 'A' || r.row === 'H' || r.column === '1' || r.column === '12'))).toEqual([]);

		// The CSV of plate 2 alone and the SVG of the shown plate.
		await page.getByTestId('plate-next').click();
		const one = await downloadFile(page, () => page.getByTestId('layout-csv-plate').click());
		expect(one.name).toMatch(/-plate2\.csv$/);
		expect(one.text.split('\r\n').length - 2).toBe(96);
		expect(one.text.split('\r\n').slice(1, -1).every((l) => l.startsWith('2,'))).toBe(true);
		const svg = await downloadFile(page, () => page.getByTestId('layout-svg-plate').click());
		expect(svg.text.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
		expect(svg.text).toContain('Plate 2 of 2');
		const all = await downloadFile(page, () => page.getByTestId('layout-svg-all').click());
		expect(all.text.match(/<svg\b/g)!.length).toBe(3); // the outer drawing and one per plate

		// Diagnostics are shown.
		expect(await page.getByTestId('layout-associations').textContent()).toMatch(/Row.*Cramér’s V/s);

		// Stored with the plan: a reload brings the same layout back.
		await waitSaved(page);
		await page.reload();
		await page.getByTestId('layout-summary').waitFor();
		expect(await textOf(page, 'layout-summary')).toMatch(/2 plates of 96 wells.*seed 7/);
		expect(await page.getByTestId('layout-seed').inputValue()).toBe('7');
		expect(await page.getByTestId('layout-stale').count()).toBe(0);

		// An input change marks it stale instead of passing it off as current.
		await page.getByTestId('replicate-noise').fill('0.6');
		await page.getByTestId('layout-stale').waitFor();
		expect(app.errors).toEqual([]);
		await page.close();
	});

	it('explains a design that exceeds a reagent’s stock and says what to change', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		await page.getByTestId('design-fixed').check();
		// KB-801 and KB-802 have stock for 48 wells; 50 replicates need 50.
		await page.getByTestId('design-replicates').fill('50');
		await waitSaved(page);
		await page.getByTestId('layout-run').click();
		const problem = page.getByTestId('layout-error');
		await problem.waitFor();
		const text = await textOf(page, 'layout-error');
		expect(text).toMatch(/This design cannot be laid out/);
		expect(text).toMatch(/not enough stock/);
		expect(text).toMatch(/kb801/);
		expect(text).toMatch(/Lower design\.replicates to at most 48/);
		expect(text).toMatch(/Design to check/);
		expect(await page.getByTestId('layout-summary').count()).toBe(0);
		expect(app.errors).toEqual([]);
		await page.close();
	});
});
