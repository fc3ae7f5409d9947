import { supportUnmixing } from '../recover/supportUnmixing';
import type { Unmixing } from '../recover/types';
import { scoreRecovery } from '../score/scoreRecovery';
import { drawEffectStatistics, effectsFromWells } from './effectStatistics';
import { scoreCovariance, type Representation } from './scorePopulation';
import { simulateWells } from './simulateWells';
import type { PreparedSimulation, ReplicateResult } from './types';
import { drawWorld } from './world';

/**
 * One Monte Carlo replicate: draw the world (mixing, realised reagents), simulate the plates
 * (fast path or full), estimate the unmixing with the prepared estimator and score it against
 * the truth. Deterministic in (prep.seed, rep); independent of which worker runs it.
 */
export function runReplicate(prep: PreparedSimulation, rep: number): ReplicateResult {
	if (!Number.isInteger(rep) || rep < 0) throw new RangeError(`rep must be an integer ≥ 0, got ${rep}`);
	const world = drawWorld(prep, rep);
	const d = prep.factorIds.length;
	const p = prep.plan.observation.features;
	const R = prep.reagentCatalogue.length;
	let unmixing: Unmixing;
	switch (prep.linearStep) {
		case 'support': {
			const effects = prep.fastPath ? drawEffectStatistics(prep, world, rep) : effectsFromWells(prep, simulateWells(prep, world, rep));
			unmixing = supportUnmixing({ effects, reagents: R, features: p, factors: d, targets: prep.knownTargets, factorIds: prep.factorIds });
			break;
		}
		default:
			throw new RangeError(`estimator ${prep.linearStep} is not available in this build`);
	}
	const representation: Representation = { kind: 'linear', k: unmixing.k, w: unmixing.w };
	const cov = scoreCovariance(prep, world.mixing, rep, representation);
	const score = scoreRecovery(cov, representation.k, d, prep.blocks);
	return {
		rep,
		mcc: score.mcc,
		factorCorr: score.factorCorr,
		blockR2: score.blockR2,
		converged: unmixing.converged,
		warnings: unmixing.warnings
	};
}
