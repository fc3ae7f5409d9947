/**
 * `identiplate COMMAND PLAN [options]` — the command line on the same core as the notebook.
 * Exit codes: 0 success, 2 bad input (stderr names the file, field path or CSV row/column and
 * what was expected), 1 internal error.
 */
import { parseArgs, UsageError, type ParsedArgs } from './args';
import { InputError } from './io';

export interface Command {
	summary: string;
	usage: string;
	run(args: ParsedArgs): Promise<void>;
}

/** Commands are loaded on demand so each stays independent. */
const commands: Record<string, () => Promise<{ command: Command }>> = {
	check: () => import('./commands/check'),
	layout: () => import('./commands/layout'),
	pilot: () => import('./commands/pilot'),
	report: () => import('./commands/report'),
	size: () => import('./commands/size'),
	simulate: () => import('./commands/simulate')
};

function help(): string {
	return [
		'identiplate — plan perturbation screens whose hidden factors can be recovered',
		'',
		'usage: identiplate COMMAND PLAN [options]   (also: npm run plan -- COMMAND …)',
		'',
		'commands: ' + Object.keys(commands).join(', '),
		'common options: --json (one JSON object on stdout), --seed N (reproducible random results)',
		'exit codes: 0 success, 2 bad input, 1 internal error'
	].join('\n');
}

export async function main(argv: string[]): Promise<number> {
	const [name, ...rest] = argv;
	if (!name || name === '--help' || name === '-h' || name === 'help') {
		process.stdout.write(help() + '\n');
		return name ? 0 : 2;
	}
	const load = commands[name];
	if (!load) {
		process.stderr.write(`identiplate: unknown command "${name}"; expected one of ${Object.keys(commands).join(', ')}\n`);
		return 2;
	}
	try {
		const { command } = await load();
		const args = parseArgs(rest);
		if (args.flags.has('help')) {
			process.stdout.write(`${command.summary}\nusage: ${command.usage}\n`);
			return 0;
		}
		await command.run(args);
		return 0;
	} catch (err) {
		if (err instanceof UsageError) {
			process.stderr.write(`identiplate ${name}: ${err.message}\n`);
			return 2;
		}
		if (err instanceof InputError) {
			process.stderr.write(`identiplate ${name}: ${err.message}\n`);
			return 2;
		}
		process.stderr.write(`identiplate ${name}: internal error: ${(err as Error)?.stack ?? String(err)}\n`);
		return 1;
	}
}
