import { createReadStream, existsSync } from 'node:fs';
import Papa from 'papaparse';
import type { Command } from '../main';
import { assertKnownFlags, stringFlag, UsageError, seedFlag } from '../args';
import { emit, InputError, readPlanFile, writeOutput } from '../io';
import { analysePilot, applyPilot, createPilotReader, PilotError, type PilotEstimates, type PilotReader, type PilotTable } from '../../lib/core/pilot';
import { serializePlan, type Plan } from '../../lib/core/plan';

/** Rows handed to the reader at a time while streaming. */
const BATCH = 2000;

/**
 * `identiplate pilot PLAN DATA.csv [--out NEWPLAN] [--force] [--json] [--seed N] [--kind=wells|cells]
 * [--zprime-feature=NAME] [--scaling=pooled|plate]`: streams the pilot CSV (one well profile or
 * one cell per row), estimates noise, plate effect, effect sizes, signal dimension and Z′ in the
 * plan's units, prints them, and with --out writes the re-planned plan (never over an existing
 * file unless --force). Bad CSV input exits 2 with `DATA.csv:LINE: column "x": expected …`.
 */
export const command: Command = {
	summary: 'What changed after the pilot? Estimates noise, plate effect, effects, signal dimension and Z′ from a pilot CSV; --out writes the re-planned plan.',
	usage: 'identiplate pilot PLAN DATA.csv [--out NEWPLAN] [--force] [--json] [--seed N] [--kind=auto|wells|cells] [--zprime-feature=NAME] [--scaling=pooled|plate]',
	async run(args) {
		assertKnownFlags(args, ['json', 'out', 'force', 'seed', 'kind', 'zprime-feature', 'scaling']);
		if (args.positional.length !== 2) throw new UsageError(`expected PLAN and DATA.csv, got ${args.positional.length} argument${args.positional.length === 1 ? '' : 's'}`);
		const [planFile, dataFile] = args.positional;
		const seed = seedFlag(args);
		const kind = choiceFlag(args.flags.get('kind'), 'kind', ['auto', 'wells', 'cells'] as const, 'auto');
		const scaling = choiceFlag(args.flags.get('scaling'), 'scaling', ['pooled', 'plate'] as const, 'pooled');
		const zPrimeFeature = args.flags.has('zprime-feature') ? stringFlag(args, 'zprime-feature') : undefined;
		const outFile = stringFlag(args, 'out');
		if (args.flags.has('force') && args.flags.get('force') !== true) throw new UsageError('--force takes no value');
		if (outFile && existsSync(outFile) && !args.flags.has('force')) throw new UsageError(`${outFile} exists; refusing to overwrite it (add --force to replace it)`);
		const plan = readPlanFile(planFile);

		let table: PilotTable;
		let estimates: PilotEstimates;
		try {
			table = await readPilotCsv(plan, dataFile, kind);
			estimates = analysePilot(plan, table, { seed, zPrimeFeature, scaling });
		} catch (err) {
			if (err instanceof PilotError) throw new InputError(`${dataFile}:${err.line}: ${err.detail}`);
			throw err;
		}
		const next = outFile ? applyPilot(plan, estimates) : null;
		if (outFile && next) writeOutput(outFile, serializePlan(next));
		emit(args.flags.has('json'), summaryJson(estimates, outFile ?? null), () => summaryText(plan, estimates, outFile ?? null));
	}
};

function choiceFlag<T extends string>(value: string | true | undefined, name: string, choices: readonly T[], fallback: T): T {
	if (value === undefined) return fallback;
	if (value === true) throw new UsageError(`--${name} needs a value: write --${name}=${choices.join('|')}`);
	if (!(choices as readonly string[]).includes(value)) throw new UsageError(`--${name} must be one of ${choices.join(', ')}, got ${JSON.stringify(value)}`);
	return value as T;
}

