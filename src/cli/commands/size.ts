import type { Command } from '../main';
import { assertKnownFlags, intFlag, UsageError, seedFlag } from '../args';
import { emit, readPlanFile } from '../io';
import type { Plan } from '../../lib/core/plan';
import { sizePlan, SIZE_DEFAULTS, type SizeResult } from '../../lib/core/size';
import { createSizePool, defaultThreads } from '../sizePool';

/** `identiplate size PLAN [--seed N] [--threads N] [--json]`: the cheapest design reaching the goal within budget. */
export const command: Command = {
	summary: 'How big must it be? The cheapest design reaching the recovery goal within budget, with the cost/assurance frontier and MCC curve.',
	usage: 'identiplate size PLAN [--seed N] [--threads N] [--json]',
	async run(args) {
		assertKnownFlags(args, ['json', 'seed', 'threads']);
		if (args.positional.length > 1) throw new UsageError(`expected one PLAN file, got ${args.positional.length} arguments`);
		const plan = readPlanFile(args.positional[0]);
		const seed = seedFlag(args, SIZE_DEFAULTS.seed);
		const threads = intFlag(args, 'threads', defaultThreads(), 1, 64);
		const json = args.flags.has('json');
		const pool = await createSizePool(plan, threads);
		let result: SizeResult;
		try {
			const progress = json
				? undefined
				: (p: { phase: string; evaluations: number; designs: number; message: string }) =>
						process.stderr.write(`\r${p.phase.padEnd(6)} ${String(p.designs).padStart(3)} designs, ${String(p.evaluations).padStart(6)} replicates  ${p.message.slice(0, 60).padEnd(60)}`);
			result = await sizePlan(plan, { seed }, pool.evaluate, progress);
			if (!json) process.stderr.write('\r' + ' '.repeat(100) + '\r');
		} finally {
			await pool.close();
		}
		emit(json, toJson(result), () => toText(plan, result));
	}
};

/**
 * The JSON shape of DESIGN.md plus `budgetNeeded`:
 * { feasible, design: {reagents, replicates, controlsPerPlate, contexts, plates, wells, cost},
 *   assurance: {p, lo, hi}, frontier: [{cost, assurance}], budgetNeeded } — with extra keys
 * (reason, route, costBreakdown, curve, tTest, unreachable, warnings, cautions, seed, evaluations).
 */
export function toJson(r: SizeResult) {
	return {
		feasible: r.feasible,
		design: r.design,
		assurance: r.assurance ? { p: r.assurance.p, lo: r.assurance.lo, hi: r.assurance.hi, reps: r.assurance.reps } : null,
		frontier: r.frontier.map((f) => ({ cost: f.cost, assurance: f.assurance, lo: f.lo, hi: f.hi, design: f.design })),
		budgetNeeded: r.budgetNeeded,
		reason: r.reason,
		route: r.route,
		goal: r.goal,
		cheapest: r.cheapest,
		costBreakdown: r.cost
			? { plates: r.cost.plates, wells: r.cost.wells, plateCost: r.cost.plateCost, reagentCost: r.cost.reagentCost, fixedCost: r.cost.fixedCost, total: r.cost.total, perReagent: r.cost.perReagent }
			: null,
		curve: r.curve,
		tTest: r.tTest.map((t) => ({ id: t.id, effect: t.effect, replicatesNeeded: t.replicatesNeeded, ...(t.note ? { note: t.note } : {}) })),
		unreachable: r.unreachable,
		seed: r.seed,
		evaluations: r.evaluations,
		designsEvaluated: r.designsEvaluated,
		warnings: r.warnings,
		cautions: r.cautions
	};
}

function table(head: string[], rows: string[][]): string[] {
	const widths = head.map((h, k) => Math.max(h.length, ...rows.map((r) => r[k].length)));
	const fmt = (r: string[]) => r.map((x, k) => (k === 0 ? x.padEnd(widths[k]) : x.padStart(widths[k]))).join('  ').trimEnd();
	return [fmt(head), fmt(widths.map((w) => '-'.repeat(w))), ...rows.map(fmt)];
}

