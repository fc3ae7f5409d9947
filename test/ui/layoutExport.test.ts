/**
 * Downloads of the Layout section (src/lib/ui/layout/layoutExport.ts) and the well text of its
 * plate map (wellText.ts). Check values: ANSI/SLAS 4-2004 plate geometry (96 wells = 8 rows ×
 * 12 columns, 384 = 16 × 24), RFC 4180 CSV read back with papaparse (a general-purpose reader).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { parsePlan, type Plan } from '../../src/lib/core/plan';
import { layoutDesign } from '../../src/lib/core/layout';
import { layoutExport, plateMapOptions, stackSvgs } from '../../src/lib/ui/layout/layoutExport';
import { wellText } from '../../src/lib/ui/layout/wellText';
import { pValueText, shareText } from '../../src/lib/ui/layout/diagnosticsText';

function demo(format: 96 | 384): Plan {
	const plan = parsePlan(readFileSync('templates/demo.json', 'utf8'));
	plan.budget.plateFormat = format;
	return plan;
}

describe('layoutExport', () => {
	// The demo's default design on 96-well plates with the edge excluded needs two plates.
	const plan = demo(96);
	const layout = layoutDesign(plan, null, { seed: 3, effort: 0.2 });

	it('writes the CSV of all plates and of one plate, every well in ANSI/SLAS order', () => {
		expect(layout.plates.length).toBe(2);
		const all = layoutExport({ plan, layout, kind: 'csv-all' });
		expect(all.mime).toBe('text/csv');
		expect(all.fileName).toBe('stress-response-factors-in-fibroblast-imaging-demo-layout-seed3.csv');
		const rows = Papa.parse<Record<string, string>>(all.text, { header: true, skipEmptyLines: true });
		expect(rows.errors).toEqual([]);
		expect(rows.meta.fields).toEqual(['plate', 'well', 'row', 'column', 'role', 'reagent', 'context', 'replicate']);
		expect(rows.data.length).toBe(2 * 8 * 12); // ANSI/SLAS 4-2004: 96 wells per plate

		const one = layoutExport({ plan, layout, kind: 'csv-plate', plate: 2 });
		expect(one.fileName).toMatch(/-layout-seed3-plate2\.csv$/);
		const plate2 = Papa.parse<Record<string, string>>(one.text, { header: true, skipEmptyLines: true }).data;
		expect(plate2.length).toBe(96);
		expect(plate2.every((r) => r.plate === '2')).toBe(true);
		expect(plate2).toEqual(rows.data.filter((r) => r.plate === '2'));
		expect(plate2[0].well).toBe('A1');
		expect(plate2[95].well).toBe('H12');
	});

	it('pads plate numbers in file names to the plate count', () => {
		const big = demo(96);
		big.design = { reagents: big.reagents.map((r) => r.id), replicates: 40, controlsPerPlate: 8, contexts: [] };
		const many = layoutDesign(big, big.design, { seed: 1, effort: 0 });
		expect(many.plates.length).toBeGreaterThanOrEqual(10);
		expect(layoutExport({ plan: big, layout: many, kind: 'svg-plate', plate: 3 }).fileName).toMatch(/-plate03\.svg$/);
	});

	it('draws one plate as SVG and all plates stacked in one SVG', () => {
		const one = layoutExport({ plan, layout, kind: 'svg-plate', plate: 1 });
		expect(one.mime).toBe('image/svg+xml');
		expect(one.text).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
		expect(one.text.match(/data-well="/g)!.length).toBe(96);
		expect(one.text).toContain('KB-101 detergent pulse');
		const all = layoutExport({ plan, layout, kind: 'svg-all' });
		expect(all.fileName).toMatch(/-all-plates\.svg$/);
		expect(all.text.match(/<svg\b/g)!.length).toBe(3);
		expect(all.text.match(/data-well="/g)!.length).toBe(2 * 96);
	});

	it('writes printable sheets as a complete HTML page with one sheet per plate', () => {
		const sheets = layoutExport({ plan, layout, kind: 'sheets' });
		expect(sheets.mime).toBe('text/html');
		expect(sheets.text.startsWith('<!doctype html>')).toBe(true);
		expect(sheets.text.match(/<section class="ipl-sheet">/g)!.length).toBe(2);
	});

	it('refuses an unknown plate or kind with a message naming the field', () => {
		expect(() => layoutExport({ plan, layout, kind: 'csv-plate', plate: 3 })).toThrow(/plate must be one of 1…2, got 3/);
		expect(() => layoutExport({ plan, layout, kind: 'svg-plate' })).toThrow(/plate must be one of 1…2, got undefined/);
		expect(() => layoutExport({ plan, layout, kind: 'pdf' as never })).toThrow(/kind must be/);
	});

	it('does not modify the plan or the layout', () => {
		const planBefore = JSON.stringify(plan);
		const layoutBefore = JSON.stringify(layout);
		for (const kind of ['csv-all', 'csv-plate', 'svg-plate', 'svg-all', 'sheets'] as const) layoutExport({ plan, layout, kind, plate: 1 });
		expect(JSON.stringify(plan)).toBe(planBefore);
		expect(JSON.stringify(layout)).toBe(layoutBefore);
	});

	it('labels plate maps with the plan’s reagent and context names and target groups', () => {
		const o = plateMapOptions(plan);
		expect(o.names!.kb101).toBe('KB-101 detergent pulse');
		expect(o.groups!.kb101).toBe('Membrane stress');
		expect(o.planTitle).toBe(plan.title);
	});
});

describe('stackSvgs', () => {
	const a = '<svg xmlns="http://www.w3.org/2000/svg" width="100" height="40" viewBox="0 0 100 40"><rect/></svg>';
	const b = '<svg xmlns="http://www.w3.org/2000/svg" width="60" height="30" viewBox="0 0 60 30"><circle/></svg>';

	it('places parts top to bottom with a gap, as wide as the widest part', () => {
		const s = stackSvgs([a, b], 10);
		expect(s).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg" width="100" height="80" viewBox="0 0 100 80">/);
		expect(s).toContain('<svg x="0" y="0" xmlns="http://www.w3.org/2000/svg" width="100" height="40"');
		expect(s).toContain('<svg x="0" y="50" xmlns="http://www.w3.org/2000/svg" width="60" height="30"');
		expect(stackSvgs([b])).toMatch(/width="60" height="30" viewBox="0 0 60 30"/);
	});

	it('refuses an empty list and a part without a size', () => {
		expect(() => stackSvgs([])).toThrow(/at least one SVG/);
		expect(() => stackSvgs([a, '<svg viewBox="0 0 1 1"/>'])).toThrow(/parts\[1\]/);
	});
});

describe('wellText and diagnostics text', () => {
	const names = { kb101: 'KB-101 detergent pulse', bare: 'bare' };
	const ctx = { c1: 'Low serum' };
	const base = { plate: 1, row: 'C', column: 5, well: 'C5' };

	it('says what a well holds', () => {
		expect(wellText({ ...base, role: 'treatment', reagent: 'kb101', context: 'c1', replicate: 2 }, names, ctx)).toBe(
			'C5: KB-101 detergent pulse (kb101), context Low serum (c1), replicate 2'
		);
		expect(wellText({ ...base, role: 'treatment', reagent: 'bare', context: null, replicate: 1 }, names, ctx)).toBe('C5: bare, replicate 1');
		expect(wellText({ ...base, role: 'control', reagent: null, context: null, replicate: null }, names, ctx)).toBe('C5: negative control');
		expect(wellText({ ...base, role: 'empty', reagent: null, context: null, replicate: null }, names, ctx, true)).toBe('C5: excluded edge well');
		expect(wellText({ ...base, role: 'empty', reagent: null, context: null, replicate: null }, names, ctx)).toBe('C5: unused');
	});

	it('formats p-values and shares', () => {
		expect(pValueText(0.98731)).toBe('0.987');
		expect(pValueText(0.00042)).toBe('4.2e-4');
		expect(pValueText(0)).toBe('< 1e-300');
		expect(pValueText(Number.NaN)).toBe('—');
		expect(shareText(0.875)).toBe('88%');
		expect(shareText(1)).toBe('100%');
	});
});
