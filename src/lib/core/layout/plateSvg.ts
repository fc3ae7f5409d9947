import { PLATE_GEOMETRY } from '../size/costModel';
import { escapeXml } from './escapeXml';
import { plateGeometry, wellCentre } from './plateGeometry';
import { reagentColours } from './reagentColours';
import type { Layout, LayoutPlate } from './types';

/** Options of `plateSvg`. Every text passes through XML escaping. */
export interface PlateSvgOptions {
	/** Display names of reagents (id → name); the id is shown when absent. */
	names?: Record<string, string>;
	/** Legend group of each reagent (id → label, e.g. from `reagentGroupsFromPlan`); groups share a hue. */
	groups?: Record<string, string>;
	/** Display names of contexts (id → name). */
	contextNames?: Record<string, string>;
	/** Pixels per millimetre of the plate drawing (default 6; 127.76 mm → 767 px). */
	scale?: number;
	/** Heading above the plate (default "Plate N of M" plus the plate's context). */
	title?: string;
}

/** Fixed colours of the plate-map look (our own palette). */
export const PLATE_MAP_COLOURS = {
	body: '#f7f5f0',
	rim: '#7d776c',
	label: '#55504a',
	control: '#20283b',
	controlMark: '#f7f5f0',
	emptyRing: '#b3ada2',
	excludedFill: '#e6e2da',
	excludedMark: '#a29c90',
	text: '#24221f'
} as const;

const r2 = (x: number) => Math.round(x * 100) / 100;

function plateOf(layout: Layout, plateIndex: number): LayoutPlate {
	const plate = layout.plates.find((p) => p.index === plateIndex);
	if (!plate) throw new RangeError(`plateIndex must be one of 1…${layout.plates.length}, got ${plateIndex}`);
	return plate;
}

function truncate(s: string, n: number): string {
	return s.length > n ? s.slice(0, n - 1) + '…' : s;
}

/**
 * A self-contained SVG plate map of one plate (1-based `plateIndex`): wells drawn at their
 * ANSI/SLAS 4-2004 positions on the 127.76 × 85.48 mm footprint, treatments filled with their
 * reagent colour (reagents of one legend group share a hue), controls as dark diamonds, unused
 * wells as dashed rings, excluded edge wells struck through; when a plate carries several
 * contexts each treatment well shows its context number. A legend below lists the well kinds,
 * the contexts and the reagents on the plate with their well counts. Each well element carries
 * `data-well` (and `data-reagent` for treatments) and a `<title>` tooltip. No external resources.
 */
