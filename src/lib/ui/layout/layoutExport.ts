/**
 * Files the Layout section offers for download, made in the engine worker (task
 * `layoutExport`): the layout CSV of one plate or of all plates, the SVG plate map of one plate
 * or of all plates stacked in one drawing, and the printable sheets (one page per plate).
 * Pure: no DOM, so the worker and the unit tests call it directly.
 */
import { layoutCsv } from '$core/layout/layoutCsv';
import { plateSvg, type PlateSvgOptions } from '$core/layout/plateSvg';
import { printableLayoutHtml } from '$core/layout/plateSheets';
import { reagentGroupsFromPlan } from '$core/layout/reagentGroups';
import type { Layout } from '$core/layout/types';
import type { Plan } from '$core/plan/types';
import { slug } from '../format';

export type LayoutExportKind = 'csv-plate' | 'csv-all' | 'svg-plate' | 'svg-all' | 'sheets';

export interface LayoutExportRequest {
	/** The plan the layout belongs to (names, groups and title for labels). */
	plan: Plan;
	layout: Layout;
	kind: LayoutExportKind;
	/** 1-based plate number; required for the `-plate` kinds. */
	plate?: number;
}

export interface LayoutFile {
	fileName: string;
	/** MIME type of the download. */
	mime: string;
	text: string;
}

/** Blank space between stacked plate maps, in SVG pixels. */
const STACK_GAP = 16;

/** Display options of the plate maps: reagent and context names, legend groups, plan title. */
export function plateMapOptions(plan: Plan): PlateSvgOptions & { planTitle: string } {
	return {
		names: Object.fromEntries(plan.reagents.map((r) => [r.id, r.name])),
		contextNames: Object.fromEntries(plan.contexts.map((c) => [c.id, c.name])),
		groups: reagentGroupsFromPlan(plan),
		planTitle: plan.title
	};
}

/**
 * Stacks self-contained SVG documents (as `plateSvg` writes them: a root `<svg>` with integer
 * `width` and `height`) top to bottom in one SVG, each kept as a nested `<svg>` at its offset,
 * `gap` pixels apart. The result is as wide as the widest part.
 */
export function stackSvgs(parts: readonly string[], gap = STACK_GAP): string {
	if (parts.length === 0) throw new RangeError('stackSvgs: parts must hold at least one SVG');
	let y = 0;
	let width = 0;
	const nested = parts.map((svg, i) => {
		const head = /^<svg\b[^>]*?\swidth="(\d+(?:\.\d+)?)"\s+height="(\d+(?:\.\d+)?)"/.exec(svg);
		if (!head) throw new RangeError(`stackSvgs: parts[${i}] is not an SVG with width and height on its root element`);
		const w = Number(head[1]);
		const h = Number(head[2]);
		const placed = svg.replace(/^<svg\b/, `<svg x="0" y="${y}"`);
		y += h + (i < parts.length - 1 ? gap : 0);
		width = Math.max(width, w);
		return placed;
	});
	return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${y}" viewBox="0 0 ${width} ${y}"><rect width="100%" height="100%" fill="#ffffff"/>${nested.join('')}</svg>`;
}

function checkPlate(layout: Layout, plate: number | undefined): number {
	if (!Number.isInteger(plate) || !layout.plates.some((p) => p.index === plate))
		throw new RangeError(`plate must be one of 1…${layout.plates.length}, got ${plate}`);
	return plate!;
}

/** One downloadable file of a layout. Throws RangeError for an unknown kind or plate number. */
export function layoutExport(request: LayoutExportRequest): LayoutFile {
	const { plan, layout, kind } = request;
	const base = `${slug(plan.title)}-layout-seed${layout.seed}`;
	const digits = String(layout.plates.length).length;
	const plateTag = (n: number) => `plate${String(n).padStart(digits, '0')}`;
	const options = plateMapOptions(plan);
	switch (kind) {
		case 'csv-all':
			return { fileName: `${base}.csv`, mime: 'text/csv', text: layoutCsv(layout) };
		case 'csv-plate': {
			const n = checkPlate(layout, request.plate);
			return { fileName: `${base}-${plateTag(n)}.csv`, mime: 'text/csv', text: layoutCsv({ ...layout, plates: layout.plates.filter((p) => p.index === n) }) };
		}
		case 'svg-plate': {
			const n = checkPlate(layout, request.plate);
			return { fileName: `${base}-${plateTag(n)}.svg`, mime: 'image/svg+xml', text: plateSvg(layout, n, options) };
		}
		case 'svg-all':
			return { fileName: `${base}-all-plates.svg`, mime: 'image/svg+xml', text: stackSvgs(layout.plates.map((p) => plateSvg(layout, p.index, options))) };
		case 'sheets':
			return { fileName: `${base}-sheets.html`, mime: 'text/html', text: printableLayoutHtml(layout, { ...options, document: true }) };
		default:
			throw new RangeError(`kind must be csv-plate, csv-all, svg-plate, svg-all or sheets, got ${JSON.stringify(kind)}`);
	}
}
