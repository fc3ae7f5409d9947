import { escapeXml } from './escapeXml';
import { plateSvg, type PlateSvgOptions } from './plateSvg';
import type { Layout } from './types';

export interface PlateSheetOptions extends PlateSvgOptions {
	/** Plan title shown on every sheet. */
	planTitle?: string;
}

/** Caution printed on every sheet. */
export const PLATE_SHEET_CAUTION =
	'Check every position against the CSV before dispensing. The layout balances positions under the plan’s stated assumptions; confirm plate, row and edge effects in a pilot, have the design reviewed by a statistician, and follow your local biosafety rules.';

/** Styles of the printable sheets, scoped to `.ipl-sheet`; each sheet starts a new printed page. */
export const PLATE_SHEET_STYLE = `.ipl-sheet{font-family:system-ui,-apple-system,'Segoe UI',sans-serif;color:#24221f;margin:0 0 24px;break-after:page;page-break-after:always}
.ipl-sheet:last-of-type{break-after:auto;page-break-after:auto}
.ipl-sheet h2{font-size:15pt;margin:0 0 2px}
.ipl-sheet .ipl-meta{font-size:9pt;color:#55504a;margin:0 0 8px}
.ipl-sheet svg{display:block;max-width:100%;height:auto}
.ipl-sheet table{border-collapse:collapse;width:100%;font-size:8.5pt;margin-top:8px}
.ipl-sheet th,.ipl-sheet td{border-bottom:1px solid #d9d4ca;padding:2px 6px;text-align:left;vertical-align:top}
.ipl-sheet tr{break-inside:avoid;page-break-inside:avoid}
.ipl-sheet .ipl-caution{font-size:8.5pt;color:#55504a;margin-top:8px}
@media print{.ipl-sheet svg{max-height:62vh}}`;

/**
 * One printable sheet (an HTML fragment, `<section class="ipl-sheet">`) for plate `plateIndex`:
 * heading, the plate map, a table of wells per reagent and context (and the control wells), and
 * the caution line. Style it with `PLATE_SHEET_STYLE`. All text is escaped.
 */
export function plateSheetHtml(layout: Layout, plateIndex: number, options: PlateSheetOptions = {}): string {
	const svg = plateSvg(layout, plateIndex, options);
	const plate = layout.plates.find((p) => p.index === plateIndex)!;
	const names = options.names ?? {};
	const ctxNames = options.contextNames ?? {};
	const rows = new Map<string, { reagent: string; context: string | null; wells: string[] }>();
	const controls: string[] = [];
	for (const w of plate.wells) {
		if (w.role === 'control') controls.push(w.well);
		if (w.role !== 'treatment' || !w.reagent) continue;
		const key = `${w.reagent}\u0000${w.context ?? ''}`;
		if (!rows.has(key)) rows.set(key, { reagent: w.reagent, context: w.context, wells: [] });
		rows.get(key)!.wells.push(`${w.well} (#${w.replicate})`);
	}
	const order = new Map(layout.reagents.map((id, i) => [id, i]));
	const ctxOrder = new Map(layout.contexts.map((id, i) => [id, i]));
	const sorted = [...rows.values()].sort(
		(a, b) => (order.get(a.reagent) ?? 0) - (order.get(b.reagent) ?? 0) || (ctxOrder.get(a.context ?? '') ?? -1) - (ctxOrder.get(b.context ?? '') ?? -1)
	);
	const e = escapeXml;
	const body = sorted
		.map((r) => `<tr><td>${e(names[r.reagent] ?? r.reagent)}</td><td>${e(r.context ? (ctxNames[r.context] ?? r.context) : '—')}</td><td>${e(r.wells.join(', '))}</td></tr>`)
		.join('');
	const controlRow = controls.length ? `<tr><td>negative control</td><td>—</td><td>${e(controls.join(', '))}</td></tr>` : '';
	const meta = [
		options.planTitle,
		`${layout.format}-well plate`,
		layout.excludeEdgeWells ? 'edge wells excluded' : 'edge wells in use',
		plate.context ? `context: ${ctxNames[plate.context] ?? plate.context}` : null,
		`seed ${layout.seed}`
	]
		.filter((x): x is string => !!x)
		.join(' · ');
	return (
		`<section class="ipl-sheet"><h2>${e(`Plate ${plate.index} of ${layout.plates.length}`)}</h2><p class="ipl-meta">${e(meta)}</p>${svg}` +
		`<table><thead><tr><th>Reagent</th><th>Context</th><th>Wells (replicate)</th></tr></thead><tbody>${body}${controlRow}</tbody></table>` +
		`<p class="ipl-caution">${e(PLATE_SHEET_CAUTION)}</p></section>`
	);
}

/**
 * All plates as printable sheets: a fragment with its own `<style>`, or with `document: true` a
 * complete HTML page (A4 landscape pages) that opens and prints without anything else.
 */
export function printableLayoutHtml(layout: Layout, options: PlateSheetOptions & { document?: boolean } = {}): string {
	const sheets = layout.plates.map((p) => plateSheetHtml(layout, p.index, options)).join('\n');
	const fragment = `<div class="ipl-print"><style>${PLATE_SHEET_STYLE}</style>\n${sheets}\n</div>`;
	if (!options.document) return fragment;
	const title = escapeXml(`Plate layout${options.planTitle ? ` — ${options.planTitle}` : ''}`);
	return `<!doctype html>\n<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${title}</title><style>@page{size:A4 landscape;margin:10mm}body{margin:16px}</style></head><body>\n${fragment}\n</body></html>\n`;
}
