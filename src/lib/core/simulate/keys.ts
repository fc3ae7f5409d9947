/**
 * Purposes of the random streams of a replicate: `rngFor(seed, rep, PURPOSE, ...catalogue keys)`.
 * Keys are catalogue indices (plan.reagents / plan.contexts positions), never design positions,
 * so changing a design leaves every other draw unchanged (common random numbers).
 */
export const STREAM = {
	/** rngFor(seed, rep, MIXING): mixing matrix and nonlinear branch. */
	MIXING: 1,
	/** rngFor(seed, rep, REAGENT, reagentCatalogueIndex): realised targets and effect sizes. */
	REAGENT: 2,
	/** rngFor(seed, rep, WELL, reagentCatalogueIndex, contextKey, replicate): one treatment well. */
	WELL: 3,
	/** rngFor(seed, rep, CONTROL, plate, indexOnPlate): one control well. */
	CONTROL: 4,
	/** rngFor(seed, rep, PLATE, plate): plate offset. */
	PLATE: 5,
	/** rngFor(seed, rep, SCORE): population draws for scoring. */
	SCORE: 6,
	/** rngFor(seed, rep, ESTIMATOR): estimator starts and random features. */
	ESTIMATOR: 7,
	/** rngFor(seed, rep, GROUP_STATS, reagentCatalogueIndex, contextKey): fast-path means of one (reagent, context) group. */
	GROUP_STATS: 8,
	/** rngFor(seed, rep, CONTROL_STATS, plate): fast-path control means of one plate. */
	CONTROL_STATS: 9
} as const;

/** Context key of a stream: 0 = baseline, catalogue index + 1 otherwise. */
export function contextKey(contextCatalogueIndex: number): number {
	return contextCatalogueIndex < 0 ? 0 : contextCatalogueIndex + 1;
}
