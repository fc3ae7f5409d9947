import type { Design } from '../../plan/types';
import type { SimulationSummary } from '../../simulate/types';
import { binValues } from '../chartSvg';
import { formatNumber, formatPercent } from '../formatNumber';
import type { ReportBlock, ReportSection } from '../types';
import { SECTION_TITLES, designRole, emptySection, type ReportContext } from './context';

/** Plain names of the recovery estimators. */
export const ESTIMATOR_WORDS: Record<string, string> = {
	support: 'support-pattern unmixing (targets known)',
	sparse: 'sparsity-seeking unmixing (targets unknown)',
	fastica: 'FastICA',
	jointdiag: 'joint diagonalisation of per-context covariances',
	contrastive: 'contrastive lift followed by a linear unmixing'
};

/** One line describing a design: "12 reagents × 4 replicates, 16 controls per plate, no contexts". */
export function designWords(d: Pick<Design, 'reagents' | 'replicates' | 'controlsPerPlate' | 'contexts' | 'cellsPerWell'>): string {
	return (
		`${d.reagents.length} reagent${d.reagents.length === 1 ? '' : 's'} × ${d.replicates} replicate wells, ${d.controlsPerPlate} controls per plate, ` +
		`${d.contexts.length ? `${d.contexts.length} context${d.contexts.length === 1 ? '' : 's'}` : 'no contexts'}` +
		(d.cellsPerWell !== undefined ? `, ${d.cellsPerWell} cells per well` : '')
	);
}

/** Whether a Wilson interval [lo, hi] clears the goal, misses it, or straddles it. */
export function assuranceWords(a: { p: number; lo: number; hi: number }, goal: number): string {
	if (a.lo >= goal) return `meets the required assurance of ${goal}: the whole 95 % interval lies above it`;
	if (a.hi < goal) return `falls short of the required assurance of ${goal}: the whole 95 % interval lies below it`;
	return a.p >= goal
		? `reaches the required assurance of ${goal} on the point estimate, but the 95 % interval still includes lower values — run more replicates before relying on it`
		: `is below the required assurance of ${goal} on the point estimate, but the 95 % interval still includes it — run more replicates to decide`;
}

/** Monte Carlo recovery of one design: score distribution, assurance and per-factor correlation. */
export function simulationSection(ctx: ReportContext): ReportSection {
	const sim: SimulationSummary | null | undefined = ctx.inputs.simulation;
	if (!sim || sim.reps < 1)
		return emptySection(ctx, 'simulation', 'no Monte Carlo simulation of recovery has been run for this plan.', 'Run the simulation in the notebook, or `identiplate simulate PLAN --reps 200`; `identiplate report` runs one itself.');
	const goal = ctx.plan.goal;
	const blocks: ReportBlock[] = [];
	blocks.push({
		kind: 'paragraph',
		text: `${sim.reps} simulated experiments of ${designRole(ctx, sim.design)} (${designWords(sim.design)}), each drawing new mixing, effects, efficacy and noise, recovered with ${ESTIMATOR_WORDS[sim.estimator] ?? sim.estimator} on the ${sim.route} route. The share of experiments reaching MCC ≥ ${sim.goalMcc} is ${formatPercent(sim.assurance.p)}; it ${assuranceWords(sim.assurance, goal.assurance)}.`
	});
	blocks.push({
		kind: 'facts',
		items: [
			{ label: 'Replicates (simulated experiments)', value: String(sim.reps) },
			{ label: 'Estimator', value: ESTIMATOR_WORDS[sim.estimator] ?? sim.estimator },
			{ label: 'Seed', value: String(sim.seed) },
			{ label: 'MCC mean', value: formatNumber(sim.mcc.mean, 3) },
			{ label: 'MCC median', value: formatNumber(sim.mcc.median, 3) },
			{ label: 'MCC 10th–90th percentile', value: `${formatNumber(sim.mcc.p10, 3)} – ${formatNumber(sim.mcc.p90, 3)}` },
			{ label: `Assurance (MCC ≥ ${sim.goalMcc})`, value: `${formatNumber(sim.assurance.p, 3)} (Wilson 95 %: ${formatNumber(sim.assurance.lo, 3)} – ${formatNumber(sim.assurance.hi, 3)})` },
			{ label: 'Required assurance', value: String(goal.assurance) }
		]
	});
	if (sim.mccs.length) {
		// Bins of width 0.025 from the tenth below the lowest score (or the goal) up to 1.
		const finite = sim.mccs.filter(Number.isFinite);
		const lowest = Math.min(sim.goalMcc, ...finite);
		const lo = Math.max(lowest < 0 ? -1 : 0, Math.floor(lowest * 10 - 1e-9) / 10);
		blocks.push({
			kind: 'chart',
			caption: `Distribution of the recovery score over ${sim.reps} simulated experiments; the dashed line is the goal.`,
			chart: {
				kind: 'histogram',
				title: 'Recovery score (MCC) per simulated experiment',
				xLabel: 'MCC after optimal matching',
				yLabel: 'experiments',
				bins: binValues(finite, lo, 1, Math.max(4, Math.round((1 - lo) / 0.025))),
				rules: [{ axis: 'x', value: sim.goalMcc, label: `goal ${sim.goalMcc}` }]
			}
		});
	}
	if (sim.factors.length) {
		blocks.push({
			kind: 'chart',
			caption: 'Mean |correlation| of each factor with its matched recovered component.',
			chart: {
				kind: 'bars',
				title: 'Recovery per factor',
				valueLabel: 'mean |correlation| with the matched component',
				bars: sim.factors.map((f) => ({ label: ctx.factorName(f.id), value: f.meanCorr })),
				domain: [0, 1],
				rules: [{ axis: 'x', value: sim.goalMcc, label: `goal ${sim.goalMcc}` }]
			}
		});
		const withBlocks = sim.factors.some((f) => f.blockR2 !== undefined);
		blocks.push({
			kind: 'table',
			table: {
				caption: 'Per-factor recovery',
				columns: [{ label: 'Factor' }, { label: 'Mean |correlation|', align: 'right' }, ...(withBlocks ? [{ label: 'Block R²', align: 'right' as const }] : [])],
				rows: sim.factors.map((f) => [ctx.factorLabel(f.id), formatNumber(f.meanCorr, 3), ...(withBlocks ? [formatNumber(f.blockR2, 3)] : [])])
			}
		});
	}
	if (sim.warnings.length) blocks.push({ kind: 'callout', tone: 'warning', title: 'Simulation warnings', items: sim.warnings });
	return { id: 'simulation', title: SECTION_TITLES.simulation, hasResults: true, blocks };
}
