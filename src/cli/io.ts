import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { parsePlan, PlanError, type Plan } from '../lib/core/plan';
import { UsageError } from './args';

/** Bad input from a file: the CLI prints it and exits 2. */
export class InputError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'InputError';
	}
}

/** Reads and validates a plan file; errors name the file and the JSON path. */
export function readPlanFile(file: string | undefined): Plan {
	if (!file) throw new UsageError('missing PLAN file argument');
	let text: string;
	try {
		text = readFileSync(file, 'utf8');
	} catch (err) {
		throw new InputError(`${file}: cannot read the plan file (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`);
	}
	try {
		return parsePlan(text);
	} catch (err) {
		if (err instanceof PlanError) {
			const lines = err.issues.slice(0, 20).map((i) => `  ${i.path || '(plan)'}: ${i.message}`);
			throw new InputError(`${file}: invalid plan\n${lines.join('\n')}${err.issues.length > 20 ? `\n  … and ${err.issues.length - 20} more` : ''}`);
		}
		throw err;
	}
}

/** Writes an output file; refuses to write into a missing directory with a clear message. */
export function writeOutput(file: string, content: string) {
	try {
		writeFileSync(file, content);
	} catch (err) {
		throw new InputError(`${file}: cannot write (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`);
	}
}

export { existsSync };

/** Prints the result: one JSON object with --json, otherwise the human-readable text. */
export function emit(json: boolean, value: unknown, text: () => string) {
	process.stdout.write(json ? JSON.stringify(value) + '\n' : text().replace(/\n?$/, '\n'));
}
