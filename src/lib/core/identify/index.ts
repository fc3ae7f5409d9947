/** Identifiability checks: exact per-factor verdicts with sources and fixes. */
export type { CheckStatus, Fix, Check, Verdict, FactorVerdict, RouteVerdicts, CheckResult } from './types';
export type { Route, GoalRoute } from '../plan/types';
export { checkPlan } from './checkPlan';
export { targetedRankVerdicts, FRACTION_LIMIT, type EffectColumn, type TargetedRankOptions, type TargetedRankResult } from './targetedRankVerdicts';
export { compareVerdicts } from './verdictOrder';
export { maximumMatching, structuralNullSupport, type Matching } from './maximumMatching';
export { modularRank, ModularEchelon, PRIME_A, PRIME_B } from './modularRank';
export { fractionRank, exactFraction } from './fractionRank';
export { SOURCES } from './sources';
export { MIN_CONTROLS_PER_PLATE } from './practicalChecks';
