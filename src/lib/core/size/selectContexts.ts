import { checkPlan } from '../identify';
import type { Design, Plan } from '../plan/types';
import { designCost } from './costModel';

/**
 * Context choice for the contexts route: the cheapest subset of the plan's contexts (at least
 * two) under which the verdict engine's contexts route recovers every factor individually —
 * pairwise non-proportional variance profiles for linear mixing, n·k + 1 contexts with a
 * full-rank modulation matrix for nonlinear mixing (see identify/). The condition is checked by
 * `checkPlan` on each candidate subset, cheapest first (cost from the cost model at the given
 * replicates), over every subset when there are at most `exactLimit` contexts (default 12),
 * otherwise greedily (add the cheapest context that raises the number of individual factors,
 * then drop redundant ones, most expensive first).
 */
export interface ContextSelection {
	/** Candidate context sets (ids in plan order), cheapest first: the minimum set, then every context. */
	sets: string[][];
	allIndividual: boolean;
	unreachable: { id: string; block: string[]; reason: string }[];
	method: 'exact' | 'greedy';
	evaluations: number;
}

export function selectContexts(plan: Plan, base: Omit<Design, 'contexts'>, opts: { exactLimit?: number } = {}): ContextSelection {
	const exactLimit = opts.exactLimit ?? 12;
	const ids = plan.contexts.map((c) => c.id);
	let evaluations = 0;
	const verdicts = (contexts: string[]) => {
		evaluations++;
		const res = checkPlan({ ...plan, goal: { ...plan.goal, route: 'contexts' } }, { ...base, contexts });
		const route = res.routes.find((r) => r.route === 'contexts');
		return route ? route.factors : plan.factors.map((f) => ({ id: f.id, verdict: 'none' as const, block: [] as string[], reason: 'the contexts route was not evaluated' }));
	};
	const individualCount = (contexts: string[]) => verdicts(contexts).filter((f) => f.verdict === 'individual').length;
	const cost = (contexts: string[]) => designCost(plan, { ...base, contexts }).total;
	const full = verdicts(ids);
	const fullCount = full.filter((f) => f.verdict === 'individual').length;
	const unreachable = full.filter((f) => f.verdict !== 'individual').map((f) => ({ id: f.id, block: f.block, reason: f.reason }));
	const allIndividual = unreachable.length === 0;
	const inPlanOrder = (set: string[]) => ids.filter((id) => set.includes(id));

	let best: string[] = ids;
	let method: ContextSelection['method'] = 'greedy';
	if (ids.length <= exactLimit) {
		method = 'exact';
		const subsets: { set: string[]; cost: number }[] = [];
		for (let mask = 1; mask < 1 << ids.length; mask++) {
			const set = ids.filter((_, i) => mask & (1 << i));
			if (set.length < 2 && ids.length >= 2) continue;
			subsets.push({ set, cost: cost(set) });
		}
		subsets.sort((a, b) => a.cost - b.cost || a.set.length - b.set.length);
		for (const s of subsets) {
			if (individualCount(s.set) >= fullCount) {
				best = s.set;
				break;
			}
		}
	} else {
		const chosen: string[] = [];
		let count = individualCount(chosen);
		while (count < fullCount) {
			let pick: string | null = null;
			let pickCost = Infinity;
			let pickCount = count;
			for (const id of ids) {
				if (chosen.includes(id)) continue;
				const next = [...chosen, id];
				const c = individualCount(next);
				const k = cost(next);
				if (c > pickCount || (c === pickCount && c > count && k < pickCost) || (pick === null && chosen.length < 2 && k < pickCost)) {
					pick = id;
					pickCost = k;
					pickCount = c;
				}
			}
			if (pick === null) break;
			chosen.push(pick);
			count = pickCount;
		}
		const byCost = [...chosen].sort((a, b) => cost([b]) - cost([a]));
		let kept = chosen;
		for (const id of byCost) {
			const without = kept.filter((x) => x !== id);
			if (without.length >= 2 && individualCount(without) >= fullCount) kept = without;
		}
		best = kept;
	}
	const sets = [inPlanOrder(best)];
	if (best.length < ids.length) sets.push(ids);
	return { sets, allIndividual, unreachable, method, evaluations };
}
