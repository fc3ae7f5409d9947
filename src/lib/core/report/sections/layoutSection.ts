import { plateSvg } from '../../layout/plateSvg';
import { reagentGroupsFromPlan } from '../../layout/reagentGroups';
import type { AssociationStat } from '../../layout/types';
import { formatNumber, formatPercent } from '../formatNumber';
import type { ReportBlock, ReportCell, ReportSection, Tone } from '../types';
import { SECTION_TITLES, emptySection, type ReportContext } from './context';

/** Plate maps drawn by default; the remaining plates are listed (the layout CSV holds every well). */
export const DEFAULT_MAX_PLATE_MAPS = 12;

/** Association read as a tone: below 0.1 good, below 0.3 worth a look, else a problem (common practice for Cramér's V / η²). */
function assocTone(v: number): Tone {
	return v < 0.1 ? 'good' : v < 0.3 ? 'warn' : 'bad';
}

function assocRow(name: string, s: AssociationStat | null, ctx: ReportContext): ReportCell[] {
	if (!s) return [name, '—', '—', 'fewer than two plates share a context', '—'];
	const value = s.measure === 'cramersV' ? (s.corrected ?? s.value) : s.value;
	const measure = s.measure === 'cramersV' ? 'Cramér’s V (bias-corrected)' : 'η² (edge distance)';
	const test = s.test === 'chiSquare' ? `χ² = ${formatNumber(s.statistic, 1)} on ${s.df} df` : `Kruskal–Wallis H = ${formatNumber(s.statistic, 2)} on ${s.df} df`;
	const p = s.pValue < 0.001 ? '< 0.001' : formatNumber(s.pValue, 3);
	return [name + (s.scope ? ` (plates of ${ctx.contextName(s.scope)})` : ''), measure, { text: formatNumber(value, 3), tone: assocTone(value) }, test, p];
}

/** The layout of the report's design: diagnostics and one plate map per plate. */
export function layoutSection(ctx: ReportContext): ReportSection {
	const layout = ctx.inputs.layout;
	if (!layout || layout.plates.length === 0)
		return emptySection(ctx, 'layout', 'no plate layout has been made for this plan.', 'Lay the design out in the notebook, or run `identiplate layout PLAN --csv FILE`; `identiplate report` lays out the adopted or recommended design itself.');
	const { plan } = ctx;
	const d = layout.diagnostics;
	const blocks: ReportBlock[] = [];
	blocks.push({
		kind: 'paragraph',
		text: `${layout.plates.length} plate${layout.plates.length === 1 ? '' : 's'} of ${layout.format} wells (ANSI/SLAS 4-2004 well names), ${layout.excludeEdgeWells ? 'outer ring left empty' : 'outer ring in use'}: ${d.counts.treatment} treatment wells, ${d.counts.control} negative controls, ${d.counts.empty} empty. Positions were randomised with seed ${layout.seed} and then balanced so that no reagent sits preferentially on one plate, row, column or near the edge.`
	});
	blocks.push({
		kind: 'table',
		table: {
			caption: 'Association of treatment with position (0 = none; the largest over groups of plates)',
			columns: [{ label: 'Position' }, { label: 'Measure' }, { label: 'Value', align: 'right' }, { label: 'Test' }, { label: 'p', align: 'right' }],
			rows: [assocRow('plate', d.maxAssociation.plate, ctx), assocRow('row', d.maxAssociation.row, ctx), assocRow('column', d.maxAssociation.column, ctx), assocRow('edge distance', d.maxAssociation.edge, ctx)]
		}
	});
	const spread = d.replicateSpread;
	blocks.push({
		kind: 'facts',
		items: [
			{ label: 'Controls per usable row', value: `${d.controlsPerRow.min}–${d.controlsPerRow.max}` },
			{ label: 'Controls per usable column', value: `${d.controlsPerColumn.min}–${d.controlsPerColumn.max}` },
			{ label: 'Replicates spread over plates', value: `${formatPercent(spread.distinctPlates)} of ${spread.groups} reagent × context groups as evenly as the plate count allows` },
			{ label: 'Replicates on distinct rows / columns', value: `${formatPercent(spread.distinctRows)} / ${formatPercent(spread.distinctColumns)} of the groups` },
			...(d.optimiser ? [{ label: 'Balancing', value: `imbalance score ${formatNumber(d.optimiser.initialScore, 3)} → ${formatNumber(d.optimiser.finalScore, 3)} (about 6 for a random placement, 0 for a perfectly balanced one)` }] : [])
		]
	});
	if (d.warnings.length) blocks.push({ kind: 'callout', tone: 'warning', title: 'Layout warnings', items: d.warnings });
	const max = ctx.inputs.maxPlateMaps ?? DEFAULT_MAX_PLATE_MAPS;
	const options = {
		names: Object.fromEntries(plan.reagents.map((r) => [r.id, r.name])),
		contextNames: Object.fromEntries(plan.contexts.map((c) => [c.id, c.name])),
		groups: reagentGroupsFromPlan(plan)
	};
	const shown = layout.plates.slice(0, Math.max(0, max));
	for (const p of shown)
		blocks.push({
			kind: 'plateMap',
			caption: `Plate ${p.index} of ${layout.plates.length}${p.context ? ` — context ${ctx.contextName(p.context)}` : ''}`,
			svg: plateSvg(layout, p.index, options)
		});
	if (shown.length < layout.plates.length)
		blocks.push({
			kind: 'callout',
			tone: 'note',
			title: 'More plates',
			items: [`Plate maps ${shown.length + 1}–${layout.plates.length} are not drawn here to keep the report short; the layout CSV (\`identiplate layout PLAN --csv FILE\`) lists every well.`]
		});
	return { id: 'layout', title: SECTION_TITLES.layout, hasResults: true, blocks };
}
