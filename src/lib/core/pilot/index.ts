/** Pilot data: CSV ingestion, normalisation, noise / effect / dimension estimates, re-planning. */
export { PilotError } from './PilotError';
export { createPilotReader, type PilotReader, type PilotRow } from './createPilotReader';
export { parsePilotCsvText } from './parsePilotCsvText';
export { analysePilot } from './analysePilot';
export { applyPilot } from './applyPilot';
export { zPrime, zPrimeFromMoments } from './zPrime';
export { marchenkoPasturEdges, fMatrixUpperEdge, spectrumUpperEdge, johnstoneCentringScale, noiseSpikeThreshold, TRACY_WIDOM_1_95, TRACY_WIDOM_1_99 } from './noiseEdges';
export { ledoitWolfShrinkage } from './ledoitWolf';
export { groupRoots } from './groupRoots';
export { normalisePilot } from './normalisePilot';
export { statedEffectNorm } from './statedEffect';
export { parseWellName, rowLabel, lastWellName } from './wellName';
export { simulatePilotRows, type PilotTruth, type SimulatePilotOptions } from './simulatePilot';
export * from './types';
