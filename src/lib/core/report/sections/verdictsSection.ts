import type { CheckStatus, Verdict } from '../../identify/types';
import type { ReportBlock, ReportSection, Tone } from '../types';
import { SECTION_TITLES, designRole, joinWords, type ReportContext } from './context';

const STATUS: Record<CheckStatus, { text: string; tone: Tone }> = {
	pass: { text: 'pass', tone: 'good' },
	warn: { text: 'warning', tone: 'warn' },
	fail: { text: 'fail', tone: 'bad' }
};

const VERDICT: Record<Verdict, { text: string; tone: Tone }> = {
	individual: { text: 'individually', tone: 'good' },
	block: { text: 'only as a block', tone: 'warn' },
	none: { text: 'not at all', tone: 'bad' }
};

/** The verdict per factor with reasons, and every check with its finding, source and cheapest fix. */
export function verdictsSection(ctx: ReportContext): ReportSection {
	const { check } = ctx.inputs;
	const blocks: ReportBlock[] = [];
	const counts = { individual: 0, block: 0, none: 0 };
	for (const f of check.factors) counts[f.verdict]++;
	const d = check.design;
	blocks.push({
		kind: 'paragraph',
		text:
			`Checked exactly for ${designRole(ctx, d)}: ${d.reagents.length} reagent${d.reagents.length === 1 ? '' : 's'}, ${d.replicates} replicate wells each` +
			`${d.contexts.length ? ` in ${d.contexts.length} contexts` : ''} and ${d.controlsPerPlate} controls per plate, on the ${check.route} route` +
			`${ctx.plan.goal.route === 'auto' ? ' (chosen automatically: it recovers the most factors individually)' : ''}. ` +
			`${counts.individual} of ${check.factors.length} factors can be recovered individually` +
			`${counts.block ? `, ${counts.block} only jointly with others` : ''}${counts.none ? `, ${counts.none} not at all` : ''}.`
	});
	blocks.push({
		kind: 'table',
		table: {
			caption: 'Verdict per factor (recovered up to sign and scale)',
			columns: [{ label: 'Factor' }, { label: 'Recovered' }, { label: 'Together with' }, { label: 'Route' }, { label: 'Why' }],
			rows: check.factors.map((f) => [
				ctx.factorLabel(f.id),
				VERDICT[f.verdict],
				f.verdict === 'block' ? joinWords(f.block.filter((b) => b !== f.id).map(ctx.factorName)) : '—',
				f.route ?? '—',
				f.reason
			])
		}
	});
	const failing = check.checks.filter((c) => c.status !== 'pass').length;
	blocks.push({ kind: 'heading', text: `Checks (${check.checks.length}; ${failing} need attention)` });
	blocks.push({
		kind: 'table',
		table: {
			caption: 'Identifiability and practical checks, with the published result or practice behind each',
			columns: [{ label: 'Status' }, { label: 'Check' }, { label: 'Finding' }, { label: 'Source' }, { label: 'Cheapest fix found' }],
			rows: check.checks.map((c) => [
				STATUS[c.status],
				{ text: c.id, mono: true },
				c.message,
				c.source,
				c.fix ? c.fix.text + (c.fix.cost !== undefined ? ` (${c.fix.cost >= 0 ? '+' : ''}${ctx.money(c.fix.cost)})` : '') : '—'
			])
		}
	});
	return { id: 'verdicts', title: SECTION_TITLES.verdicts, hasResults: true, blocks };
}
