import { effectOn } from '../plan/planHelpers';
import type { Reagent } from '../plan/types';
import type { EvalContext } from './evalContext';
import { combineSuggestions, type Suggestion } from './fixes';
import { listText, reagentLabel } from './labels';
import { SOURCES } from './sources';
import { targetedRankVerdicts } from './targetedRankVerdicts';
import type { Check, FactorVerdict, RouteOutcome } from './types';

/**
 * The targeted route: perturbations with known targets (DESIGN.md "Identifiability checks").
 * Linear mixing: coverage, separation, per-factor rank (structural verdicts, exact rank warning),
 * unknown-target warning. Nonlinear mixing: single-target hard interventions per factor.
 */
export function targetedRoute(ctx: EvalContext): RouteOutcome {
	const known = ctx.used.filter((r) => r.targets !== null);
	const unknown = ctx.used.filter((r) => r.targets === null);
	const checks: Check[] = [];
	if (known.length === 0) {
		const reason = 'No reagent in the design has known targets, so the targeted route cannot pin it down.';
		const cheapest = ctx.unused.find((r) => r.targets !== null) ?? null;
		checks.push({
			id: 'targeted.applicable',
			route: 'targeted',
			status: 'fail',
			message:
				ctx.used.length === 0
					? 'The design has no reagents, so the targeted route has nothing to work with.'
					: `None of the design's ${ctx.used.length} reagents has known targets, so the targeted route has nothing to work with.`,
			source: SOURCES.targetedNone,
			factors: ctx.factors.map((f) => f.id),
			fix: combineSuggestions(ctx, [{ purpose: 'it has known targets', reagent: cheapest, fallback: 'add reagents with known targets' }])
		});
		pushUnknown(ctx, unknown, checks);
		return { verdicts: { route: 'targeted', applicable: false, factors: ctx.factors.map((f) => ({ id: f.id, verdict: 'none', block: [], route: null, reason })) }, checks };
	}
	const outcome = ctx.nonlinear ? hardInterventions(ctx, known) : linearTargeted(ctx, known);
	pushUnknown(ctx, unknown, outcome.checks);
	return outcome;
}

function pushUnknown(ctx: EvalContext, unknown: Reagent[], checks: Check[]) {
	if (unknown.length === 0) return;
	checks.push({
		id: 'targeted.unknown',
		route: 'targeted',
		status: 'warn',
		message: `${listText(unknown.map((r) => (unknown.length > 3 ? r.id : reagentLabel(r))))} ${unknown.length === 1 ? 'has' : 'have'} unknown targets and ${unknown.length === 1 ? 'is' : 'are'} left out of these checks; what ${unknown.length === 1 ? 'it adds' : 'they add'} can only be judged by simulation with sparsity-seeking unmixing.`,
		source: SOURCES.unknown,
		fix: null
	});
}

