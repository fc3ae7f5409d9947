import type { FactorVerdict } from './types';

/**
 * Orders verdicts: individual is best, then block (a smaller block is better), then none.
 * Returns a positive number when `a` is better than `b`, negative when worse, 0 when as good.
 */
export function compareVerdicts(a: Pick<FactorVerdict, 'verdict' | 'block'>, b: Pick<FactorVerdict, 'verdict' | 'block'>): number {
	const tier = (v: Pick<FactorVerdict, 'verdict'>) => (v.verdict === 'individual' ? 2 : v.verdict === 'block' ? 1 : 0);
	const t = tier(a) - tier(b);
	if (t !== 0) return t;
	return a.verdict === 'block' ? b.block.length - a.block.length : 0;
}
