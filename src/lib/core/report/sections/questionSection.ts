import type { ReportBlock, ReportSection } from '../types';
import { SECTION_TITLES, type ReportContext } from './context';

/** The plan's title, its notes and every section note written in the notebook. */
export function questionSection(ctx: ReportContext): ReportSection {
	const { plan } = ctx;
	const blocks: ReportBlock[] = [];
	const goal = plan.goal;
	const routeWords = goal.route === 'auto' ? 'whichever route recovers the most factors' : `the ${goal.route} route`;
	blocks.push({
		kind: 'paragraph',
		text: `Can ${plan.factors.length} hidden factor${plan.factors.length === 1 ? '' : 's'} be recovered from ${plan.observation.features} measured features per well, each with a recovery score (MCC) of at least ${goal.mcc} and a probability of at least ${goal.assurance} of reaching it, within a budget of ${ctx.money(plan.budget.total)}, using ${routeWords}?`
	});
	blocks.push({ kind: 'heading', text: 'Notes' });
	blocks.push(plan.notes.trim() ? { kind: 'paragraph', text: plan.notes, prose: true } : { kind: 'paragraph', text: 'The plan has no notes.' });
	const sectionNotes = Object.entries(plan.sectionNotes ?? {}).filter(([, t]) => t.trim());
	if (sectionNotes.length) {
		blocks.push({ kind: 'heading', text: 'Notes kept with the notebook sections' });
		for (const [section, note] of sectionNotes) blocks.push({ kind: 'facts', items: [{ label: section, value: note }] });
	}
	return { id: 'question', title: SECTION_TITLES.question, hasResults: true, blocks };
}
