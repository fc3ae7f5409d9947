import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Command } from '../main';
import { assertKnownFlags, stringFlag, UsageError, seedFlag } from '../args';
import { emit, InputError, readPlanFile, writeOutput } from '../io';
import {
	LayoutError,
	layoutCsv,
	layoutDesign,
	layoutSummary,
	plateSvg,
	printableLayoutHtml,
	reagentGroupsFromPlan,
	PLATE_SHEET_CAUTION,
	type AssociationStat,
	type Layout
} from '../../lib/core/layout';
import type { Plan } from '../../lib/core/plan';

/**
 * `identiplate layout PLAN --csv FILE [--seed N] [--svg DIR] [--out FILE.html] [--json]`:
 * lays the plan's design (or the default design) out on plates, writes the CSV, optionally one
 * SVG plate map per plate and a printable HTML page, and prints `{ plates, wells, diagnostics }`
 * (`wells` = treatment + control wells; empty wells are not counted).
 */
export const command: Command = {
	summary: 'Where does each well go? Seeded, balanced plate layout with diagnostics; writes the CSV (and SVG plate maps).',
	usage: 'identiplate layout PLAN --csv FILE [--seed N] [--svg DIR] [--out FILE.html] [--json]',
	async run(args) {
		assertKnownFlags(args, ['json', 'csv', 'seed', 'svg', 'out']);
		if (args.positional.length > 1) throw new UsageError(`expected one PLAN file, got ${args.positional.length} arguments`);
		const csvFile = stringFlag(args, 'csv');
		if (!csvFile) throw new UsageError('--csv FILE is required (where to write the layout CSV)');
		const seed = seedFlag(args);
		const svgDir = stringFlag(args, 'svg');
		const htmlFile = stringFlag(args, 'out');
		const planFile = args.positional[0];
		const plan = readPlanFile(planFile);
		let layout: Layout;
		try {
			layout = layoutDesign(plan, plan.design, { seed });
		} catch (err) {
			if (err instanceof LayoutError) throw new InputError(`${planFile}: ${err.message}`);
			throw err;
		}
		writeOutput(csvFile, layoutCsv(layout));
		const options = {
			names: Object.fromEntries(plan.reagents.map((r) => [r.id, r.name])),
			contextNames: Object.fromEntries(plan.contexts.map((c) => [c.id, c.name])),
			groups: reagentGroupsFromPlan(plan),
			planTitle: plan.title
		};
		const svgFiles: string[] = [];
		if (svgDir) {
			try {
				mkdirSync(svgDir, { recursive: true });
			} catch (err) {
				throw new InputError(`${svgDir}: cannot create the SVG directory (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`);
			}
			const width = String(layout.plates.length).length;
			for (const p of layout.plates) {
				const file = join(svgDir, `plate-${String(p.index).padStart(width, '0')}.svg`);
				writeOutput(file, plateSvg(layout, p.index, options));
				svgFiles.push(file);
			}
		}
		if (htmlFile) writeOutput(htmlFile, printableLayoutHtml(layout, { ...options, document: true }));
		emit(args.flags.has('json'), layoutSummary(layout), () => toText(plan, layout, csvFile, svgFiles, htmlFile));
	}
};

function assocLine(name: string, s: AssociationStat | null): string {
	if (!s) return `  ${name.padEnd(7)}—  (fewer than two plates share a context)`;
	const p = s.pValue < 0.001 ? s.pValue.toExponential(1) : s.pValue.toFixed(3);
	const scope = s.scope ? `  [plates of context ${s.scope}]` : '';
	return s.measure === 'cramersV'
		? `  ${name.padEnd(7)}Cramér's V ${s.value.toFixed(3)} (bias-corrected ${(s.corrected ?? 0).toFixed(3)}), chi-square ${s.statistic.toFixed(1)} on ${s.df} df, p = ${p}${scope}`
		: `  ${name.padEnd(7)}eta² ${s.value.toFixed(3)}, Kruskal–Wallis H ${s.statistic.toFixed(2)} on ${s.df} df, p = ${p}${scope}`;
}

export function toText(plan: Plan, layout: Layout, csvFile: string, svgFiles: string[], htmlFile: string | undefined): string {
	const d = layout.diagnostics;
	const pct = (x: number) => `${Math.round(x * 100)}%`;
	const lines = [
		plan.title,
		`${layout.plates.length} plate${layout.plates.length > 1 ? 's' : ''} of ${layout.format} wells (${layout.excludeEdgeWells ? 'edge excluded' : 'edge in use'}), ${d.counts.treatment} treatment and ${d.counts.control} control wells, seed ${layout.seed}`,
		`wrote ${csvFile}${svgFiles.length ? `, ${svgFiles.length} SVG plate map${svgFiles.length > 1 ? 's' : ''}` : ''}${htmlFile ? `, ${htmlFile}` : ''}`,
		'',
		'association of treatment with position (0 = none):',
		assocLine('plate', d.maxAssociation.plate),
		assocLine('row', d.maxAssociation.row),
		assocLine('column', d.maxAssociation.column),
		assocLine('edge', d.maxAssociation.edge),
		`controls per usable row: ${d.controlsPerRow.min}–${d.controlsPerRow.max}; per usable column: ${d.controlsPerColumn.min}–${d.controlsPerColumn.max}`,
		`replicate spread over ${d.replicateSpread.groups} reagent×context groups: ${pct(d.replicateSpread.distinctPlates)} as even over plates as possible, ${pct(d.replicateSpread.distinctRows)} on distinct rows, ${pct(d.replicateSpread.distinctColumns)} on distinct columns within each plate`
	];
	if (d.optimiser)
		lines.push(`optimiser: imbalance score ${d.optimiser.initialScore.toFixed(3)} → ${d.optimiser.finalScore.toFixed(3)} (${d.optimiser.iterations} proposals, ${d.optimiser.accepted} swaps; 0 = as balanced as whole wells allow, random placements score up to about 6)`);
	if (d.warnings.length) lines.push('', 'warnings:', ...d.warnings.map((w) => `  - ${w}`));
	lines.push('', `caution: ${PLATE_SHEET_CAUTION}`);
	return lines.join('\n');
}
