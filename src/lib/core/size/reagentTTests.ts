import { cellsPerWell as designCells } from '../plan/planHelpers';
import type { Design, Plan, Reagent } from '../plan/types';
import { DEFAULT_ALPHA, DEFAULT_POWER, replicatesForPower } from './twoSampleTTest';

export interface ReagentTTest {
	id: string;
	/** Standardised effect d used (Cohen's d); null when a mean comparison does not apply. */
	effect: number | null;
	/** Wells per group for the two-sided t-test to reach the power; null when d is null or 0. */
	replicatesNeeded: number | null;
	/** Continuous solution of power(n) = target, for comparison with power tables. */
	exactN: number | null;
	/** Why the check does not apply, when it does not. */
	note: string | null;
}

/**
 * The classic per-reagent check shown beside the Monte Carlo sizing: wells per group (reagent
 * vs. negative control) for a two-sided two-sample t-test at level α (default 0.05) to reach
 * the power (default 0.8) on the reagent's weakest target.
 *
 * Effect-size rule (stated so that users can reproduce it):
 *   d_r = efficacy_r · min over targets |effect_r,j|  /  σ_well
 *   σ_well = √(τ² + 1)          at well level (cellsPerWell = 0: each well carries one draw of
 *                               the unit-variance factor plus replicate noise τ = replicateNoise)
 *   σ_well = √(τ² + 1/cells)    with `cells` imaged per well (the well mean averages the factor's
 *                               unit spread over its cells).
 * Efficacy scales the expected shift (wells where the reagent fails do not move); the extra
 * variance of that mixture and the measurement noise in feature space are ignored, so the
 * check is optimistic for low efficacy. `clamp` reagents shift the factor to the clamped value
 * from a baseline mean of 0 (|value| is used); `scale` reagents change the spread, not the
 * mean, so the check does not apply (null). Reagents with unknown targets use their stated
 * effect. This check sees one factor at a time; it is no substitute for the recovery sizing.
 */
export function reagentTTests(plan: Plan, design?: Design, opts: { power?: number; alpha?: number } = {}): ReagentTTest[] {
	const power = opts.power ?? DEFAULT_POWER;
	const alpha = opts.alpha ?? DEFAULT_ALPHA;
	const cells = design ? designCells(plan, design) : plan.observation.cellsPerWell;
	const tau = plan.observation.replicateNoise;
	const sdWell = Math.sqrt(tau * tau + (cells > 0 ? 1 / cells : 1));
	const ids = design ? new Set(design.reagents) : null;
	return plan.reagents
		.filter((r) => !ids || ids.has(r.id))
		.map((r) => {
			const base = standardShift(r);
			if (base === null) return { id: r.id, effect: null, replicatesNeeded: null, exactN: null, note: 'scale reagents change the spread, not the mean; a t-test on means does not apply' };
			const d = (r.efficacy * base) / sdWell;
			if (d === 0) return { id: r.id, effect: 0, replicatesNeeded: null, exactN: null, note: 'a zero effect cannot be detected' };
			const res = replicatesForPower(d, { power, alpha });
			return {
				id: r.id,
				effect: d,
				replicatesNeeded: res.n,
				exactN: res.exactN,
				note: res.n === null ? 'more than a million wells per group would be needed' : null
			};
		});
}

/** Smallest absolute shift over the reagent's targets (null for `scale`). */
function standardShift(r: Reagent): number | null {
	if (r.kind === 'scale') return null;
	if (typeof r.effect === 'number') return Math.abs(r.effect);
	const values = r.targets ? r.targets.map((t) => Math.abs((r.effect as Record<string, number>)[t] ?? 0)) : Object.values(r.effect).map(Math.abs);
	return values.length ? Math.min(...values) : 0;
}
