import type { PlateFormat } from '../plan/types';
import { PLATE_FORMATS } from '../plan/types';
import { PLATE_GEOMETRY } from '../size/costModel';
import { rowLabel } from './wellName';

/**
 * Plate geometry per ANSI/SLAS 1-2004 (footprint 127.76 mm × 85.48 mm) and ANSI/SLAS 4-2004
 * (well positions). All lengths in millimetres, measured from the left and top outside edges of
 * the footprint with the plate in landscape orientation, A1 at the top left.
 */
export interface PlateGeometry {
	format: PlateFormat;
	rows: number;
	columns: number;
	/** Centre-to-centre distance of neighbouring wells (mm). */
	pitch: number;
	/** Centre of A1 from the left edge (mm). */
	a1x: number;
	/** Centre of A1 from the top edge (mm). */
	a1y: number;
	/** Footprint width and height (mm). */
	width: number;
	height: number;
	/** Row labels A… in order. */
	rowLabels: string[];
}

/** Footprint of ANSI/SLAS 1-2004 (mm). */
export const FOOTPRINT = { width: 127.76, height: 85.48 } as const;

/** Pitch and A1 offsets of ANSI/SLAS 4-2004 (mm). */
const WELL_POSITIONS: Record<PlateFormat, { pitch: number; a1x: number; a1y: number }> = {
	96: { pitch: 9, a1x: 14.38, a1y: 11.24 },
	384: { pitch: 4.5, a1x: 12.13, a1y: 8.99 },
	1536: { pitch: 2.25, a1x: 11.005, a1y: 7.865 }
};

function checkFormat(format: unknown): asserts format is PlateFormat {
	if (!PLATE_FORMATS.includes(format as PlateFormat)) throw new RangeError(`plate format must be one of ${PLATE_FORMATS.join(', ')}, got ${JSON.stringify(format)}`);
}

export function plateGeometry(format: PlateFormat): PlateGeometry {
	checkFormat(format);
	const { rows, columns } = PLATE_GEOMETRY[format];
	const pos = WELL_POSITIONS[format];
	return {
		format,
		rows,
		columns,
		pitch: pos.pitch,
		a1x: pos.a1x,
		a1y: pos.a1y,
		width: FOOTPRINT.width,
		height: FOOTPRINT.height,
		rowLabels: Array.from({ length: rows }, (_, r) => rowLabel(r))
	};
}

/** Centre of well (row0, col0) in mm: x = a1x + col0·pitch, y = a1y + row0·pitch. */
export function wellCentre(format: PlateFormat, row0: number, col0: number): { x: number; y: number } {
	checkFormat(format);
	const { rows, columns } = PLATE_GEOMETRY[format];
	if (!Number.isInteger(row0) || row0 < 0 || row0 >= rows) throw new RangeError(`row0 must be an integer in [0, ${rows - 1}] for a ${format}-well plate, got ${row0}`);
	if (!Number.isInteger(col0) || col0 < 0 || col0 >= columns) throw new RangeError(`col0 must be an integer in [0, ${columns - 1}] for a ${format}-well plate, got ${col0}`);
	const { pitch, a1x, a1y } = WELL_POSITIONS[format];
	// Rounded to 1e-9 mm so that sums such as 11.005 + 47·2.25 print without binary noise.
	return { x: Math.round((a1x + col0 * pitch) * 1e9) / 1e9, y: Math.round((a1y + row0 * pitch) * 1e9) / 1e9 };
}

/**
 * Ring index of a well counted from the outside: 0 for the outer ring (first/last row or
 * column), 1 for the ring inside it, and so on. This is the "distance to the edge" used in
 * layout diagnostics.
 */
export function edgeDistance(format: PlateFormat, row0: number, col0: number): number {
	checkFormat(format);
	const { rows, columns } = PLATE_GEOMETRY[format];
	return Math.min(row0, col0, rows - 1 - row0, columns - 1 - col0);
}
