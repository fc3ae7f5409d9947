import { jointCovariance } from './jointCovariance';
import { scoreRecovery, type RecoveryScore } from './scoreRecovery';

/**
 * Mean correlation coefficient between recovered components `y` (row-major n × k) and true
 * factors `z` (row-major n × d) after optimal one-to-one matching: |Pearson| by default,
 * |Spearman| with `method: 'spearman'` (for nonlinear mixing, where components are only
 * recovered up to a monotone transform).
 */
export function mcc(y: Float64Array, z: Float64Array, n: number, k: number, d: number, opts: { method?: 'pearson' | 'spearman'; blocks?: number[][] | null } = {}): RecoveryScore {
	const cov = jointCovariance(y, z, n, k, d, { ranks: opts.method === 'spearman' });
	return scoreRecovery(cov, k, d, opts.blocks ?? null);
}
