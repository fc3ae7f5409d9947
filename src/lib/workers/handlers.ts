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
import type { Handler } from './protocol';

export const handlers = {
	/** Identifiability verdicts and practical checks of a plan (and optional design). */
	check: ({ plan, design }: { plan: Plan; design?: Design }) => checkPlan(plan, design),
	/** Plates, wells and cost of the design checked (the plan's design, or the default one). */
	designCost: ({ plan, design }: { plan: Plan; design?: Design }) => designCost(plan, design ?? effectiveDesign(plan))
} satisfies Record<string, Handler>;

export type EngineHandlers = typeof handlers;
