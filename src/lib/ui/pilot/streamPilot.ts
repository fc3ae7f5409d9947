/**
 * Streams a pilot CSV through papaparse into the core's incremental pilot reader, chunk by
 * chunk, so a file of any size needs memory for one chunk and the pilot's wells — never the
 * whole text. Runs in the pilot worker (a `Blob`/`File` is read with papaparse's file streamer
 * there) and in Node tests (a string is cut into chunks the same way). No DOM access.
 */
import Papa from 'papaparse';
import { createPilotReader } from '$core/pilot/createPilotReader';
import type { Plan } from '$core/plan/types';
import type { PilotReaderOptions, PilotTable } from '$core/pilot/types';

/** Characters handed to the parser at a time (1 MiB: smooth progress, bounded memory). */
export const PILOT_CHUNK_SIZE = 1 << 20;

export interface StreamProgress {
	/** Characters read so far (≈ bytes for ASCII files). */
	read: number;
	/** Size of the input: bytes of a Blob, characters of a string. */
	total: number;
	/** Lines read so far, header included. */
	lines: number;
}

export interface StreamPilotOptions extends PilotReaderOptions {
	/** Characters per chunk (default `PILOT_CHUNK_SIZE`). */
	chunkSize?: number;
}

/**
 * Reads `input` (a Blob/File or the CSV text) and returns the pilot table. Rejects with the
 * reader's `PilotError` (line and column of the first bad value) as soon as it is met — the
 * rest of the file is not read — or with an Error when the file cannot be read.
 */
export function streamPilot(plan: Plan, input: Blob | string, options: StreamPilotOptions = {}, onProgress?: (p: StreamProgress) => void): Promise<PilotTable> {
	const { chunkSize = PILOT_CHUNK_SIZE, ...readerOptions } = options;
	if (!(Number.isInteger(chunkSize) && chunkSize >= 1)) throw new RangeError(`chunkSize must be an integer ≥ 1, got ${chunkSize}`);
	if (typeof input !== 'string' && !(typeof Blob !== 'undefined' && input instanceof Blob)) throw new TypeError('input must be a Blob (or File) or a string');
	const reader = createPilotReader(plan, readerOptions);
	const total = typeof input === 'string' ? input.length : input.size;
	return new Promise<PilotTable>((resolve, reject) => {
		let failure: unknown = null;
		let settled = false;
		const fail = (err: unknown) => {
			if (settled) return;
			settled = true;
			reject(err);
		};
		// papaparse streams a Blob like a File (its types only name File).
		const config: Papa.ParseLocalConfig<string[], File> & Papa.ParseConfig<string[]> = {
			delimiter: ',',
			header: false,
			skipEmptyLines: false,
			worker: false,
			chunkSize,
			chunk(results, parser) {
				if (failure) return;
				try {
					reader.push(results.data);
					onProgress?.({ read: Math.min(total, results.meta.cursor), total, lines: reader.lines });
				} catch (err) {
					failure = err;
					parser.abort();
				}
			},
			complete() {
				if (failure) return fail(failure);
				try {
					const table = reader.finish();
					onProgress?.({ read: total, total, lines: reader.lines });
					settled = true;
					resolve(table);
				} catch (err) {
					fail(err);
				}
			},
			error(err: Error) {
				fail(new Error(`the file could not be read: ${err.message}`));
			}
		};
		if (typeof input === 'string') Papa.parse(input, config as unknown as Papa.ParseConfig<string[]>);
		else Papa.parse(input as File, config);
	});
}
