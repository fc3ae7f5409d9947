import { formatNumber, formatPercent } from '../formatNumber';
import type { Reagent } from '../../plan/types';
import type { ReportBlock, ReportSection } from '../types';
import { SECTION_TITLES, joinWords, type ReportContext } from './context';

/** Plain words for each factor shape. */
export const SHAPE_WORDS: Record<string, string> = {
	gaussian: 'Gaussian (bell-shaped)',
	laplace: 'Laplace (sharp peak, heavy tails)',
	uniform: 'uniform (flat, bounded)',
	bimodal: 'two-peaked (bimodal)'
};

/** What a reagent does, in words: "shifts Membrane stress by 1.2 SD". */
export function reagentEffectWords(ctx: ReportContext, r: Reagent): string {
	const size = (t: string) => formatNumber(typeof r.effect === 'number' ? r.effect : (r.effect[t] ?? 0), 2);
	if (r.targets === null) {
		const e = typeof r.effect === 'number' ? formatNumber(r.effect, 2) : 'the stated amounts';
		const verb = r.kind === 'shift' ? `shifts them by ${e} SD` : r.kind === 'clamp' ? `holds them at ${e} SD` : `scales their spread by a factor 1 + ${e}`;
		return `targets unknown (about ${r.expectedTargets ?? '?'}); ${verb}`;
	}
	if (r.targets.length === 0) return 'no targets';
	const parts = r.targets.map((t) => (r.kind === 'shift' ? `${ctx.factorName(t)} by ${size(t)} SD` : r.kind === 'clamp' ? `${ctx.factorName(t)} at ${size(t)} SD` : `${ctx.factorName(t)} by a factor 1 + ${size(t)}`));
	const verb = r.kind === 'shift' ? 'shifts' : r.kind === 'clamp' ? 'holds (hard intervention)' : 'scales the spread of';
	return `${verb} ${joinWords(parts)}`;
}

