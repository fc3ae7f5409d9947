import { diffPlans } from '../diffPlans';
import type { ReportBlock, ReportRevision, ReportSection } from '../types';
import { SECTION_TITLES, emptySection, type ReportContext } from './context';

/** Changes listed per revision at most; the rest are counted. */
export const MAX_CHANGES_SHOWN = 40;

/** "2025-03-04 12:30 UTC" from milliseconds since 1970 or ISO text; the text itself when it is not a date. */
export function formatUtc(when: number | string): string {
	const ms = typeof when === 'number' ? when : Date.parse(when);
	if (!Number.isFinite(ms)) return String(when);
	const iso = new Date(ms).toISOString();
	return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

function changeItems(changes: { text: string }[]): string[] {
	const items = changes.slice(0, MAX_CHANGES_SHOWN).map((c) => c.text);
	if (changes.length > MAX_CHANGES_SHOWN) items.push(`… and ${changes.length - MAX_CHANGES_SHOWN} more changes`);
	return items;
}

/** Every saved revision with what changed since the previous one, and the working copy against the last. */
export function revisionsSection(ctx: ReportContext): ReportSection {
	const revisions: ReportRevision[] = [...(ctx.inputs.revisions ?? [])].sort((a, b) => a.number - b.number);
	if (!revisions.length)
		return emptySection(ctx, 'revisions', 'no revision of this plan has been saved, so there is no history to compare.', 'Save a revision in the notebook at each milestone (before ordering, after sizing, after a pilot); each one is kept unchanged.');
	const blocks: ReportBlock[] = [];
	blocks.push({ kind: 'paragraph', text: `${revisions.length} saved revision${revisions.length === 1 ? '' : 's'}, oldest first. Each lists the field-level changes from the revision before it.` });
	revisions.forEach((rev, i) => {
		blocks.push({ kind: 'heading', text: `Revision ${rev.number}: ${rev.label} (${formatUtc(rev.createdAt)})` });
		if (i === 0) blocks.push({ kind: 'paragraph', text: 'The first saved revision: the starting point of the history.' });
		else {
			const changes = diffPlans(revisions[i - 1].plan, rev.plan);
			blocks.push(changes.length ? { kind: 'list', items: changeItems(changes) } : { kind: 'paragraph', text: `No input changed since revision ${revisions[i - 1].number}.` });
		}
	});
	const last = revisions[revisions.length - 1];
	const now = diffPlans(last.plan, ctx.plan);
	blocks.push({ kind: 'heading', text: `This report’s plan against revision ${last.number}` });
	blocks.push(now.length ? { kind: 'list', items: changeItems(now) } : { kind: 'paragraph', text: `The plan in this report equals revision ${last.number}.` });
	return { id: 'revisions', title: SECTION_TITLES.revisions, hasResults: true, blocks };
}