export function plateSvg(layout: Layout, plateIndex: number, options: PlateSvgOptions = {}): string {
	const plate = plateOf(layout, plateIndex);
	const s = options.scale ?? 6;
	if (!(Number.isFinite(s) && s > 0)) throw new RangeError(`options.scale must be a number > 0, got ${options.scale}`);
	const geo = plateGeometry(layout.format);
	const { rows, columns } = PLATE_GEOMETRY[layout.format];
	const C = PLATE_MAP_COLOURS;
	const names = options.names ?? {};
	const ctxNames = options.contextNames ?? {};
	const colours = reagentColours(layout.reagents, options.groups);
	const pad = 10;
	const titleH = 24;
	const plateW = geo.width * s;
	const plateH = geo.height * s;
	const width = Math.max(plateW + 2 * pad, 560);
	const ox = pad;
	const oy = pad + titleH;
	const rWell = 0.4 * geo.pitch * s;
	const labelSize = Math.min(geo.pitch * 0.55, 3.2) * s;

	// Which contexts and reagents are on this plate, in design order.
	const ctxOnPlate = layout.contexts.filter((c) => plate.wells.some((w) => w.role === 'treatment' && w.context === c));
	const ctxNumber = new Map(ctxOnPlate.map((c, i) => [c, i + 1]));
	const showCtx = ctxOnPlate.length > 1;
	const reagentCount = new Map<string, number>();
	let controls = 0;
	let treatments = 0;
	for (const w of plate.wells) {
		if (w.role === 'control') controls++;
		if (w.role === 'treatment' && w.reagent) {
			treatments++;
			reagentCount.set(w.reagent, (reagentCount.get(w.reagent) ?? 0) + 1);
		}
	}

	const out: string[] = [];
	const ctxLabel = plate.context ? ` · context ${ctxNames[plate.context] ?? plate.context}` : '';
	const title = options.title ?? `Plate ${plate.index} of ${layout.plates.length}${ctxLabel} · ${treatments} treatment and ${controls} control wells`;
	out.push(`<text x="${pad}" y="${pad + 15}" font-size="15" font-weight="600" fill="${C.text}">${escapeXml(title)}</text>`);
	out.push(
		`<rect x="${r2(ox)}" y="${r2(oy)}" width="${r2(plateW)}" height="${r2(plateH)}" rx="${r2(2.5 * s)}" fill="${C.body}" stroke="${C.rim}" stroke-width="1.5"/>`
	);
	// Row and column labels sit in the plate's margin, halfway between the rim and the first well.
	for (let r = 0; r < rows; r++) {
		const y = oy + wellCentre(layout.format, r, 0).y * s;
		out.push(`<text x="${r2(ox + ((geo.a1x - geo.pitch * 0.5) / 2) * s)}" y="${r2(y)}" font-size="${r2(labelSize)}" fill="${C.label}" text-anchor="middle" dominant-baseline="central">${geo.rowLabels[r]}</text>`);
	}
	for (let c = 0; c < columns; c++) {
		const x = ox + wellCentre(layout.format, 0, c).x * s;
		out.push(`<text x="${r2(x)}" y="${r2(oy + ((geo.a1y - geo.pitch * 0.5) / 2) * s)}" font-size="${r2(labelSize)}" fill="${C.label}" text-anchor="middle" dominant-baseline="central">${c + 1}</text>`);
	}
	const off = layout.excludeEdgeWells ? 1 : 0;
	for (const w of plate.wells) {
		const r = geo.rowLabels.indexOf(w.row);
		const c = w.column - 1;
		const { x, y } = wellCentre(layout.format, r, c);
		const cx = r2(ox + x * s);
		const cy = r2(oy + y * s);
		const excluded = off === 1 && (r === 0 || c === 0 || r === rows - 1 || c === columns - 1);
		const name = escapeXml(w.well);
		if (w.role === 'treatment' && w.reagent) {
			const col = colours.get(w.reagent) ?? { fill: '#888888', stroke: '#555555', ink: '#ffffff' };
			const ctx = w.context ? ` · ${ctxNames[w.context] ?? w.context}` : '';
			const tip = `${w.well} · ${names[w.reagent] ?? w.reagent}${ctx} · replicate ${w.replicate}`;
			out.push(
				`<circle cx="${cx}" cy="${cy}" r="${r2(rWell)}" fill="${col.fill}" stroke="${col.stroke}" stroke-width="1" data-well="${name}" data-reagent="${escapeXml(w.reagent)}"><title>${escapeXml(tip)}</title></circle>`
			);
			if (showCtx && w.context)
				out.push(`<text x="${cx}" y="${cy}" font-size="${r2(rWell * 1.05)}" fill="${col.ink}" text-anchor="middle" dominant-baseline="central" pointer-events="none">${ctxNumber.get(w.context)}</text>`);
		} else if (w.role === 'control') {
			const h = r2(rWell * 1.25);
			const ctx = w.context ? ` · ${ctxNames[w.context] ?? w.context}` : '';
			out.push(
				`<rect x="${r2(cx - h / 2)}" y="${r2(cy - h / 2)}" width="${h}" height="${h}" transform="rotate(45 ${cx} ${cy})" fill="${C.control}" data-well="${name}"><title>${escapeXml(`${w.well} · negative control${ctx}`)}</title></rect>`
			);
		} else if (excluded) {
			const d = r2(rWell * 0.7);
			out.push(
				`<g data-well="${name}"><title>${escapeXml(`${w.well} · excluded edge well`)}</title><circle cx="${cx}" cy="${cy}" r="${r2(rWell)}" fill="${C.excludedFill}"/><line x1="${r2(cx - d)}" y1="${r2(cy + d)}" x2="${r2(cx + d)}" y2="${r2(cy - d)}" stroke="${C.excludedMark}" stroke-width="1"/></g>`
			);
		} else {
			out.push(
				`<circle cx="${cx}" cy="${cy}" r="${r2(rWell * 0.85)}" fill="none" stroke="${C.emptyRing}" stroke-width="1" stroke-dasharray="2 2" data-well="${name}"><title>${escapeXml(`${w.well} · unused`)}</title></circle>`
			);
		}
	}

	// Legend: fixed kinds, contexts (numbered), reagents grouped; flowed down columns.
	type Item = { kind: 'control' | 'empty' | 'excluded' | 'heading' | 'context' | 'reagent'; text: string; id?: string };
	const items: Item[] = [
		{ kind: 'control', text: `negative control (${controls})` },
		{ kind: 'empty', text: 'unused well' }
	];
	if (layout.excludeEdgeWells) items.push({ kind: 'excluded', text: 'excluded edge well' });
	if (showCtx) {
		items.push({ kind: 'heading', text: 'Contexts (number in well)' });
		for (const c of ctxOnPlate) items.push({ kind: 'context', text: `${ctxNumber.get(c)} = ${ctxNames[c] ?? c}` });
	}
	const groups = options.groups ?? {};
	const onPlate = layout.reagents.filter((id) => reagentCount.has(id));
	const headings: string[] = [];
	const byGroup = new Map<string, string[]>();
	for (const id of onPlate) {
		const g = groups[id] ?? '';
		if (!byGroup.has(g)) {
			byGroup.set(g, []);
			headings.push(g);
		}
		byGroup.get(g)!.push(id);
	}
	if (onPlate.length > 0 && headings.every((h) => h === '')) items.push({ kind: 'heading', text: 'Reagents (wells on this plate)' });
	for (const h of headings) {
		if (h !== '') items.push({ kind: 'heading', text: h });
		for (const id of byGroup.get(h)!) items.push({ kind: 'reagent', id, text: `${names[id] ?? id} (${reagentCount.get(id)})` });
	}
	const colW = 210;
	const itemH = 17;
	const nCols = Math.max(1, Math.floor((width - 2 * pad) / colW));
	// Flow down columns; a heading never ends a column (it moves to the top of the next one).
	let perCol = Math.max(1, Math.ceil(items.length / nCols));
	let slots: number[] = [];
	for (;;) {
		slots = [];
		let at = 0;
		for (const it of items) {
			if (it.kind === 'heading' && at % perCol === perCol - 1 && perCol > 1) at++;
			slots.push(at++);
		}
		if (at <= perCol * nCols) break;
		perCol++;
	}
	const ly = oy + plateH + 16;
	items.forEach((it, i) => {
		const x = pad + Math.floor(slots[i] / perCol) * colW;
		const y = ly + (slots[i] % perCol) * itemH;
		const tx = x + 16;
		const shown = it.kind === 'reagent' ? `${truncate(names[it.id!] ?? it.id!, 26)} (${reagentCount.get(it.id!)})` : truncate(it.text, 32);
		const text = escapeXml(shown);
		switch (it.kind) {
			case 'heading':
				out.push(`<text x="${x}" y="${y + 12}" font-size="11.5" font-weight="600" fill="${C.text}">${escapeXml(truncate(it.text, 32))}${it.text.length > 32 ? `<title>${escapeXml(it.text)}</title>` : ''}</text>`);
				return;
			case 'control':
				out.push(`<rect x="${x + 2.5}" y="${y + 3.5}" width="7" height="7" transform="rotate(45 ${x + 6} ${y + 7})" fill="${C.control}"/>`);
				break;
			case 'empty':
				out.push(`<circle cx="${x + 6}" cy="${y + 7}" r="5" fill="none" stroke="${C.emptyRing}" stroke-dasharray="2 2"/>`);
				break;
			case 'excluded':
				out.push(`<circle cx="${x + 6}" cy="${y + 7}" r="5.5" fill="${C.excludedFill}"/><line x1="${x + 2}" y1="${y + 11}" x2="${x + 10}" y2="${y + 3}" stroke="${C.excludedMark}"/>`);
				break;
			case 'context':
				break;
			case 'reagent': {
				const col = colours.get(it.id!)!;
				out.push(`<circle cx="${x + 6}" cy="${y + 7}" r="5.5" fill="${col.fill}" stroke="${col.stroke}"/>`);
				break;
			}
		}
		out.push(`<text x="${tx}" y="${y + 11}" font-size="11" fill="${C.text}">${text}${shown !== it.text ? `<title>${escapeXml(it.text)}</title>` : ''}</text>`);
	});
	const height = Math.ceil(ly + perCol * itemH + pad);
	const label = escapeXml(`Plate map ${plate.index}, ${layout.format}-well plate`);
	return (
		`<svg xmlns="http://www.w3.org/2000/svg" width="${Math.ceil(width)}" height="${height}" viewBox="0 0 ${Math.ceil(width)} ${height}" role="img" aria-label="${label}" font-family="system-ui, -apple-system, 'Segoe UI', sans-serif">` +
		`<rect width="100%" height="100%" fill="#ffffff"/>` +
		out.join('') +
		`</svg>`
	);
}
