import Papa from 'papaparse';
import type { Plan } from '../plan/types';
import { createPilotReader } from './createPilotReader';
import type { PilotReaderOptions, PilotTable } from './types';

/**
 * Parses a whole pilot CSV held in memory (comma-separated, optional quotes) and returns its
 * table; throws PilotError like the reader. For large files feed `createPilotReader` in chunks.
 */
export function parsePilotCsvText(plan: Plan, text: string, options: PilotReaderOptions = {}): PilotTable {
	if (typeof text !== 'string') throw new TypeError('parsePilotCsvText: text must be a string');
	const reader = createPilotReader(plan, options);
	const parsed = Papa.parse<string[]>(text, { delimiter: ',', header: false, skipEmptyLines: false });
	reader.push(parsed.data, 1);
	return reader.finish();
}
