import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import type { Command } from '../main';
import { assertKnownFlags, intFlag, stringFlag, UsageError, seedFlag } from '../args';
import { emit, InputError, readPlanFile, writeOutput } from '../io';
import { defaultThreadCount, runReplicatesParallel } from '../pool';
import { createSizePool } from '../sizePool';
import { checkPlan } from '../../lib/core/identify';
import { LayoutError, layoutDesign, type Layout } from '../../lib/core/layout';
import { analysePilot, parsePilotCsvText, PilotError, type PilotEstimates } from '../../lib/core/pilot';
import { effectiveDesign, type Plan } from '../../lib/core/plan';
import { buildReport, renderReportHtml, reportDesign, sha256Hex, type ReportModel, type ReportSectionId } from '../../lib/core/report';
import { prepareSimulation, summarise, type SimulationSummary } from '../../lib/core/simulate';
import { sizePlan, type SizeResult } from '../../lib/core/size';

/** Default Monte Carlo replicates of the report's simulation. */
const DEFAULT_REPS = 200;

/** The app version from package.json (the report's reproducibility block prints it). */
export function appVersion(): string {
	const pkg = JSON.parse(readFileSync(new URL('../../../package.json', import.meta.url), 'utf8')) as { version?: unknown };
	if (typeof pkg.version !== 'string' || !pkg.version) throw new Error('package.json has no version');
	return pkg.version;
}

/**
 * `identiplate report PLAN --out FILE.html [--seed N] [--reps N] [--pilot DATA.csv] [--threads N] [--json]`:
 * runs what the plan file does not carry — a sizing search when the plan fixes no design; the
 * checks and a simulation of the adopted or recommended design (of the default design when there
 * is none); the layout of that design; the pilot analysis when a CSV is given — and writes one
 * self-contained HTML report. A result that cannot be computed (e.g. the design does not fit its
 * plates) leaves its section saying why; bad pilot data exit 2. With --json it prints
 * `{ out, sections: [{id, title, hasResults}], bytes, sha256, planSha256, unavailable }`
 * (`sha256` is the HTML file's).
 */
export const command: Command = {
	summary: 'Why should a collaborator believe it? Writes one self-contained HTML report: assumptions, verdicts, curves, cost, plate maps, pilot, cautions.',
	usage: 'identiplate report PLAN --out FILE.html [--seed N (1)] [--reps N (200)] [--pilot DATA.csv] [--threads N (cores)] [--json]',
	async run(args) {
		assertKnownFlags(args, ['json', 'out', 'seed', 'reps', 'pilot', 'threads']);
		if (args.positional.length !== 1) throw new UsageError(`expected one PLAN file, got ${args.positional.length} arguments`);
		const out = stringFlag(args, 'out');
		if (!out) throw new UsageError('--out FILE.html is required (where to write the report)');
		const seed = seedFlag(args);
		const reps = intFlag(args, 'reps', DEFAULT_REPS, 1, 100_000);
		const threads = intFlag(args, 'threads', defaultThreadCount(), 1, 256);
		const pilotFile = stringFlag(args, 'pilot');
		const json = args.flags.has('json');
		const planFile = args.positional[0];
		const plan = readPlanFile(planFile);
		const planText = readFileSync(planFile, 'utf8');
		const say = (line: string) => {
			if (!json) process.stderr.write(line + '\n');
		};

		// The pilot first: bad data should stop the command before any long computation.
		let pilot: PilotEstimates | null = null;
		if (pilotFile) pilot = readPilot(plan, pilotFile, seed);

		const unavailable: Partial<Record<ReportSectionId, string>> = {};
		const seeds: Record<string, number> = {};

		let sizing: SizeResult | null = null;
		if (!plan.design) {
			say('sizing…');
			const pool = await createSizePool(plan, threads);
			try {
				sizing = await sizePlan(plan, { seed }, pool.evaluate);
				seeds.sizing = seed;
			} catch (err) {
				unavailable.sizing = `the sizing search stopped with an error: ${(err as Error).message}`;
				say(`warning: ${unavailable.sizing}`);
			} finally {
				await pool.close();
			}
		}
		const chosen = reportDesign(plan, sizing);
		if (!chosen && sizing) unavailable.design = 'the sizing found no design that fits the budget';
		// The verdicts are those of the design the report presents (else of the default design).
		const check = checkPlan(plan, chosen?.design);

		let simulation: SimulationSummary | null = null;
		const simDesign = chosen?.design ?? effectiveDesign(plan);
		say(`simulating ${reps} replicates…`);
		try {
			const prep = prepareSimulation(plan, simDesign, { seed });
			const results = await runReplicatesParallel(prep, Array.from({ length: reps }, (_, i) => i), { threads });
			simulation = summarise(prep, results);
			seeds.simulation = seed;
		} catch (err) {
			unavailable.simulation = `the simulation stopped with an error: ${(err as Error).message}`;
			say(`warning: ${unavailable.simulation}`);
		}

		let layout: Layout | null = null;
		if (chosen) {
			try {
				layout = layoutDesign(plan, chosen.design, { seed });
				seeds.layout = seed;
			} catch (err) {
				if (!(err instanceof LayoutError)) throw err;
				unavailable.layout = err.message;
				say(`warning: no layout: ${err.message}`);
			}
		} else unavailable.layout = 'there is no design to lay out: the plan fixes none and sizing recommended none';
		if (pilot) seeds.pilot = seed;

		const command = ['identiplate report', basename(planFile), '--seed', String(seed), '--reps', String(reps), ...(pilotFile ? ['--pilot', basename(pilotFile)] : [])].join(' ');
		const model = buildReport({
			plan,
			check,
			simulation,
			sizing,
			layout,
			pilot,
			generatedAt: new Date().toISOString(),
			appVersion: appVersion(),
			seeds,
			planText,
			planFileName: basename(planFile),
			command,
			unavailable
		});
		const html = renderReportHtml(model);
		writeOutput(out, html);
		const summary = {
			out,
			sections: model.sections.map((s) => ({ id: s.id, title: s.title, hasResults: s.hasResults })),
			bytes: Buffer.byteLength(html, 'utf8'),
			sha256: sha256Hex(html),
			planSha256: model.planSha256,
			unavailable
		};
		emit(json, summary, () => toText(plan, model, summary));
	}
};

function readPilot(plan: Plan, file: string, seed: number): PilotEstimates {
	let text: string;
	try {
		text = readFileSync(file, 'utf8');
	} catch (err) {
		throw new InputError(`${file}: cannot read the pilot CSV (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`);
	}
	try {
		return analysePilot(plan, parsePilotCsvText(plan, text), { seed });
	} catch (err) {
		if (err instanceof PilotError) throw new InputError(`${file}: ${err.message}`);
		throw err;
	}
}

export function toText(plan: Plan, model: ReportModel, s: { out: string; bytes: number; sha256: string }): string {
	const lines = [plan.title, `wrote ${s.out} (${s.bytes} bytes, SHA-256 ${s.sha256})`, ''];
	for (const sec of model.sections) lines.push(`  ${sec.hasResults ? 'ok     ' : 'no data'}  ${sec.title}`);
	return lines.join('\n');
}
