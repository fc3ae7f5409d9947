import { PLATE_GEOMETRY } from '../size/costModel';
import type { PlateFormat } from '../plan/types';

/** Row label of a 1-based row index: A…Z, then AA…AF for the 32 rows of a 1536-well plate. */
export function rowLabel(row: number): string {
	return row <= 26 ? String.fromCharCode(64 + row) : 'A' + String.fromCharCode(64 + row - 26);
}

/** Last well name of a format, e.g. "P24" for 384 wells. */
export function lastWellName(format: PlateFormat): string {
	const { rows, columns } = PLATE_GEOMETRY[format];
	return `${rowLabel(rows)}${columns}`;
}

/**
 * Canonical ANSI/SLAS 4-2004 well name ("b03" → "B3") when `text` names a well of `format`,
 * else null. Rows A…Z then AA…AF; columns 1-based, leading zeros allowed.
 */
export function parseWellName(text: string, format: PlateFormat): string | null {
	const m = /^\s*([A-Za-z]{1,2})0*(\d{1,2})\s*$/.exec(text);
	if (!m) return null;
	const letters = m[1].toUpperCase();
	let row: number;
	if (letters.length === 1) row = letters.charCodeAt(0) - 64;
	else if (letters[0] === 'A') row = 26 + letters.charCodeAt(1) - 64;
	else return null;
	const column = Number(m[2]);
	const { rows, columns } = PLATE_GEOMETRY[format];
	if (row < 1 || row > rows || column < 1 || column > columns) return null;
	return `${rowLabel(row)}${column}`;
}
