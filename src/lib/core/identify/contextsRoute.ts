import type { Context } from '../plan/types';
import { addedContextsCost, type EvalContext } from './evalContext';
import { capitalise } from './fixes';
import { exactFraction, fractionRank, type Fraction } from './fractionRank';
import { listText, money } from './labels';
import { SOURCES } from './sources';
import type { Check, FactorVerdict, Fix, RouteOutcome } from './types';

/** Relative tolerance for "same proportions" of two variance profiles. */
export const PROPORTIONAL_TOLERANCE = 1e-12;

/**
 * The contexts route (DESIGN.md "Identifiability checks"): applicable with ≥ 2 design contexts.
 * Linear mixing: factors with proportional variance profiles form blocks (joint diagonalisation).
 * Nonlinear mixing: n·k + 1 contexts with a full-rank modulation matrix of Gaussian natural
 * parameters; contexts that change only means give one block of all factors.
 */
export function contextsRoute(ctx: EvalContext): RouteOutcome {
	const ids = ctx.factors.map((f) => f.id);
	if (ctx.contexts.length < 2) {
		const reason = `The design uses ${ctx.contexts.length} context${ctx.contexts.length === 1 ? '' : 's'}; the contexts route needs at least two.`;
		const check: Check = {
			id: 'contexts.applicable',
			route: 'contexts',
			status: 'fail',
			message: `The design uses ${ctx.contexts.length === 0 ? 'no contexts' : 'only one context'}, so there are no environments to compare.`,
			source: SOURCES.contextsNone,
			factors: ids,
			fix: ctx.unusedContexts.length
				? contextFix(ctx, ctx.unusedContexts.slice(0, 2 - ctx.contexts.length), 'so the factors can be compared across environments')
				: { text: 'Add contexts (media, time points, temperatures) that change the variances of the factors in different proportions.' }
		};
		return { verdicts: { route: 'contexts', applicable: false, factors: ids.map((id) => ({ id, verdict: 'none', block: [], route: null, reason })) }, checks: [check] };
	}
	return ctx.nonlinear ? nonlinearContexts(ctx) : linearContexts(ctx);
}

/** Variance of each factor in each context: profile[j][e] (absent = 1). */
function profiles(ctx: EvalContext, contexts: Context[]): number[][] {
	return ctx.factors.map((f) => contexts.map((c) => c.variance[f.id] ?? 1));
}

function proportional(a: number[], b: number[]): boolean {
	for (let e = 1; e < a.length; e++) {
		const lhs = a[e] * b[0];
		const rhs = a[0] * b[e];
		if (Math.abs(lhs - rhs) > PROPORTIONAL_TOLERANCE * Math.max(Math.abs(lhs), Math.abs(rhs))) return false;
	}
	return true;
}

/** Equivalence classes of proportional profiles, as factor indices in plan order. */
function proportionalClasses(v: number[][]): number[][] {
	const classes: number[][] = [];
	v.forEach((profile, j) => {
		const cls = classes.find((c) => proportional(v[c[0]], profile));
		if (cls) cls.push(j);
		else classes.push([j]);
	});
	return classes;
}

function mixedCount(classes: number[][]): number {
	return classes.reduce((s, c) => s + (c.length > 1 ? c.length : 0), 0);
}

function linearContexts(ctx: EvalContext): RouteOutcome {
	const { label } = ctx;
	const ids = ctx.factors.map((f) => f.id);
	const classes = proportionalClasses(profiles(ctx, ctx.contexts));
	const blocks = classes.filter((c) => c.length > 1);
	let fix: Fix | null = null;
	if (blocks.length) {
		// Cheapest unused catalogue context that splits some block.
		const before = mixedCount(classes);
		const helpful = ctx.unusedContexts
			.filter((c) => mixedCount(proportionalClasses(profiles(ctx, [...ctx.contexts, c]))) < before)
			.map((c) => ({ c, cost: addedContextsCost(ctx, [c]) }))
			.sort((a, b) => a.cost - b.cost);
		fix = helpful.length
			? contextFix(ctx, [helpful[0].c], 'it changes the variances of mixed factors in different proportions')
			: { text: blocks.map((blk) => `Add a context that changes the variance of ${label(ids[blk[0]])} but not ${label(ids[blk[1]])}`).join('; ') + '.' };
	}
	const check: Check = {
		id: 'contexts.variance',
		route: 'contexts',
		status: blocks.length ? 'fail' : 'pass',
		message: blocks.length
			? `These factors change their variance across the contexts in the same proportions (or not at all), so they stay mixed: ${blocks.map((blk) => `{${blk.map((j) => label(ids[j])).join(', ')}}`).join('; ')}.`
			: "Every factor's variance changes across the contexts in proportions no other factor shares, so joint diagonalisation can separate them.",
		source: SOURCES.variance,
		factors: blocks.flat().sort((x, y) => x - y).map((j) => ids[j]),
		fix
	};
	const verdicts: FactorVerdict[] = [];
	for (const cls of classes)
		for (const j of cls)
			verdicts[j] =
				cls.length === 1
					? { id: ids[j], verdict: 'individual', block: [ids[j]], route: 'contexts', reason: 'Its variance changes across the contexts in proportions no other factor shares, so joint diagonalisation of the per-context covariances separates it.' }
					: {
							id: ids[j],
							verdict: 'block',
							block: cls.map((i) => ids[i]),
							route: 'contexts',
							reason: `Its variance changes across the contexts in the same proportions as ${listText(cls.filter((i) => i !== j).map((i) => label(ids[i])))}, so they stay mixed.`
						};
	return { verdicts: { route: 'contexts', applicable: true, factors: verdicts }, checks: [check] };
}

