import { seedRule } from '../lib/core/plan/constraints';
/** Minimal argument parsing for the `identiplate` command line. */

export class UsageError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'UsageError';
	}
}

export interface ParsedArgs {
	positional: string[];
	flags: Map<string, string | true>;
}

/** Flags that take a value; every other `--flag` is boolean. */
const VALUE_FLAGS = new Set(['seed', 'reps', 'csv', 'out', 'threads', 'svg', 'estimator', 'pilot', 'kind', 'zprime-feature', 'scaling']);

export function parseArgs(argv: string[]): ParsedArgs {
	const positional: string[] = [];
	const flags = new Map<string, string | true>();
	for (let i = 0; i < argv.length; i++) {
		const a = argv[i];
		if (a.startsWith('--')) {
			const eq = a.indexOf('=');
			const name = eq > 0 ? a.slice(2, eq) : a.slice(2);
			if (eq > 0) flags.set(name, a.slice(eq + 1));
			else if (VALUE_FLAGS.has(name)) {
				const v = argv[i + 1];
				if (v === undefined || v.startsWith('--')) throw new UsageError(`--${name} needs a value`);
				flags.set(name, v);
				i++;
			} else flags.set(name, true);
		} else positional.push(a);
	}
	return { positional, flags };
}

/** Integer flag with bounds; absent → `fallback`. */
export function intFlag(args: ParsedArgs, name: string, fallback: number, min = 0, max = Number.MAX_SAFE_INTEGER): number {
	const v = args.flags.get(name);
	if (v === undefined) return fallback;
	const n = typeof v === 'string' && /^-?\d+$/.test(v) ? Number(v) : NaN;
	if (!Number.isSafeInteger(n) || n < min || n > max) throw new UsageError(`--${name} must be an integer in [${min}, ${max}], got ${v === true ? 'nothing' : JSON.stringify(v)}`);
	return n;
}

/** `--seed N` within the shared seed range of the constraint table; absent → `fallback`. */
export function seedFlag(args: ParsedArgs, fallback = 1): number {
	return intFlag(args, 'seed', fallback, seedRule.min, seedRule.max);
}

export function stringFlag(args: ParsedArgs, name: string): string | undefined {
	const v = args.flags.get(name);
	if (v === true) throw new UsageError(`--${name} needs a value`);
	return v;
}

export function assertKnownFlags(args: ParsedArgs, allowed: string[]) {
	for (const k of args.flags.keys()) if (!allowed.includes(k)) throw new UsageError(`unknown option --${k}; expected one of ${allowed.map((a) => '--' + a).join(', ')}`);
}
