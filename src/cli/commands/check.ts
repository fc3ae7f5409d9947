import type { Command } from '../main';
import { assertKnownFlags, UsageError } from '../args';
import { emit, readPlanFile } from '../io';
import { checkPlan, type CheckResult } from '../../lib/core/identify';
import type { Plan } from '../../lib/core/plan';

/** `identiplate check PLAN [--json]`: identifiability verdicts per factor and every check. */
export const command: Command = {
	summary: 'Can the factors be recovered at all? Per-factor verdicts, checks with sources, and the cheapest fixes.',
	usage: 'identiplate check PLAN [--json]',
	async run(args) {
		assertKnownFlags(args, ['json']);
		if (args.positional.length > 1) throw new UsageError(`expected one PLAN file, got ${args.positional.length} arguments`);
		const plan = readPlanFile(args.positional[0]);
		const result = checkPlan(plan);
		emit(args.flags.has('json'), toJson(result), () => toText(plan, result));
	}
};

/** The JSON shape of DESIGN.md: { route, checks: [{id, status, message, source, fix?}], factors: [{id, verdict, block}] }. */
export function toJson(result: CheckResult) {
	return {
		route: result.route,
		checks: result.checks.map((c) => ({
			id: c.id,
			status: c.status,
			message: c.message,
			source: c.source,
			route: c.route,
			...(c.factors ? { factors: c.factors } : {}),
			...(c.fix ? { fix: c.fix } : {})
		})),
		factors: result.factors.map((f) => ({ id: f.id, verdict: f.verdict, block: f.block, route: f.route, reason: f.reason }))
	};
}

const MARK = { pass: 'ok  ', warn: 'WARN', fail: 'FAIL' } as const;

export function toText(plan: Plan, result: CheckResult): string {
	const lines: string[] = [];
	lines.push(`${plan.title}`);
	lines.push(`route: ${result.route}${plan.goal.route === 'auto' ? ' (auto: the route that recovers the most factors individually)' : ''}`);
	lines.push('');
	const name = new Map(plan.factors.map((f) => [f.id, f.name]));
	const rows = result.factors.map((f) => [f.id, name.get(f.id) ?? '', f.verdict, f.verdict === 'block' ? f.block.join(', ') : '', f.route ?? '—']);
	const head = ['factor', 'name', 'verdict', 'block', 'route'];
	const widths = head.map((h, k) => Math.max(h.length, ...rows.map((r) => r[k].length)));
	const fmt = (r: string[]) => r.map((x, k) => x.padEnd(widths[k])).join('  ').trimEnd();
	lines.push(fmt(head), fmt(widths.map((w) => '-'.repeat(w))), ...rows.map(fmt));
	lines.push('');
	for (const f of result.factors) lines.push(`${f.id}: ${f.reason}`);
	const groups: { title: string; route: string }[] = [
		{ route: 'targeted', title: 'targeted route (reagents with known targets)' },
		{ route: 'contexts', title: 'contexts route (environments)' },
		{ route: 'observational', title: 'observational route (factor shapes)' },
		{ route: 'practical', title: 'practicalities' }
	];
	for (const g of groups) {
		const list = result.checks.filter((c) => c.route === g.route);
		if (!list.length) continue;
		lines.push('', `${g.title}${g.route === result.route ? ' — the route these verdicts rely on' : ''}:`);
		for (const c of list) {
			lines.push(`  ${MARK[c.status]}  ${c.id}  ${c.message}`);
			lines.push(`        source: ${c.source}`);
			if (c.fix) lines.push(`        fix: ${c.fix.text}`);
		}
	}
	const counts = { pass: 0, warn: 0, fail: 0 };
	for (const c of result.checks) counts[c.status]++;
	lines.push('', `${counts.pass} passed, ${counts.warn} warnings, ${counts.fail} failed`, '', 'cautions:');
	for (const c of result.cautions) lines.push(`  - ${c}`);
	return lines.join('\n');
}
