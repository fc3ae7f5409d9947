/**
 * Bad pilot input: thrown at once by the pilot reader and analysis. `line` counts the CSV's
 * records with the header as line 1 (equal to the file line unless a quoted field spans
 * lines); `column` is the header name (or `#N` for an unnamed column) or null when the
 * problem concerns a whole row; `expected` says in plain words what was expected.
 * `message` reads `line 12: column "f3": expected a finite number, got "abc"`; the command
 * line prints the same with the file name in front (`DATA.csv:12: column "f3": …`).
 */
export class PilotError extends Error {
	readonly line: number;
	readonly column: string | null;
	readonly expected: string;
	/** What was found, already quoted for display (empty when not applicable). */
	readonly got: string;

	constructor(line: number, column: string | null, expected: string, got = '') {
		super(`line ${line}: ${formatPilotProblem(column, expected, got)}`);
		this.name = 'PilotError';
		this.line = line;
		this.column = column;
		this.expected = expected;
		this.got = got;
	}

	/** The message without the `line N: ` prefix (for `FILE:LINE: …`). */
	get detail(): string {
		return formatPilotProblem(this.column, this.expected, this.got);
	}
}

function formatPilotProblem(column: string | null, expected: string, got: string): string {
	return `${column === null ? '' : `column ${JSON.stringify(column)}: `}expected ${expected}${got ? `, got ${got}` : ''}`;
}

/** Shows a CSV cell value in an error message: quoted, shortened, empty called out. */
export function showCell(value: string): string {
	if (value.trim() === '') return 'an empty value';
	return JSON.stringify(value.length > 40 ? value.slice(0, 37) + '…' : value);
}
