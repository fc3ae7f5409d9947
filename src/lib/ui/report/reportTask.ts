/**
 * The notebook's report: which stored results go in (`reportRequest`, on the page) and the
 * report built from them (`makeReport`, in the engine worker: checks, report model, HTML).
 * Pure: no DOM, so Node tests call both directly.
 *
 * A stored result goes in only when it was computed from the plan's current inputs; a stale
 * one is left out and its section says why. Seeds are not part of the plan file, so the
 * report names them and the command line that recomputes the report from the exported plan.
 */
import { checkPlan } from '$core/identify/checkPlan';
import type { Layout } from '$core/layout/types';
import type { PilotEstimates } from '$core/pilot/types';
import { planInputHash } from '$core/plan/hashPlan';
import { DEFAULT_REPLICATES } from '$core/plan/planHelpers';
import type { Plan } from '$core/plan/types';
import { buildReport } from '$core/report/buildReport';
import { renderReportHtml } from '$core/report/renderReportHtml';
import type { ReportRevision, ReportSectionId } from '$core/report/types';
import type { SimulationSummary } from '$core/simulate/types';
import type { SizeResult } from '$core/size/types';

/** A stored result as the session keeps it (see `StoredResult` in storage). */
export interface ResultLike {
	kind: string;
	createdAt: number;
	seed: number | null;
	settings: Record<string, unknown>;
	summary: unknown;
	inputHash: string;
}

/** Result kinds the notebook's sections store, and the report section each one feeds. */
export const REPORT_RESULT_KINDS = [
	{ kind: 'simulate', section: 'simulation', what: 'simulation', where: 'Simulation' },
	{ kind: 'size', section: 'sizing', what: 'sizing', where: 'Sizing' },
	{ kind: 'layout', section: 'layout', what: 'plate layout', where: 'Plate layout' },
	{ kind: 'pilot', section: 'pilot', what: 'pilot analysis', where: 'Pilot' }
] as const satisfies readonly { kind: string; section: ReportSectionId; what: string; where: string }[];

export type ReportResultKind = (typeof REPORT_RESULT_KINDS)[number]['kind'];

/** Everything the worker needs to build the report: plain data. */
export interface ReportRequest {
	plan: Plan;
	simulation: SimulationSummary | null;
	sizing: SizeResult | null;
	layout: Layout | null;
	pilot: PilotEstimates | null;
	revisions: ReportRevision[];
	/** ISO 8601 date-time of the report. */
	generatedAt: string;
	appVersion: string;
	seeds: Record<string, number>;
	planFileName: string;
	/** The command that recomputes the report from the exported plan file. */
	commandLine: string;
	/** What the seeds mean for recomputing (seeds are not in the plan file). */
	seedNote: string;
	/** `commandLine (seedNote)`: printed in the report's reproducibility section. */
	command: string;
	unavailable: Partial<Record<ReportSectionId, string>>;
}

/** Which stored result each report section gets: included, stale (left out) or missing. */
export interface ReportInputState {
	kind: ReportResultKind;
	section: ReportSectionId;
	what: string;
	where: string;
	/** `other-design`: a layout of the default design while sizing recommends another one (left out). */
	state: 'included' | 'stale' | 'missing' | 'other-design';
	seed: number | null;
	createdAt: number | null;
}

/** The state of every result kind the report uses, for the current plan. */
export function reportInputStates(plan: Plan, results: Record<string, ResultLike>): ReportInputState[] {
	const hash = planInputHash(plan);
	const current = (kind: string) => !!results[kind] && results[kind].inputHash === hash;
	// The Layout section lays out the adopted design or, without one, the default design; when
	// sizing recommends a design the report stands for that one, so a default-design layout would
	// show plates of another design.
	const sizedDesign = current('size') && !!(results.size.summary as SizeResult | null)?.design;
	return REPORT_RESULT_KINDS.map(({ kind, section, what, where }) => {
		const r = results[kind];
		let state: ReportInputState['state'] = !r ? 'missing' : current(kind) ? 'included' : 'stale';
		if (kind === 'layout' && state === 'included' && plan.design === null && sizedDesign) state = 'other-design';
		return { kind, section, what, where, state, seed: r?.seed ?? null, createdAt: r?.createdAt ?? null };
	});
}

