/** Monte Carlo recovery simulation: public surface. */
export { rngFor, shuffleInPlace, type Rng } from './rng';
export * from './types';
export { prepareSimulation, prepareSimilar, DEFAULT_SCORE_DRAWS, DEFAULT_MAX_CELLS } from './prepareSimulation';
export { runReplicate } from './runReplicate';
export { summarise } from './summarise';
export { simulate } from './simulate';
export { wilson } from '../score/wilson';
export { drawFactor, fillFactor, excessKurtosis, BIMODAL_MU } from './factorShape';
export { drawMixing, applyMixing, type Mixing } from './mixing';
export { realiseReagent, type RealisedReagent } from './realiseReagents';
export { drawWorld, CLAMP_SPREAD, type World } from './world';
export { simulateWells, type WellData } from './simulateWells';
export { effectsFromWells, drawEffectStatistics } from './effectStatistics';
export { scoreCovariance, type Representation } from './scorePopulation';
export { STREAM, contextKey } from './keys';
