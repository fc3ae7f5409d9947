import { formatNumber } from '../formatNumber';
import type { ReportBlock, ReportSection } from '../types';
import { SECTION_TITLES, emptySection, type ReportContext } from './context';
import { assuranceWords, designWords } from './simulationSection';

/** The sizing search: verdict, frontier of cost against assurance, curve against replicates, t-test check. */
export function sizingSection(ctx: ReportContext): ReportSection {
	const s = ctx.inputs.sizing;
	if (!s)
		return emptySection(
			ctx,
			'sizing',
			ctx.plan.design ? 'the plan fixes its design, so no sizing search was run for it.' : 'no sizing search has been run for this plan.',
			ctx.plan.design ? 'Clear the fixed design and size the plan (notebook, or `identiplate size PLAN`) to see the cheapest design and the frontier.' : 'Size the plan in the notebook, or run `identiplate size PLAN`; `identiplate report` sizes plans without a fixed design itself.'
		);
	const goal = s.goal;
	const blocks: ReportBlock[] = [];
	blocks.push({ kind: 'callout', tone: s.feasible ? 'note' : 'warning', title: s.feasible ? 'Feasible within the budget' : 'Not feasible within the budget', items: [s.reason] });
	const facts = [
		{ label: 'Route', value: s.route },
		{ label: 'Goal', value: `MCC ≥ ${goal.mcc} with assurance ≥ ${goal.assurance}` },
		{ label: 'Budget', value: ctx.money(ctx.plan.budget.total) }
	];
	if (s.design && s.assurance) {
		facts.push({ label: s.feasible ? 'Recommended design' : 'Best design the budget buys', value: designWords(s.design) });
		facts.push({ label: 'Its cost', value: `${ctx.money(s.design.cost)} (${s.design.plates} plate${s.design.plates === 1 ? '' : 's'}, ${s.design.wells} wells)` });
		facts.push({ label: 'Its assurance', value: `${formatNumber(s.assurance.p, 3)} (Wilson 95 %: ${formatNumber(s.assurance.lo, 3)} – ${formatNumber(s.assurance.hi, 3)}, ${s.assurance.reps} simulated experiments); it ${assuranceWords(s.assurance, goal.assurance)}` });
	} else facts.push({ label: 'Design', value: 'no design fits the budget' });
	if (s.budgetNeeded !== null) facts.push({ label: 'Budget the goal needs', value: ctx.money(s.budgetNeeded) });
	facts.push({ label: 'Search effort', value: `${s.evaluations} simulated experiments over ${s.designsEvaluated} designs (seed ${s.seed})` });
	blocks.push({ kind: 'facts', items: facts });
	if (s.unreachable.length)
		blocks.push({
			kind: 'callout',
			tone: 'warning',
			title: 'Factors no choice of reagents and contexts recovers individually',
			items: s.unreachable.map((u) => `${ctx.factorLabel(u.id)}${u.block.length > 1 ? ` (block with ${u.block.filter((b) => b !== u.id).map(ctx.factorName).join(', ')})` : ''}: ${u.reason}`)
		});

	if (s.frontier.length) {
		blocks.push({ kind: 'heading', text: 'Frontier: cost against assurance' });
		// The budget line is drawn when it lies near the frontier; far to the right it would squeeze the points.
		const maxCost = Math.max(...s.frontier.map((f) => f.cost));
		const budget = ctx.plan.budget.total;
		const showBudget = budget <= 1.5 * maxCost;
		blocks.push({
			kind: 'chart',
			caption: `Each point is a design that no cheaper design beats on assurance; bars are Wilson 95 % intervals. Dashed lines: the required assurance${showBudget ? ' and the budget' : `; the budget (${ctx.money(budget)}) lies beyond the right edge`}.`,
			chart: {
				kind: 'xy',
				title: 'Assurance against cost',
				xLabel: `design cost (${ctx.plan.budget.currency})`,
				yLabel: 'assurance',
				series: [{ label: 'frontier designs', points: s.frontier.map((f) => ({ x: f.cost, y: f.assurance, lo: f.lo, hi: f.hi })), line: true, marker: 'circle', style: 0 }],
				rules: [{ axis: 'y', value: goal.assurance, label: `required ${goal.assurance}` }, ...(showBudget ? [{ axis: 'x' as const, value: budget, label: 'budget' }] : [])],
				yDomain: [0, 1]
			}
		});
		blocks.push({
			kind: 'table',
			table: {
				caption: 'Frontier designs, cheapest first',
				columns: [{ label: 'Cost', align: 'right' }, { label: 'Assurance', align: 'right' }, { label: 'Wilson 95 %', align: 'right' }, { label: 'Reagents', align: 'right' }, { label: 'Replicates', align: 'right' }, { label: 'Controls/plate', align: 'right' }, { label: 'Plates', align: 'right' }],
				rows: s.frontier.map((f) => [ctx.money(f.cost), formatNumber(f.assurance, 3), `${formatNumber(f.lo, 3)} – ${formatNumber(f.hi, 3)}`, String(f.design.reagents.length), String(f.design.replicates), String(f.design.controlsPerPlate), String(f.design.plates)])
			}
		});
	}

	if (s.curve.length) {
		blocks.push({ kind: 'heading', text: 'Recovery against replicate wells' });
		const pts = [...s.curve].sort((a, b) => a.replicates - b.replicates);
		blocks.push({
			kind: 'chart',
			caption: 'Median and 10th percentile of the recovery score as replicate wells per reagent grow, for the chosen reagents and controls. Dashed line: the goal.',
			chart: {
				kind: 'xy',
				title: 'Recovery score against replicates',
				xLabel: 'replicate wells per reagent and context',
				yLabel: 'MCC',
				series: [
					{ label: 'median MCC', points: pts.map((c) => ({ x: c.replicates, y: c.median })), line: true, marker: 'circle', style: 0 },
					{ label: '10th percentile', points: pts.map((c) => ({ x: c.replicates, y: c.p10 })), line: true, marker: 'square', style: 1 }
				],
				rules: [{ axis: 'y', value: goal.mcc, label: `goal ${goal.mcc}` }],
				xIntegers: true
			}
		});
		blocks.push({
			kind: 'chart',
			caption: 'Assurance (share of simulated experiments reaching the goal) against replicate wells, with Wilson 95 % intervals.',
			chart: {
				kind: 'xy',
				title: 'Assurance against replicates',
				xLabel: 'replicate wells per reagent and context',
				yLabel: 'assurance',
				series: [{ label: 'assurance', points: pts.map((c) => ({ x: c.replicates, y: c.assurance, lo: c.lo, hi: c.hi })), line: true, marker: 'triangle', style: 2 }],
				rules: [{ axis: 'y', value: goal.assurance, label: `required ${goal.assurance}` }],
				yDomain: [0, 1],
				xIntegers: true
			}
		});
		blocks.push({
			kind: 'table',
			table: {
				caption: 'Curve points',
				columns: [{ label: 'Replicates', align: 'right' }, { label: 'Median MCC', align: 'right' }, { label: '10th pct', align: 'right' }, { label: 'Assurance', align: 'right' }, { label: 'Wilson 95 %', align: 'right' }, { label: 'Cost', align: 'right' }, { label: 'Runs', align: 'right' }],
				rows: pts.map((c) => [String(c.replicates), formatNumber(c.median, 3), formatNumber(c.p10, 3), formatNumber(c.assurance, 3), `${formatNumber(c.lo, 3)} – ${formatNumber(c.hi, 3)}`, ctx.money(c.cost), String(c.reps)])
			}
		});
	}

	if (s.tTest.length) {
		blocks.push({ kind: 'heading', text: 'Classic check: detecting each effect on its own' });
		blocks.push({
			kind: 'paragraph',
			text: 'Wells per group that a two-sided two-sample t-test (α = 0.05, power 0.8) needs to detect each reagent’s weakest effect against the negative controls. This sees one effect at a time; recovering the factors needs the Monte Carlo sizing above.'
		});
		blocks.push({
			kind: 'table',
			table: {
				caption: 'Per-reagent t-test check',
				columns: [{ label: 'Reagent' }, { label: 'Effect d', align: 'right' }, { label: 'Wells per group', align: 'right' }],
				rows: s.tTest.map((t) => [ctx.reagentLabel(t.id), formatNumber(t.effect, 3), t.replicatesNeeded === null ? (t.note ?? '—') : String(t.replicatesNeeded)])
			}
		});
	}
	if (s.warnings.length) blocks.push({ kind: 'callout', tone: 'warning', title: 'Sizing warnings', items: s.warnings });
	return { id: 'sizing', title: SECTION_TITLES.sizing, hasResults: true, blocks };
}
