import { applyLift, contrastiveLift, type Lift } from '../recover/contrastiveLift';
import { fastIca } from '../recover/fastIca';
import { jointDiagUnmixing } from '../recover/jointDiagUnmixing';
import { sparseUnmixing } from '../recover/sparseUnmixing';
import { supportUnmixing } from '../recover/supportUnmixing';
import type { Unmixing } from '../recover/types';
import { scoreRecovery } from '../score/scoreRecovery';
import { drawEffectStatistics, effectsFromWells } from './effectStatistics';
import { STREAM } from './keys';
import { learningSamples, plateBaselines } from './learningData';
import { rngFor, type Rng } from './rng';
import { scoreCovariance, type Representation } from './scorePopulation';
import { simulateWells, type WellData } from './simulateWells';
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
	const estRng = rngFor(prep.seed, rep, STREAM.ESTIMATOR);
	const warnings: string[] = [];
	let representation: Representation;
	let converged = true;
	if (prep.estimator !== 'contrastive' && (prep.linearStep === 'support' || prep.linearStep === 'sparse') && prep.fastPath) {
		const u = linearStep(prep, drawEffectStatistics(prep, world, rep), null, estRng);
		representation = { kind: 'linear', k: u.k, w: u.w };
		converged = u.converged;
		warnings.push(...u.warnings);
	} else {
		const data = simulateWells(prep, world, rep);
		if (prep.estimator === 'contrastive') {
			const lifted = liftData(prep, data, estRng);
			if (lifted) {
				const u = linearStep(prep, null, lifted.data, estRng);
				converged = u.converged && lifted.lift.converged;
				warnings.push(...u.warnings);
				if (!lifted.lift.converged) warnings.push(`the contrastive lift's classifier did not converge in ${lifted.lift.iterations} steps`);
				const { lift, correction } = lifted;
				const K = lift.classes;
				const shifted = new Float64Array(p);
				const logits = new Float64Array(K);
				const scratch = new Float64Array(lift.p + lift.rff + 1);
				representation = {
					kind: 'lifted',
					k: u.k,
					apply(x, out) {
						for (let i = 0; i < p; i++) shifted[i] = x[i] - correction[i];
						applyLift(lift, shifted, 0, logits, scratch);
						for (let t = 0; t < u.k; t++) {
							let v = 0;
							for (let c = 0; c < K; c++) v += u.w[t * K + c] * logits[c];
							out[t] = v;
						}
					}
				};
			} else {
				warnings.push('the contrastive lift needs reagents or at least 2 contexts to classify by; the linear step ran on the raw profiles');
				const u = linearStep(prep, null, data, estRng);
				converged = u.converged;
				warnings.push(...u.warnings);
				representation = { kind: 'linear', k: u.k, w: u.w };
			}
		} else {
			const u = linearStep(prep, null, data, estRng);
			converged = u.converged;
			warnings.push(...u.warnings);
			representation = { kind: 'linear', k: u.k, w: u.w };
		}
	}
	const cov = scoreCovariance(prep, world.mixing, rep, representation);
	const score = scoreRecovery(cov, representation.k, d, prep.blocks);
	return { rep, mcc: score.mcc, factorCorr: score.factorCorr, blockR2: score.blockR2, converged, warnings };
}

/** The prepared linear step on effects (fast path) or on (possibly lifted) well data. */
function linearStep(prep: PreparedSimulation, effects: Float64Array | null, data: WellData | null, rng: Rng): Unmixing {
	const d = prep.factorIds.length;
	const R = prep.reagentCatalogue.length;
	const p = data ? data.p : prep.plan.observation.features;
	switch (prep.linearStep) {
		case 'support':
		case 'sparse': {
			const eff = effects ?? effectsFromWells(prep, data!);
			return prep.linearStep === 'support'
				? supportUnmixing({ effects: eff, reagents: R, features: p, factors: d, targets: prep.knownTargets, factorIds: prep.factorIds })
				: sparseUnmixing({ effects: eff, reagents: R, features: p, factors: d });
		}
		case 'fastica': {
			const s = learningSamples(prep, data!);
			if (s.n < 2) return degenerate(d, p, 'FastICA needs at least 2 samples');
			return fastIca(s.x, s.n, p, { components: Math.min(d, p), rng });
		}
		case 'jointdiag': {
			const s = learningSamples(prep, data!);
			if (s.n < 2) return degenerate(d, p, 'joint diagonalisation needs at least 2 samples');
			return jointDiagUnmixing({ x: s.x, n: s.n, p, groups: s.groups, groupCount: s.groupCount, components: Math.min(d, p) });
		}
	}
}

function degenerate(d: number, p: number, why: string): Unmixing {
	return { k: d, p, w: new Float64Array(d * p), converged: false, iterations: 0, warnings: [why] };
}

/**
 * Trains the contrastive lift on plate-corrected wells (or kept cells) labelled by reagent
 * (targeted route and designs with reagents) or context, and returns the lifted well data
 * (profiles and cells replaced by centred logits) plus the shift that maps a population
 * profile of plate 0 onto the training frame. Null when there is nothing to classify by.
 */
function liftData(prep: PreparedSimulation, data: WellData, rng: Rng): { lift: Lift; data: WellData; correction: Float64Array } | null {
	const { p } = data;
	const R = prep.reagentCatalogue.length;
	const C = prep.contextCatalogue.length;
	const byReagent = prep.route === 'targeted' || (prep.route === 'observational' && R > 0) || (prep.route === 'contexts' && C < 2 && R > 0);
	if (!byReagent && C < 2) return null;
	const classes = byReagent ? R + 1 : C;
	const labelOf = (w: number) => (byReagent ? data.reagent[w] + 1 : Math.max(0, data.context[w]));
	const base = plateBaselines(prep, data);
	const useCells = data.nCells > 0;
	const n = useCells ? data.nCells : data.nWells;
	const x = new Float64Array(n * p);
	const labels = new Int32Array(n);
	for (let s = 0; s < n; s++) {
		const w = useCells ? data.cellWell[s] : s;
		const src = useCells ? data.cells : data.profiles;
		const q = data.plate[w];
		for (let i = 0; i < p; i++) x[s * p + i] = src[s * p + i] - base[q * p + i];
		labels[s] = labelOf(w);
	}
	const lift = contrastiveLift(x, labels, n, p, classes, { rng });
	const K = classes;
	const liftedSamples = new Float64Array(n * K);
	const out = new Float64Array(K);
	for (let s = 0; s < n; s++) liftedSamples.set(applyLift(lift, x, s * p, out), s * K);
	const profiles = new Float64Array(data.nWells * K);
	if (useCells) {
		const count = new Float64Array(data.nWells);
		for (let s = 0; s < n; s++) {
			const w = data.cellWell[s];
			count[w]++;
			for (let c = 0; c < K; c++) profiles[w * K + c] += liftedSamples[s * K + c];
		}
		for (let w = 0; w < data.nWells; w++) if (count[w] > 0) for (let c = 0; c < K; c++) profiles[w * K + c] /= count[w];
	} else profiles.set(liftedSamples);
	// Population profiles x = g(z) + ε of plate 0 would carry β_0; training profiles had b_0 removed.
	const correction = new Float64Array(p);
	for (let i = 0; i < p; i++) correction[i] = base[i] - data.offsets[i];
	return {
		lift,
		correction,
		data: { ...data, p: K, profiles, cells: useCells ? liftedSamples : new Float64Array(0), offsets: new Float64Array(prep.plates * K) }
	};
}
