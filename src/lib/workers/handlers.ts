/**
 * The engine worker's task handlers: task type → `(payload, progress) => result`.
 * Payloads and results are plain data. To add a task, add one line here (a handler calling a
 * core function); `EnginePool.run('<type>', payload)` is then typed from this table.
 * Runs inside the worker only: the page imports this file for its types alone.
 */
import { checkPlan } from '$core/identify';
import type { Design, Plan } from '$core/plan/types';
import { designCost } from '$core/size/costModel';
import { effectiveDesign } from '$core/plan/planHelpers';
import { simulate, type SimulationOptions } from '$core/simulate';
import { directEvaluator, sizePlan, type SizeOptions } from '$core/size';
import { layoutDesign } from '$core/layout/layoutDesign';
import { layoutExport, type LayoutExportRequest } from '$lib/ui/layout/layoutExport';
import { makeReport, type ReportRequest } from '$lib/ui/report/reportTask';
import type { Handler, Progress } from './protocol';

export const handlers = {
	/** Identifiability verdicts and practical checks of a plan (and optional design). */
	check: ({ plan, design }: { plan: Plan; design?: Design }) => checkPlan(plan, design),
	/** Plates, wells and cost of the design checked (the plan's design, or the default one). */
	designCost: ({ plan, design }: { plan: Plan; design?: Design }) => designCost(plan, design ?? effectiveDesign(plan)),
	/** Monte Carlo recovery simulation of a design (the plan's, or the default one); progress per replicate. */
	simulate: ({ plan, design, options }: { plan: Plan; design?: Design; options: SimulationOptions & { reps: number } }, progress: (p: Progress) => void) => simulate(plan, design ?? effectiveDesign(plan), options, (done, total) => progress({ done, total })),
	/** Sizing search; progress = replicates simulated so far (total 0: not known in advance), note = "phase: what is being judged". */
	size: ({ plan, options }: { plan: Plan; options: SizeOptions }, progress: (p: Progress) => void) => sizePlan(plan, options, directEvaluator(plan), (p) => progress({ done: p.evaluations, total: 0, note: `${p.phase}: ${p.message}` })),
	/** Plate layout of the plan's design (or the default one) with the given seed; LayoutError when it does not fit. */
	layout: ({ plan, seed }: { plan: Plan; seed: number }) => layoutDesign(plan, plan.design, { seed }),
	/** A downloadable file of a layout: CSV or SVG of one or all plates, or printable sheets. */
	layoutExport: (request: LayoutExportRequest) => layoutExport(request),
	/** The collaborator report (checks, model and self-contained HTML) from the plan and its current results. */
	report: (request: ReportRequest) => makeReport(request)
} satisfies Record<string, Handler>;

export type EngineHandlers = typeof handlers;