/** "2025-03-04 12:30 UTC" (the same clock the report prints). */
function utc(ms: number): string {
	const iso = new Date(ms).toISOString();
	return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

/**
 * The report request for the plan as it is now. `planFileName` is the name the notebook's plan
 * export gives the file; `reportFileName` the name of the downloaded report.
 */
export function reportRequest(args: {
	plan: Plan;
	results: Record<string, ResultLike>;
	revisions: { number: number; label: string; createdAt: number; plan: Plan }[];
	now: Date;
	appVersion: string;
	planFileName: string;
	reportFileName: string;
}): ReportRequest {
	const { plan, results } = args;
	const states = reportInputStates(plan, results);
	const unavailable: Partial<Record<ReportSectionId, string>> = {};
	const seeds: Record<string, number> = {};
	const take = <T>(kind: ReportResultKind): T | null => {
		const s = states.find((x) => x.kind === kind)!;
		if (s.state === 'stale') {
			unavailable[s.section] = `the stored ${s.what} (${utc(s.createdAt!)}) was computed before the plan’s inputs last changed, so it is left out; run it again in the notebook’s ${s.where} section.`;
			return null;
		}
		if (s.state === 'other-design') {
			unavailable[s.section] = `the stored layout is of the default design (every reagent and context, ${DEFAULT_REPLICATES} replicates), not of the design sizing recommends; adopt that design in the Sizing section and lay it out again.`;
			return null;
		}
		if (s.state === 'missing') return null;
		if (s.seed !== null) seeds[s.section] = s.seed;
		return results[kind].summary as T;
	};
	const simulation = take<SimulationSummary>('simulate');
	const sizing = take<SizeResult>('size');
	const layout = take<Layout>('layout');
	const pilot = take<PilotEstimates>('pilot');

	const distinct = [...new Set(Object.values(seeds))];
	const seed = seeds.simulation ?? seeds.sizing ?? seeds.layout ?? seeds.pilot ?? 1;
	const reps = simulation ? ` --reps ${simulation.reps}` : '';
	const pilotFile = pilot ? String(results.pilot.settings.file ?? 'PILOT.csv') : null;
	const pilotArg = pilotFile ? ` --pilot ${/^[\w.-]+$/.test(pilotFile) ? pilotFile : JSON.stringify(pilotFile)}` : '';
	const commandLine = `npm run plan -- report ${args.planFileName} --out ${args.reportFileName} --seed ${seed}${reps}${pilotArg}`;
	const seedNote =
		distinct.length > 1
			? `seeds are not stored in the plan file; this notebook used ${Object.entries(seeds).map(([k, v]) => `${k} ${v}`).join(', ')}, and the command line uses one seed for all, so only the results with seed ${seed} are reproduced exactly`
			: 'seeds are not stored in the plan file: export the plan from the notebook and run this in the project folder to recompute every result';
	const command = `${commandLine} (${seedNote})`;

	return {
		plan,
		simulation,
		sizing,
		layout,
		pilot,
		revisions: args.revisions.map((r) => ({ number: r.number, label: r.label, createdAt: r.createdAt, plan: r.plan })),
		generatedAt: args.now.toISOString(),
		appVersion: args.appVersion,
		seeds,
		planFileName: args.planFileName,
		commandLine,
		seedNote,
		command,
		unavailable
	};
}

export interface ReportOutput {
	html: string;
	/** UTF-8 size of `html`. */
	bytes: number;
	planSha256: string;
	sections: { id: ReportSectionId; title: string; hasResults: boolean }[];
}

/** Builds and renders the report (runs in the engine worker). */
export function makeReport(request: ReportRequest): ReportOutput {
	const model = buildReport({
		plan: request.plan,
		check: checkPlan(request.plan),
		simulation: request.simulation,
		sizing: request.sizing,
		layout: request.layout,
		pilot: request.pilot,
		revisions: request.revisions,
		generatedAt: request.generatedAt,
		appVersion: request.appVersion,
		seeds: request.seeds,
		planFileName: request.planFileName,
		command: request.command,
		unavailable: request.unavailable
	});
	const html = renderReportHtml(model);
	return { html, bytes: new TextEncoder().encode(html).length, planSha256: model.planSha256, sections: model.sections.map((s) => ({ id: s.id, title: s.title, hasResults: s.hasResults })) };
}
