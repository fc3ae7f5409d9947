export * from './types';
export * from './constraints';
export { PlanError, type PlanIssue } from './PlanError';
export { validatePlan, parsePlan } from './validatePlan';
export { migratePlan } from './migratePlan';
export { effectOn, effectiveDesign, cellsPerWell, nextId, DEFAULT_REPLICATES } from './planHelpers';
export { serializePlan } from './serializePlan';
