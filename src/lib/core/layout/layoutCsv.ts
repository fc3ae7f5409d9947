import { CONTROL_LABEL } from './layoutDesign';
import type { Layout } from './types';

/** Header of the layout CSV. */
export const LAYOUT_CSV_HEADER = ['plate', 'well', 'row', 'column', 'role', 'reagent', 'context', 'replicate'] as const;

/** RFC 4180 field: quoted (with doubled quotes) when it holds a comma, quote, CR or LF. */
function field(v: string | number | null): string {
	if (v === null) return '';
	const s = String(v);
	return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * The layout as CSV (RFC 4180: CRLF line ends, a header line, fields quoted where needed), one
 * line per well of every plate including empty ones, plates numbered from 1, in plate order then
 * well order A1, A2, …
 * - `row`: the row letters; `column`: the 1-based number; `role`: treatment, control or empty.
 * - `reagent`: the reagent id for treatments, `control` for control wells, empty otherwise
 *   (the same convention as the pilot CSV's reagent column).
 * - `context`: the context id, empty for baseline and empty wells.
 * - `replicate`: 1-based within the (reagent, context) group, empty otherwise.
 */
export function layoutCsv(layout: Layout): string {
	const lines = [LAYOUT_CSV_HEADER.join(',')];
	for (const plate of layout.plates)
		for (const w of plate.wells)
			lines.push(
				[w.plate, w.well, w.row, w.column, w.role, w.role === 'control' ? CONTROL_LABEL : w.reagent, w.context, w.replicate].map(field).join(',')
			);
	return lines.join('\r\n') + '\r\n';
}