function linearTargeted(ctx: EvalContext, known: Reagent[]): RouteOutcome {
	const { factors, factorIndex, label } = ctx;
	const d = factors.length;
	const columns = known.map((r) => ({ rows: r.targets!.map((t) => factorIndex.get(t)!), values: r.targets!.map((t) => effectOn(r, t)) }));
	const res = targetedRankVerdicts(d, columns, ctx.skipExact ? { exact: 'skip' } : {});
	const ids = factors.map((f) => f.id);
	const checks: Check[] = [];

	// Coverage: factors no reagent targets.
	const targeted = new Set(known.flatMap((r) => r.targets!));
	const uncovered = ids.filter((id) => !targeted.has(id));
	const uncoveredIndividual = uncovered.filter((id) => res.individual[factorIndex.get(id)!]);
	const uncoveredMixed = uncovered.filter((id) => !res.individual[factorIndex.get(id)!]);
	const coverSuggestions: Suggestion[] = uncovered.map((id) => ({
		purpose: `it targets ${label(id)}`,
		reagent: ctx.unused.find((r) => r.targets?.includes(id)) ?? null,
		fallback: `add a reagent that targets ${label(id)}`
	}));
	checks.push({
		id: 'targeted.coverage',
		route: 'targeted',
		status: uncoveredMixed.length ? 'fail' : uncovered.length ? 'warn' : 'pass',
		message:
			uncovered.length === 0
				? 'Every factor is targeted by at least one reagent.'
				: [
						uncoveredMixed.length
							? `No reagent targets ${listText(uncoveredMixed.map(label))}, and the other reagents do not pin ${uncoveredMixed.length === 1 ? 'it' : 'them'} down either.`
							: '',
						uncoveredIndividual.length
							? `No reagent targets ${listText(uncoveredIndividual.map(label))}; ${uncoveredIndividual.length === 1 ? 'it is' : 'they are'} still pinned down by the reagents that target the other factors, but only while the model holds exactly — a reagent of ${uncoveredIndividual.length === 1 ? 'its' : 'their'} own makes the result robust.`
							: ''
					]
						.filter(Boolean)
						.join(' '),
		source: SOURCES.coverage,
		factors: uncovered,
		fix: combineSuggestions(ctx, coverSuggestions)
	});

	// Separation: factors with identical target-set membership over all reagents.
	const membership: number[][] = ids.map(() => []);
	columns.forEach((col, c) => col.rows.forEach((j) => membership[j].push(c)));
	const signature = new Map<string, string[]>();
	ids.forEach((id, j) => {
		const key = membership[j].join(',');
		const group = signature.get(key);
		if (group) group.push(id);
		else signature.set(key, [id]);
	});
	const groups = [...signature.values()].filter((g) => g.length > 1);
	checks.push({
		id: 'targeted.separation',
		route: 'targeted',
		status: groups.length ? 'fail' : 'pass',
		message: groups.length
			? `No reagent tells apart the factors in ${groups.length === 1 ? 'this group' : 'these groups'}: ${groups.map((g) => `{${g.map(label).join(', ')}}`).join('; ')} — every reagent targets all of a group or none of it.`
			: 'Every pair of factors is told apart by some reagent that targets one of them but not the other.',
		source: SOURCES.separation,
		factors: groups.flat().sort((a, b) => factorIndex.get(a)! - factorIndex.get(b)!),
		fix: combineSuggestions(
			ctx,
			groups.map((g) => {
				const inGroup = new Set(g);
				const splitter = ctx.unused.find((r) => r.targets && r.targets.some((t) => inGroup.has(t)) && !g.every((t) => r.targets!.includes(t))) ?? null;
				const hit = splitter ? g.find((t) => splitter.targets!.includes(t))! : g[0];
				const miss = splitter ? g.find((t) => !splitter.targets!.includes(t))! : g[1];
				return {
					purpose: `it targets ${label(hit)} without ${label(miss)}`,
					reagent: splitter,
					fallback: `add a reagent that targets ${label(g[0])} without ${label(g[1])}`
				};
			})
		)
	});

	// Per-factor rank of the non-targeting reagents' effects.
	const failing = ids.filter((_, j) => !res.individual[j]);
	const rankSuggestions: Suggestion[] = failing.map((id) => {
		const j = factorIndex.get(id)!;
		const need = d - 1 - res.structuralRank[j];
		const others = res.block[j].filter((i) => i !== j).map((i) => ids[i]);
		const otherSet = new Set(others);
		// A column that avoids factor j raises rank(M_j) iff it touches the null-space support
		// (an augmenting path then exists); with one direction missing that makes j individual.
		const reagent = need === 1 ? (ctx.unused.find((r) => r.targets && !r.targets.includes(id) && r.targets.some((t) => otherSet.has(t))) ?? null) : null;
		return {
			purpose: `makes ${label(id)} individual`,
			reagent,
			fallback:
				need === 1
					? `for ${label(id)}, add a reagent that targets ${orText(others)} without ${id}`
					: `for ${label(id)}, add at least ${need} reagents that target ${orText(others)} without ${id}, in different combinations`
		};
	});
	checks.push({
		id: 'targeted.rank',
		route: 'targeted',
		status: failing.length ? 'fail' : 'pass',
		message: failing.length
			? `${listText(failing.map(label))} ${failing.length === 1 ? 'is' : 'are'} not recovered individually: the reagents that do not target ${failing.length === 1 ? 'it' : 'each of them'} leave other factors mixed in (${failing.map((id) => `${id} with ${listText(res.block[factorIndex.get(id)!].filter((i) => ids[i] !== id).map((i) => ids[i]))}`).join('; ')}).`
			: 'For every factor, the reagents that do not target it span all the other factors, so each factor is recovered individually.',
		source: SOURCES.rank,
		factors: failing,
		fix: combineSuggestions(ctx, rankSuggestions)
	});

	// Exact degeneracy of the stated values.
	if (!ctx.skipExact) {
		const degenerate = ids.filter((_, j) => res.exactRank[j] < res.structuralRank[j]);
		const pair = degenerate.length ? proportionalPair(ctx, known) : null;
		checks.push({
			id: 'targeted.exact',
			route: 'targeted',
			status: degenerate.length ? 'warn' : 'pass',
			message: degenerate.length
				? `The stated effect values are exactly degenerate for ${listText(degenerate.map(label))}${pair ? ` (${pair})` : ' (the stated effects cancel exactly, as in a cycle of paired targets with equal effects)'}: the verdicts assume effects that differ slightly, as real ones will, so check the stated values.`
				: 'The stated effect values reach the generic rank for every factor.',
			source: SOURCES.exact,
			factors: degenerate,
			fix: degenerate.length ? { text: 'Check the stated effects; if they really are this alike, add a reagent whose effects on the same targets differ in proportion.' } : null
		});
	}

	const verdicts: FactorVerdict[] = ids.map((id, j) => {
		if (res.individual[j])
			return {
				id,
				verdict: 'individual',
				block: [id],
				route: 'targeted',
				reason: d === 1 ? 'It is the only factor, so the reagent effects pin it down up to sign and scale.' : `The reagents that do not target it span the other ${d - 1} factors, so support-pattern unmixing recovers it up to sign and scale.`
			};
		const members = res.block[j].map((i) => ids[i]);
		const missing = d - 1 - res.structuralRank[j];
		return {
			id,
			verdict: 'block',
			block: members,
			route: 'targeted',
			reason: `Recovered only jointly with ${listText(members.filter((m) => m !== id).map(label))}: the reagents that do not target it leave ${missing} direction${missing === 1 ? '' : 's'} among these factors unresolved.`
		};
	});
	return { verdicts: { route: 'targeted', applicable: true, factors: verdicts }, checks };
}

