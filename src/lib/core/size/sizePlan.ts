import type { Design, Plan } from '../plan/types';
import { prepareSimulation, runReplicate } from '../simulate';
import type { PreparedSimulation, SimulationOptions } from '../simulate/types';
import { sizeSearch } from './sizeSearch';
import type { EvalRequest, Evaluator, ReplicateOutcome, SizeOptions, SizeProgress, SizeResult } from './types';

/** Thrown by `sizePlan` when `shouldStop()` returns true between batches. */
export class SizingCancelled extends Error {
	constructor() {
		super('sizing was cancelled');
		this.name = 'SizingCancelled';
	}
}

/**
 * Sizes `plan` (see sizeSearch for the method): the cheapest design reaching the goal within
 * the budget, the frontier of cost against assurance, the curve of MCC against replicates and
 * the classic per-reagent t-test check. `evaluate` runs batches of Monte Carlo replicates —
 * possibly in parallel — and must return, per request, the outcomes of its `reps` in order
 * (`directEvaluator(plan)` runs them on this thread). `onProgress` is told before each batch;
 * `shouldStop` is asked before each batch, and a true answer rejects with `SizingCancelled`.
 */
export async function sizePlan(
	plan: Plan,
	opts: SizeOptions,
	evaluate: Evaluator,
	onProgress?: (p: SizeProgress) => void,
	shouldStop?: () => boolean
): Promise<SizeResult> {
	const search = sizeSearch(plan, opts);
	let step = search.next();
	while (!step.done) {
		if (shouldStop?.()) {
			search.return(undefined as never);
			throw new SizingCancelled();
		}
		onProgress?.(step.value.progress);
		const outcomes = await evaluate(step.value.requests);
		step = search.next(outcomes);
	}
	return step.value;
}

/** `sizePlan` on this thread with the simulation engine: used by the benchmark and tests. */
export function sizePlanSync(plan: Plan, opts: SizeOptions = {}, onProgress?: (p: SizeProgress) => void): SizeResult {
	const run = directRunner(plan);
	const search = sizeSearch(plan, opts);
	let step = search.next();
	while (!step.done) {
		onProgress?.(step.value.progress);
		step = search.next(step.value.requests.map(run));
	}
	return step.value;
}

/** An evaluator that runs every request on the calling thread with `runReplicate`. */
export function directEvaluator(plan: Plan): Evaluator {
	const run = directRunner(plan);
	return async (batch) => batch.map(run);
}

/**
 * Runs one request: prepares the simulation of its design once (cached by design and options)
 * and runs its replicates. Exported for worker entry points that evaluate requests.
 */
export function directRunner(plan: Plan): (req: EvalRequest) => ReplicateOutcome[] {
	const cache = new Map<string, PreparedSimulation>();
	return (req) => {
		const key = requestKey(req.design, req.options);
		let prep = cache.get(key);
		if (!prep) {
			prep = prepareSimulation(plan, req.design, req.options);
			if (cache.size > 256) cache.clear();
			cache.set(key, prep);
		}
		return req.reps.map((rep) => {
			const r = runReplicate(prep!, rep);
			return { rep: r.rep, mcc: r.mcc };
		});
	};
}

/** Stable key of a (design, options) pair. */
export function requestKey(design: Design, options: SimulationOptions): string {
	return JSON.stringify([design.reagents, design.replicates, design.controlsPerPlate, design.contexts, design.cellsPerWell ?? null, design.plates ?? null, options]);
}
