import type { Design, Plan } from '../plan/types';
import { prepareSimulation } from './prepareSimulation';
import { runReplicate } from './runReplicate';
import { summarise } from './summarise';
import type { ReplicateResult, SimulationOptions, SimulationSummary } from './types';

/** Runs replicates 0…reps−1 in this thread and summarises them (see the CLI pool for threads). */
export function simulate(plan: Plan, design: Design, opts: SimulationOptions & { reps: number }, onProgress?: (done: number, total: number) => void): SimulationSummary {
	if (!Number.isInteger(opts.reps) || opts.reps < 1) throw new RangeError(`reps must be an integer ≥ 1, got ${opts.reps}`);
	const prep = prepareSimulation(plan, design, opts);
	const results: ReplicateResult[] = [];
	for (let rep = 0; rep < opts.reps; rep++) {
		results.push(runReplicate(prep, rep));
		onProgress?.(rep + 1, opts.reps);
	}
	return summarise(prep, results);
}
