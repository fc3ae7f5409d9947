/** Recovery estimators: each returns a linear unmixing (or a lift plus one) with diagnostics. */
export type { Unmixing } from './types';
export { signalSubspace, projectRows, type Subspace } from './signalSubspace';
export { supportUnmixing, type SupportUnmixingInput } from './supportUnmixing';
