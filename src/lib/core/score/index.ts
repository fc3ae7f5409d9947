/** Recovery scores: Hungarian matching, MCC, block R², Wilson intervals, quantiles. */
export { hungarian, solveRowsLeqCols, type Assignment } from './hungarian';
export { wilson, Z_95, type Proportion } from './wilson';
export { quantile, quantileSorted } from './quantile';
export { jointCovariance, populationJointCovariance, ranksInPlace } from './jointCovariance';
export { scoreRecovery, type RecoveryScore } from './scoreRecovery';
export { mcc } from './mcc';