interface Modulation {
	/** Sufficient statistics per factor: 1 (variance only) or 2 (mean and variance). */
	k: number;
	/** Rank of the nk × (E − 1) modulation matrix. */
	rank: number;
	/** Contexts change means but no factor's variance. */
	meansOnly: boolean;
}

/**
 * Modulation matrix L (Khemakhem et al. 2020, Theorem 1): for Gaussian factors the natural
 * parameters are λ = (m/v, −1/(2v)) (k = 2) or λ = −1/(2v) (k = 1, means all zero); column e is
 * λ(u_e) − λ(u_0) with u_0 the first context. Exact rank with fractions.
 */
function modulation(ctx: EvalContext, contexts: Context[]): Modulation {
	const k = contexts.some((c) => Object.values(c.mean).some((m) => m !== 0)) ? 2 : 1;
	const v = profiles(ctx, contexts);
	const meansOnly = k === 2 && v.every((p) => p.every((x) => x === p[0]));
	const lambda = (c: Context, id: string): Fraction[] => {
		const variance = exactFraction(c.variance[id] ?? 1);
		const precision = variance.inverse().div(-2);
		return k === 1 ? [precision] : [exactFraction(c.mean[id] ?? 0).div(variance), precision];
	};
	const rows: Fraction[][] = [];
	for (const f of ctx.factors) {
		const base = lambda(contexts[0], f.id);
		const cols = contexts.slice(1).map((c) => lambda(c, f.id).map((x, s) => x.sub(base[s])));
		for (let s = 0; s < k; s++) rows.push(cols.map((col) => col[s]));
	}
	return { k, rank: contexts.length > 1 ? fractionRank(rows) : 0, meansOnly };
}

function nonlinearContexts(ctx: EvalContext): RouteOutcome {
	const ids = ctx.factors.map((f) => f.id);
	const n = ids.length;
	const E = ctx.contexts.length;
	const m = modulation(ctx, ctx.contexts);
	const need = n * m.k;
	const enough = E >= need + 1;
	const ok = enough && m.rank === need && !m.meansOnly;
	let status: Check['status'] = 'pass';
	let message: string;
	let source: string = SOURCES.modulation;
	let fix: Fix | null = null;
	const what = m.k === 2 ? 'means and variances' : 'variances';
	if (m.meansOnly) {
		status = 'fail';
		source = SOURCES.meansOnly;
		message = 'The contexts change only the factor means, not their variances: under nonlinear mixing that recovers the factors only up to a linear map, so all of them form one block.';
		fix = { text: 'Add contexts that also change the variances of the factors, each in different proportions.' };
	} else if (!ok) {
		status = 'fail';
		message = !enough
			? `Nonlinear mixing needs at least n·k + 1 = ${need + 1} contexts (n = ${n} factors, k = ${m.k} for ${what}); the design uses ${E}.`
			: `The ${E} contexts do not change the factors' ${what} independently of each other: the modulation matrix has rank ${m.rank}, it needs ${need} (from at least n·k + 1 = ${need + 1} contexts).`;
		fix = greedyContexts(ctx, m) ?? {
			text: !enough
				? `Add at least ${need + 1 - E} more context${need + 1 - E === 1 ? '' : 's'} (${need + 1} in all) that change the factors' ${what} in different proportions.`
				: `Add or replace contexts so that each factor's ${what} change${m.k === 2 ? '' : 's'} in a pattern no combination of the others repeats.`
		};
	} else message = `The ${E} contexts modulate the ${what} of all ${n} factors independently (modulation matrix of full rank ${need}), enough for nonlinear mixing.`;
	const check: Check = { id: 'contexts.modulation', route: 'contexts', status, message, source, factors: status === 'pass' ? [] : ids, fix };
	const verdicts: FactorVerdict[] = ids.map((id) =>
		m.meansOnly
			? { id, verdict: 'block', block: [...ids], route: 'contexts', reason: 'The contexts change only the factor means, which under nonlinear mixing pins the factors down only jointly, up to a linear map.' }
			: ok
				? { id, verdict: 'individual', block: [id], route: 'contexts', reason: `The contexts modulate every factor's ${what} independently, which recovers it up to a monotone transform under nonlinear mixing.` }
				: { id, verdict: 'none', block: [], route: null, reason: `Under nonlinear mixing the contexts must modulate the factors' ${what} independently (n·k + 1 = ${need + 1} contexts, full-rank modulation); this design falls short.` }
	);
	return { verdicts: { route: 'contexts', applicable: true, factors: verdicts }, checks: [check] };
}

/** Adds unused catalogue contexts one by one when they shrink the rank deficit; a Fix when that closes it. */
function greedyContexts(ctx: EvalContext, start: Modulation): Fix | null {
	const chosen: Context[] = [];
	let deficit = ctx.factors.length * start.k - start.rank + Math.max(0, ctx.factors.length * start.k + 1 - ctx.contexts.length);
	for (const c of ctx.unusedContexts) {
		if (deficit === 0) break;
		const trial = [...ctx.contexts, ...chosen, c];
		const m = modulation(ctx, trial);
		const need = ctx.factors.length * m.k;
		const d = need - m.rank + Math.max(0, need + 1 - trial.length);
		if (d < deficit && !m.meansOnly) {
			chosen.push(c);
			deficit = d;
		}
	}
	return deficit === 0 && chosen.length ? contextFix(ctx, chosen, 'the modulation matrix then has full rank') : null;
}

function contextFix(ctx: EvalContext, extra: Context[], why: string): Fix {
	const cost = addedContextsCost(ctx, extra);
	const names = extra.map((c) => (c.name === c.id ? c.id : `${c.id} (${c.name})`));
	return { text: capitalise(`add context${extra.length === 1 ? '' : 's'} ${listText(names)} (${money(ctx.plan, cost)} more): ${why}.`), cost };
}
