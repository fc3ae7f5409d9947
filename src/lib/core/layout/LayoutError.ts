/**
 * A design that cannot be laid out as asked (stock, capacity, unknown ids). The message says
 * what to change; `field` names the plan or design field concerned. The command line turns it
 * into exit code 2.
 */
export class LayoutError extends Error {
	readonly field: string;
	constructor(field: string, message: string) {
		super(`${field}: ${message}`);
		this.name = 'LayoutError';
		this.field = field;
	}
}
