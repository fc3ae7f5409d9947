import { quantileSorted } from '../score/quantile';
import { wilson } from '../score/wilson';
import type { PreparedSimulation, ReplicateResult, SimulationSummary } from './types';

/**
 * Summary over replicates: MCC mean and 10/50/90 % quantiles (Hyndman–Fan type 7), assurance =
 * share of replicates with MCC ≥ plan.goal.mcc with its Wilson 95 % interval, per-factor mean
 * matched correlation (and block R² when blocks are known), and the warnings of the preparation
 * plus every distinct replicate warning with the number of replicates that raised it.
 * Results are ordered by rep first, so the summary does not depend on arrival order.
 */
export function summarise(prep: PreparedSimulation, results: ReplicateResult[]): SimulationSummary {
	const sorted = [...results].sort((a, b) => a.rep - b.rep);
	const n = sorted.length;
	const mccs = sorted.map((r) => r.mcc);
	const asc = Float64Array.from(mccs).sort();
	const mean = n ? mccs.reduce((s, v) => s + v, 0) / n : NaN;
	const successes = mccs.filter((m) => m >= prep.goalMcc).length;
	const assurance = wilson(successes, n);
	const factors = prep.factorIds.map((id, j) => {
		const f: { id: string; meanCorr: number; blockR2?: number } = { id, meanCorr: n ? sorted.reduce((s, r) => s + r.factorCorr[j], 0) / n : NaN };
		if (prep.blocks && n) f.blockR2 = sorted.reduce((s, r) => s + (r.blockR2?.[j] ?? 0), 0) / n;
		return f;
	});
	const counts = new Map<string, number>();
	for (const r of sorted) for (const w of new Set(r.warnings)) counts.set(w, (counts.get(w) ?? 0) + 1);
	const notConverged = sorted.filter((r) => !r.converged).length;
	const warnings = [...prep.warnings, ...[...counts].map(([w, c]) => `${w} (in ${c} of ${n} replicates)`)];
	if (notConverged) warnings.push(`the estimator did not converge in ${notConverged} of ${n} replicates`);
	return {
		seed: prep.seed,
		reps: n,
		estimator: prep.estimator,
		route: prep.route,
		goalMcc: prep.goalMcc,
		mcc: { mean, p10: quantileSorted(asc, 0.1), median: quantileSorted(asc, 0.5), p90: quantileSorted(asc, 0.9) },
		assurance,
		factors,
		mccs,
		warnings,
		design: prep.design
	};
}