/** "A, B or C". */
function orText(items: string[]): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} or ${items[items.length - 1]}`;
}

/** First pair of reagents with the same ≥ 2 targets and proportional effects, described. */
function proportionalPair(ctx: EvalContext, known: Reagent[]): string | null {
	for (let a = 0; a < known.length; a++) {
		const ta = known[a].targets!;
		if (ta.length < 2) continue;
		for (let b = a + 1; b < known.length; b++) {
			const tb = known[b].targets!;
			if (tb.length !== ta.length || !ta.every((t) => tb.includes(t))) continue;
			const va = ta.map((t) => effectOn(known[a], t));
			const vb = ta.map((t) => effectOn(known[b], t));
			const prop = va.every((x, k) => {
				const lhs = x * vb[0];
				const rhs = va[0] * vb[k];
				return Math.abs(lhs - rhs) <= 1e-12 * Math.max(Math.abs(lhs), Math.abs(rhs));
			});
			if (prop) {
				const same = va.every((x, k) => x === vb[k]);
				return `${reagentLabel(known[a])} and ${reagentLabel(known[b])} have ${same ? 'identical' : 'proportional'} effects on ${listText(ta.map(ctx.label))}`;
			}
		}
	}
	return null;
}

/**
 * Nonlinear mixing: a factor is recovered individually only through single-target hard
 * interventions (clamps). One suffices for polynomial decoders and for a linear latent model;
 * the nonparametric case needs two distinct ones — clamps to the same value count once.
 */
function hardInterventions(ctx: EvalContext, known: Reagent[]): RouteOutcome {
	const { factors, label } = ctx;
	const ids = factors.map((f) => f.id);
	const clampsOn = (r: Reagent, id: string) => r.kind === 'clamp' && r.targets!.length === 1 && r.targets![0] === id;
	const distinct = ids.map((id) => new Set(known.filter((r) => clampsOn(r, id)).map((r) => effectOn(r, id))).size);
	const none = ids.filter((_, j) => distinct[j] === 0);
	const single = ids.filter((_, j) => distinct[j] === 1);
	const parts: string[] = [];
	if (none.length)
		parts.push(`${listText(none.map(label))} ${none.length === 1 ? 'has' : 'have'} no reagent that clamps ${none.length === 1 ? 'it' : 'each'} alone, and under nonlinear mixing only such hard interventions pin a factor down.`);
	if (single.length)
		parts.push(
			`${listText(single.map(label))} ${single.length === 1 ? 'has' : 'have'} one single-target clamp (value) each: enough for polynomial mixing or a linear latent model, but general nonlinear mixing needs two clamps at different values.`
		);
	const target = none.length ? none : single;
	const suggestions: Suggestion[] = target.map((id) => ({
		purpose: `it clamps ${label(id)} alone`,
		reagent:
			ctx.unused.find(
				(r) => r.targets !== null && clampsOn(r, id) && !known.some((k) => clampsOn(k, id) && effectOn(k, id) === effectOn(r, id))
			) ?? null,
		fallback: `add a clamp reagent that targets only ${label(id)}${none.includes(id) ? '' : ' at a different value'}`
	}));
	const check: Check = {
		id: 'targeted.hard',
		route: 'targeted',
		status: none.length ? 'fail' : single.length ? 'warn' : 'pass',
		message: parts.length ? parts.join(' ') : 'Every factor has at least two single-target clamps at different values, enough even for general nonlinear mixing.',
		source: SOURCES.hard,
		factors: target,
		fix: combineSuggestions(ctx, suggestions)
	};
	const verdicts: FactorVerdict[] = ids.map((id, j) =>
		distinct[j] > 0
			? { id, verdict: 'individual', block: [id], route: 'targeted', reason: `A reagent clamps it alone (a hard intervention), which pins it down under nonlinear mixing${distinct[j] === 1 ? ' when the mixing is polynomial or the latent model linear' : ''}.` }
			: { id, verdict: 'none', block: [], route: null, reason: 'Under nonlinear mixing it needs a reagent that clamps it alone, and the design has none.' }
	);
	return { verdicts: { route: 'targeted', applicable: true, factors: verdicts }, checks: [check] };
}