/** The plan's inputs as tables, and what they assume in plain words. */
export function inputsSection(ctx: ReportContext): ReportSection {
	const { plan } = ctx;
	const o = plan.observation;
	const b = plan.budget;
	const blocks: ReportBlock[] = [];

	blocks.push({ kind: 'heading', text: 'Assumptions in plain words' });
	const assumptions: string[] = [];
	assumptions.push(
		o.mixing === 'linear'
			? `Each of the ${o.features} features is a fixed weighted sum (a linear mixture) of the ${plan.factors.length} factors, plus noise.`
			: `The ${o.features} features are a mildly nonlinear but invertible mixture of the ${plan.factors.length} factors (strength λ = ${formatNumber(o.nonlinearity, 2)}), plus noise.`
	);
	assumptions.push(`Replicate wells of the same treatment differ by well-to-well noise of SD ${formatNumber(o.replicateNoise, 2)} in factor units (one unit = one SD of a factor).`);
	assumptions.push(`Each feature carries measurement noise of SD ${formatNumber(o.measurementNoise, 2)}, and every plate shifts all features by a random offset of SD ${formatNumber(o.plateEffect, 2)}.`);
	assumptions.push(o.cellsPerWell > 0 ? `${o.cellsPerWell} cells are imaged per well and averaged into the well profile.` : 'The simulation works with well profiles only (no single-cell data).');
	const unknown = plan.reagents.filter((r) => r.targets === null);
	assumptions.push(
		unknown.length
			? `${plan.reagents.length - unknown.length} reagents act on known factors; ${unknown.length} have unknown targets (only the expected number is stated), so only the simulation can judge them.`
			: 'Every reagent acts only on the factors listed as its targets, by the stated amount, in the stated share of wells (efficacy).'
	);
	const uncertain = plan.reagents.filter((r) => (r.effectCv ?? 0) > 0).length;
	assumptions.push(uncertain ? `The effect sizes are uncertain: ${uncertain} of ${plan.reagents.length} reagents carry a stated relative uncertainty that the Monte Carlo draws from.` : 'The effect sizes are taken as exact: no uncertainty was stated for them.');
	assumptions.push(
		plan.contexts.length
			? `${plan.contexts.length} context${plan.contexts.length === 1 ? '' : 's'} change the factors’ means or variances as tabulated below.`
			: 'All wells share one environment (no contexts).'
	);
	blocks.push({ kind: 'list', items: assumptions });

	blocks.push({ kind: 'heading', text: 'Factors' });
	blocks.push({
		kind: 'table',
		table: {
			caption: 'Hypothesised factors and their distribution shape',
			columns: [{ label: 'Factor' }, { label: 'Id' }, { label: 'Shape' }],
			rows: plan.factors.map((f) => [f.name, { text: f.id, mono: true }, SHAPE_WORDS[f.shape] ?? f.shape])
		}
	});

	blocks.push({ kind: 'heading', text: 'Measurement, budget and goal' });
	blocks.push({
		kind: 'facts',
		items: [
			{ label: 'Features per well', value: String(o.features) },
			{ label: 'Mixing', value: o.mixing === 'linear' ? 'linear' : `nonlinear, λ = ${formatNumber(o.nonlinearity, 2)}` },
			{ label: 'Cells per well', value: o.cellsPerWell > 0 ? String(o.cellsPerWell) : 'well level only' },
			{ label: 'Replicate noise (SD)', value: formatNumber(o.replicateNoise, 3) },
			{ label: 'Measurement noise (SD)', value: formatNumber(o.measurementNoise, 3) },
			{ label: 'Plate effect (SD)', value: formatNumber(o.plateEffect, 3) },
			{ label: 'Budget', value: ctx.money(b.total) },
			{ label: 'Plates', value: `${b.plateFormat}-well at ${ctx.money(b.plateCost)} each; outer ring ${b.excludeEdgeWells ? 'left empty' : 'in use'}` },
			{ label: 'Fixed costs', value: ctx.money(b.fixedCost) },
			{ label: 'Controls per plate', value: String(b.controlsPerPlate) },
			{ label: 'Goal', value: `MCC ≥ ${plan.goal.mcc} with assurance ≥ ${plan.goal.assurance}` },
			{ label: 'Route', value: plan.goal.route === 'auto' ? 'auto (the route that recovers the most factors)' : plan.goal.route },
			{
				label: 'Design',
				value: plan.design
					? `fixed in the plan: ${plan.design.reagents.length} reagents × ${plan.design.replicates} replicates, ${plan.design.controlsPerPlate} controls per plate, ${plan.design.contexts.length ? plan.design.contexts.length + ' contexts' : 'no contexts'}`
					: 'not fixed: sizing chooses one'
			}
		]
	});
	if (plan.contexts.length) {
		blocks.push({ kind: 'heading', text: 'Contexts' });
		blocks.push({
			kind: 'table',
			table: {
				caption: 'Contexts: changed factor means (default 0) and variances (default 1)',
				columns: [{ label: 'Context' }, { label: 'Id' }, { label: 'Applied to' }, { label: 'Means' }, { label: 'Variances' }],
				rows: plan.contexts.map((c) => [
					c.name,
					{ text: c.id, mono: true },
					c.level === 'plate' ? 'whole plates' : 'single wells',
					Object.entries(c.mean).map(([f, v]) => `${ctx.factorName(f)} ${formatNumber(v, 2)}`).join('; ') || '—',
					Object.entries(c.variance).map(([f, v]) => `${ctx.factorName(f)} ${formatNumber(v, 2)}`).join('; ') || '—'
				])
			}
		});
	}

	blocks.push({ kind: 'heading', text: 'Reagents' });
	blocks.push({
		kind: 'table',
		table: {
			caption: `Reagent catalogue (${plan.reagents.length}); effects in factor SD units, cost in ${b.currency}`,
			columns: [{ label: 'Reagent' }, { label: 'Id' }, { label: 'What it does' }, { label: 'Uncertainty', align: 'right' }, { label: 'Efficacy', align: 'right' }, { label: 'Cost/well', align: 'right' }, { label: 'Stock (wells)', align: 'right' }],
			rows: plan.reagents.map((r) => [
				r.name,
				{ text: r.id, mono: true },
				reagentEffectWords(ctx, r),
				r.effectCv ? `±${formatPercent(r.effectCv)}` : '—',
				formatPercent(r.efficacy),
				formatNumber(r.costPerWell, 2),
				r.maxWells === undefined ? 'no limit' : String(r.maxWells)
			])
		}
	});

	return { id: 'inputs', title: SECTION_TITLES.inputs, hasResults: true, blocks };
}
