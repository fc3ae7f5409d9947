/** Recovery estimators: each returns a linear unmixing (or a lift plus one) with diagnostics. */
export type { Unmixing } from './types';
export { signalSubspace, projectRows, type Subspace } from './signalSubspace';
export { supportUnmixing, type SupportUnmixingInput } from './supportUnmixing';
export { sparseUnmixing, type SparseUnmixingInput } from './sparseUnmixing';
export { whiten, covarianceAbout, type Whitening } from './whiten';
export { fastIca, type FastIcaOptions } from './fastIca';
export { jointDiagonalise, type JointDiagonalisation } from './jointDiagonalise';
export { jointDiagUnmixing, type JointDiagInput } from './jointDiagUnmixing';
export { contrastiveLift, applyLift, type Lift, type ContrastiveLiftOptions } from './contrastiveLift';
