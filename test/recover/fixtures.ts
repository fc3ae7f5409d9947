/** Shared helpers for the recover tests (re-exports plus an orthogonal matrix from a seed). */
import { randomOrthogonal } from '../../src/lib/core/linalg';
import { rngFor } from '../../src/lib/core/simulate';
export { drawFactor, drawMixing, rngFor } from '../../src/lib/core/simulate';

export function randomOrthogonalForTest(k: number, seed: number): Float64Array {
	return randomOrthogonal(k, rngFor(seed));
}