/** Streams the CSV through papaparse into the pilot reader; the file is never read whole. */
export async function readPilotCsv(plan: Plan, file: string, kind: 'auto' | 'wells' | 'cells'): Promise<PilotTable> {
	const reader: PilotReader = createPilotReader(plan, { kind });
	const input = createReadStream(file);
	const opened = new Promise<void>((resolve, reject) => {
		input.once('open', () => resolve());
		input.once('error', reject);
	});
	try {
		await opened;
	} catch (err) {
		throw new InputError(`${file}: cannot read the pilot CSV (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`);
	}
	const parser = Papa.parse(Papa.NODE_STREAM_INPUT, { delimiter: ',', header: false, skipEmptyLines: false });
	input.pipe(parser);
	let batch: string[][] = [];
	let first = 1;
	try {
		for await (const row of parser as AsyncIterable<string[]>) {
			batch.push(row);
			if (batch.length >= BATCH) {
				reader.push(batch, first);
				first += batch.length;
				batch = [];
			}
		}
		if (batch.length) reader.push(batch, first);
	} catch (err) {
		input.destroy();
		parser.destroy();
		if (err instanceof PilotError) throw err;
		throw new InputError(`${file}: cannot read the pilot CSV (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`);
	}
	return reader.finish();
}

const round = (v: number | null, digits = 4) => (v === null ? null : Number(v.toPrecision(digits)));

function summaryJson(e: PilotEstimates, out: string | null) {
	return {
		wells: e.wells,
		replicateNoise: round(e.replicateNoise),
		plateEffect: round(e.plateEffect),
		signalDimension: e.signalDimension,
		zPrime: round(e.zPrime),
		reagents: e.reagents.map((r) => ({ id: r.id, effect: round(r.effect), stated: round(r.stated), distance: round(r.distance), reproducibility: round(r.reproducibility), wells: r.wells })),
		measurementNoise: round(e.measurementNoise),
		units: {
			replicateNoise: 'factor SD units',
			effect: 'factor SD units (norm of the effect vector)',
			measurementNoise: 'plan feature units',
			plateEffect: 'plan feature units',
			distance: 'replicate-noise SD units (Mahalanobis)',
			conversion: e.scale.rule
		},
		kind: e.kind,
		rows: e.rows,
		plates: e.plates.length,
		features: e.features,
		noiseDimension: e.noiseDimension,
		signal: { rule: e.signal.rule, singularValues: e.signal.singularValues.map((v) => round(v)), edge: round(e.signal.edge), threshold: round(e.signal.threshold), dimensionByEdge: e.signal.dimensionByEdge },
		zPrimeMethod: e.zPrimeMethod,
		notes: e.notes,
		warnings: e.warnings,
		out
	};
}

function summaryText(plan: Plan, e: PilotEstimates, out: string | null): string {
	const f = (v: number | null, digits = 3) => (v === null ? 'not estimable' : v.toPrecision(digits));
	const o = plan.observation;
	const lines = [
		`pilot: ${e.wells} wells${e.kind === 'cells' ? ` from ${e.rows} cells` : ''} on ${e.plates.length} plate${e.plates.length === 1 ? '' : 's'}, ${e.features.kept} of ${e.features.total} features kept`,
		`replicate noise   ${f(e.replicateNoise)}  (plan ${o.replicateNoise}; factor SD units)`,
		`measurement noise ${f(e.measurementNoise)}  (plan ${o.measurementNoise}; plan feature units)`,
		`plate effect      ${f(e.plateEffect)}  (plan ${o.plateEffect}; plan feature units)`,
		`signal dimension  ${e.signalDimension}  (plan: ${plan.factors.length} factors; ${e.signal.rule} rule; edge rule ${e.signal.dimensionByEdge})`,
		`Z′                ${e.zPrime === null ? 'not computed' : e.zPrime.toFixed(3)}`,
		'',
		'reagent        stated  measured  distance  reproducibility',
		...e.reagents.map((r) => `${r.id.padEnd(14)} ${r.stated.toFixed(2).padStart(6)}  ${(r.effect === null ? '—' : r.effect.toFixed(2)).padStart(8)}  ${r.distance.toFixed(2).padStart(8)}  ${r.reproducibility === null ? '—' : r.reproducibility.toFixed(2)}`),
		...(e.notes.length ? ['', ...e.notes.map((n) => `note: ${n}`)] : []),
		...(e.warnings.length ? ['', ...e.warnings.map((w) => `caution: ${w}`)] : []),
		'',
		out ? `re-planned plan written to ${out}` : 'add --out NEWPLAN to write the re-planned plan',
		'Estimates hold under the plan model only; have the re-sized plan reviewed by a statistician before ordering.'
	];
	return lines.join('\n');
}
