/** Sizing: cost model, reagent and context choice, assurance search, frontier, classic t-test check. */
export { designCost, edgeWellCount, usableWellsPerPlate, PLATE_GEOMETRY, type DesignCost, type PlateGroup } from './costModel';
export { twoSampleTTestPower, replicatesForPower, noncentralTCdf, tQuantile, normalCdf, erfc, DEFAULT_ALPHA, DEFAULT_POWER, type ReplicatesForPower } from './twoSampleTTest';
export { reagentTTests, type ReagentTTest } from './reagentTTests';
export { selectReagents, type ReagentSelection, type ReagentSelectionOptions, type ReagentSet, type UnreachableFactor } from './selectReagents';
export { selectContexts, type ContextSelection } from './selectContexts';
export { sizeSearch, controlOptions, SIZE_DEFAULTS, SIZE_CAUTIONS, STANDARD_CONTROLS, type SearchYield, type SizeSearch } from './sizeSearch';
export { sizePlan, sizePlanSync, directEvaluator, directRunner, requestKey, SizingCancelled } from './sizePlan';
export type * from './types';