export function toText(plan: Plan, r: SizeResult): string {
	const cur = plan.budget.currency;
	const money = (x: number) => `${x.toFixed(2)} ${cur}`;
	const pct = (x: number) => x.toFixed(3);
	const lines: string[] = [plan.title, `route: ${r.route}   goal: MCC ≥ ${r.goal.mcc} with assurance ≥ ${r.goal.assurance}   budget: ${money(plan.budget.total)}   seed: ${r.seed}`, ''];
	lines.push(`${r.feasible ? 'FEASIBLE' : 'NOT FEASIBLE'}: ${r.reason}`);
	if (r.budgetNeeded !== null) lines.push(`budget needed: ${money(r.budgetNeeded)}`);
	for (const u of r.unreachable) lines.push(`  ${u.id}${u.block.length > 1 ? ` (block: ${u.block.join(', ')})` : ''}: ${u.reason}`);
	lines.push('');
	if (r.design && r.cost && r.assurance) {
		lines.push(r.feasible ? 'recommended design:' : 'best design the budget buys:');
		lines.push(`  reagents (${r.design.reagents.length}): ${r.design.reagents.join(', ')}`);
		lines.push(`  contexts: ${r.design.contexts.length ? r.design.contexts.join(', ') : 'baseline only'}`);
		lines.push(`  replicates per reagent and context: ${r.design.replicates}   controls per plate: ${r.design.controlsPerPlate}${r.design.cellsPerWell !== undefined ? `   cells per well: ${r.design.cellsPerWell}` : ''}`);
		lines.push(`  plates: ${r.design.plates}   wells: ${r.design.wells} (${r.cost.treatmentWells} treatment, ${r.cost.controlWells} control)`);
		lines.push(`  cost: ${money(r.cost.total)} = plates ${money(r.cost.plateCost)} + reagents ${money(r.cost.reagentCost)} + fixed ${money(r.cost.fixedCost)}`);
		lines.push(`  assurance: ${pct(r.assurance.p)} (Wilson 95 % ${pct(r.assurance.lo)}–${pct(r.assurance.hi)}, ${r.assurance.reps} replicates)`);
	} else lines.push('no design fits the budget');
	if (r.frontier.length) {
		lines.push('', 'frontier (cost against assurance):');
		lines.push(...table(['cost', 'assurance', 'interval', 'reagents', 'replicates', 'controls'], r.frontier.map((f) => [money(f.cost), pct(f.assurance), `${pct(f.lo)}–${pct(f.hi)}`, String(f.design.reagents.length), String(f.design.replicates), String(f.design.controlsPerPlate)])).map((l) => '  ' + l));
	}
	if (r.curve.length) {
		lines.push('', 'MCC against replicates (chosen reagents and controls):');
		lines.push(...table(['replicates', 'median', '10th pct', 'assurance', 'cost', 'runs'], r.curve.map((c) => [String(c.replicates), pct(c.median), pct(c.p10), pct(c.assurance), money(c.cost), String(c.reps)])).map((l) => '  ' + l));
	}
	if (r.tTest.length) {
		lines.push('', 'classic check: wells per group for a two-sided t-test (α = 0.05, power 0.8) on each reagent’s weakest target:');
		lines.push(...table(['reagent', 'effect d', 'wells'], r.tTest.map((t) => [t.id, t.effect === null ? '—' : t.effect.toFixed(3), t.replicatesNeeded === null ? (t.note ?? '—') : String(t.replicatesNeeded)])).map((l) => '  ' + l));
		lines.push('  (detects each effect on its own; recovering the factors needs the Monte Carlo sizing above)');
	}
	lines.push('', `${r.evaluations} Monte Carlo replicates over ${r.designsEvaluated} designs`);
	if (r.warnings.length) {
		lines.push('', 'warnings:');
		for (const w of r.warnings) lines.push(`  - ${w}`);
	}
	lines.push('', 'cautions:');
	for (const c of r.cautions) lines.push(`  - ${c}`);
	return lines.join('\n');
}
