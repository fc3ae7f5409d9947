import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import {
	LAYOUT_CSV_HEADER,
	layoutCsv,
	layoutDesign,
	layoutDiagnostics,
	layoutSummary,
	plateSvg,
	printableLayoutHtml,
	reagentGroupsFromPlan,
	wellName,
	type Layout,
	type WellAssignment
} from '../../src/lib/core/layout';
import { planFromSpec } from './helpers';

const plan = planFromSpec({ format: 96, excludeEdgeWells: true, controlsPerPlate: 6, reagents: 5, replicates: 4, contexts: ['well', 'well'] });
const layout = layoutDesign(plan, plan.design, { seed: 3 });

/** Minimal XML well-formedness check: balanced tags, quoted attributes, no raw '<' or stray '&' in text. */
function wellFormedXml(xml: string): string[] {
	const problems: string[] = [];
	const stack: string[] = [];
	const tag = /<(\/?)([A-Za-z][\w:-]*)((?:\s+[\w:-]+="[^"<]*")*)\s*(\/?)>/g;
	let last = 0;
	for (let m = tag.exec(xml); m; m = tag.exec(xml)) {
		const text = xml.slice(last, m.index);
		if (/[<>]/.test(text)) problems.push(`raw bracket in text near ${m.index}: ${text.slice(0, 40)}`);
		if (/&(?!(amp|lt|gt|quot|#39);)/.test(text)) problems.push(`stray & in text near ${m.index}`);
		last = tag.lastIndex;
		if (m[1]) {
			if (stack.pop() !== m[2]) problems.push(`unbalanced </${m[2]}> at ${m.index}`);
		} else if (!m[4]) stack.push(m[2]);
	}
	if (xml.slice(last).trim()) problems.push('trailing text');
	if (stack.length) problems.push(`unclosed ${stack.join(',')}`);
	return problems;
}

describe('layoutCsv', () => {
	it('has the header, one line per well of every plate, and parses back (papaparse, RFC 4180)', () => {
		const csv = layoutCsv(layout);
		expect(csv.split('\r\n')[0]).toBe('plate,well,row,column,role,reagent,context,replicate');
		expect(csv.endsWith('\r\n')).toBe(true);
		const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
		expect(parsed.errors).toEqual([]);
		expect(parsed.meta.fields).toEqual([...LAYOUT_CSV_HEADER]);
		expect(parsed.data).toHaveLength(layout.plates.length * 96);
		const wells = layout.plates.flatMap((p) => p.wells);
		parsed.data.forEach((row, i) => {
			const w = wells[i];
			expect(row.plate).toBe(String(w.plate));
			expect(row.well).toBe(w.well);
			expect(row.well).toBe(`${row.row}${row.column}`);
			expect(row.role).toBe(w.role);
			expect(row.reagent).toBe(w.role === 'control' ? 'control' : (w.reagent ?? ''));
			expect(row.context).toBe(w.context ?? '');
			expect(row.replicate).toBe(w.replicate === null ? '' : String(w.replicate));
		});
		expect(parsed.data.filter((r) => r.role === 'control')).toHaveLength(6 * layout.plates.length);
	});
	it('quotes fields holding commas, quotes or line breaks (RFC 4180 §2.6–2.7)', () => {
		const w: WellAssignment = { plate: 1, row: 'A', column: 1, well: 'A1', role: 'treatment', reagent: 'odd,"id"', context: 'two\nlines', replicate: 1 };
		const odd: Layout = { ...layout, plates: [{ index: 1, context: null, wells: [w] }] };
		const csv = layoutCsv(odd);
		expect(csv).toBe('plate,well,row,column,role,reagent,context,replicate\r\n1,A1,A,1,treatment,"odd,""id""","two\nlines",1\r\n');
		const back = Papa.parse<string[]>(csv, { skipEmptyLines: true }).data[1];
		expect(back[5]).toBe('odd,"id"');
		expect(back[6]).toBe('two\nlines');
	});
});

describe('layoutSummary', () => {
	it('counts plates and the wells in use (treatment + control)', () => {
		const s = layoutSummary(layout);
		expect(Object.keys(s)).toEqual(['plates', 'wells', 'diagnostics']);
		expect(s.plates).toBe(layout.plates.length);
		expect(s.wells).toBe(5 * 2 * 4 + 6 * layout.plates.length);
	});
});

describe('layoutDiagnostics', () => {
	it('flags a layout that confounds reagents with the edge and with rows', () => {
		// Hand-made 96-well layout: reagent "a" fills the outer ring, "b" the wells inside.
		const wells: WellAssignment[] = [];
		for (let r = 0; r < 8; r++)
			for (let c = 0; c < 12; c++) {
				const outer = r === 0 || c === 0 || r === 7 || c === 11;
				wells.push({ plate: 1, row: 'ABCDEFGH'[r], column: c + 1, well: wellName(r, c), role: 'treatment', reagent: outer ? 'a' : 'b', context: null, replicate: 1 });
			}
		const d = layoutDiagnostics({ format: 96, excludeEdgeWells: false, plates: [{ index: 1, context: null, wells }] });
		expect(d.maxAssociation.edge.value).toBeGreaterThan(0.5);
		expect(d.maxAssociation.edge.pValue).toBeLessThan(1e-6);
		expect(d.maxAssociation.row.pValue).toBeLessThan(1e-6);
		expect(d.maxAssociation.plate).toBeNull();
		expect(d.optimiser).toBeNull();
		expect(d.warnings.some((w) => /distance to the edge/.test(w))).toBe(true);
		expect(d.replicateSpread.distinctRows).toBe(0);
	});
	it('recomputed from the wells alone it matches the diagnostics of the layout', () => {
		const again = layoutDiagnostics(layout, { optimiser: layout.diagnostics.optimiser!, warnings: [] });
		expect(again.maxAssociation).toEqual(layout.diagnostics.maxAssociation);
		expect(again.counts).toEqual(layout.diagnostics.counts);
	});
});

describe('plateSvg', () => {
	const names = Object.fromEntries(plan.reagents.map((r) => [r.id, r.name]));
	it('is well-formed, self-contained and draws every well once', () => {
		for (const p of layout.plates) {
			const svg = plateSvg(layout, p.index, { names, groups: reagentGroupsFromPlan(plan) });
			expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
			expect(wellFormedXml(svg)).toEqual([]);
			expect(svg.match(/http/g)).toHaveLength(1); // only the namespace
			expect(svg).not.toMatch(/<script|href=|<image|url\(/);
			expect(svg.match(/data-well="/g)).toHaveLength(96);
			const treat = p.wells.filter((w) => w.role === 'treatment').length;
			expect(svg.match(/data-reagent="/g) ?? []).toHaveLength(treat);
			expect(svg.match(/negative control ·|negative control</g)?.length).toBeGreaterThan(0);
			expect(svg.match(/· excluded edge well</g)).toHaveLength(36); // tooltips of the 36 outer wells (REFERENCES.md: 36 of 96)
		}
	});
	it('escapes every text it shows', () => {
		const evil = { t1: '<script>alert("x")</script> & co', t2: "O'Brien \u0007bell" };
		const svg = plateSvg(layout, 1, { names: evil, contextNames: { e1: '<b>ctx</b>' }, title: 'A & B <plate>' });
		expect(wellFormedXml(svg)).toEqual([]);
		expect(svg).not.toContain('<script>');
		expect(svg).toContain('&lt;script&gt;');
		expect(svg).toContain('A &amp; B &lt;plate&gt;');
		expect(svg).not.toContain('\u0007');
	});
	it('uses the same colour for a reagent on every plate and refuses unknown plates', () => {
		const big = planFromSpec({ format: 96, excludeEdgeWells: false, controlsPerPlate: 4, reagents: 6, replicates: 4, contexts: [], plates: 3 });
		const l = layoutDesign(big, big.design);
		const fillOf = (svg: string) => /<circle[^>]*fill="([^"]+)"[^>]*data-reagent="t1"/.exec(svg)?.[1];
		const fills = l.plates.map((p) => fillOf(plateSvg(l, p.index))).filter(Boolean);
		expect(fills.length).toBeGreaterThan(1);
		expect(new Set(fills).size).toBe(1);
		expect(() => plateSvg(l, 4)).toThrow(/plateIndex must be one of 1…3, got 4/);
		expect(() => plateSvg(l, 1, { scale: 0 })).toThrow(/scale/);
	});
});

describe('printableLayoutHtml', () => {
	it('gives one sheet per plate with the well table and the caution, as a fragment or a document', () => {
		const frag = printableLayoutHtml(layout, { planTitle: 'T & <x>' });
		expect(frag.match(/<section class="ipl-sheet">/g)).toHaveLength(layout.plates.length);
		expect(frag).toContain('T &amp; &lt;x&gt;');
		expect(frag).toContain('statistician');
		expect(frag).toContain('break-after:page');
		const doc = printableLayoutHtml(layout, { document: true });
		expect(doc.startsWith('<!doctype html>')).toBe(true);
		expect(doc).toContain('@page{size:A4 landscape');
		// Every treatment well is listed in its plate's table.
		for (const p of layout.plates) for (const w of p.wells.filter((x) => x.role === 'treatment')) expect(frag).toContain(`${w.well} (#${w.replicate})`);
	});
});
