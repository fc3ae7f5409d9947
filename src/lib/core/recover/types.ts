/**
 * A linear unmixing estimated by a recovery estimator: y = W·x gives k recovered components
 * from a p-feature profile. Layout: `w` row-major k × p. Diagnostics follow the project's
 * convention: numerical trouble is reported in `converged` / `warnings`, never thrown.
 */
export interface Unmixing {
	k: number;
	p: number;
	w: Float64Array;
	converged: boolean;
	iterations: number;
	warnings: string[];
}
