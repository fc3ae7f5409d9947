import { formatNumber } from '../formatNumber';
import type { ReportBlock, ReportSection, Tone } from '../types';
import { SECTION_TITLES, emptySection, type ReportContext } from './context';

/**
 * Reading of Z′ (Zhang, Chung & Oldenburg 1999, J Biomol Screen 4:67–73): Z′ ≥ 0.5 is an
 * excellent assay, and in most cases Z′ > 0.5 is required for screening (verified, IUPAC Gold
 * Book summary; REFERENCES.md); the 0–0.5 band and Z′ ≤ 0 readings follow the same paper's
 * categories (from memory).
 */
export function zPrimeWords(z: number): { text: string; tone: Tone } {
	if (z >= 0.5) return { text: 'excellent assay (Z′ ≥ 0.5)', tone: 'good' };
	if (z > 0) return { text: 'marginal (0 < Z′ < 0.5; screening usually wants > 0.5)', tone: 'warn' };
	return { text: 'control bands overlap (Z′ ≤ 0)', tone: 'bad' };
}

/** Ratio of a pilot estimate to the plan's assumption, as a tone: within ±25 % good, within a factor 2 warn, else bad (common practice for a pilot check). */
function ratioTone(estimate: number | null, planned: number): Tone {
	if (estimate === null || !(planned > 0)) return 'neutral';
	const r = estimate / planned;
	return r >= 0.75 && r <= 1.25 ? 'good' : r >= 0.5 && r <= 2 ? 'warn' : 'bad';
}

/** Pilot estimates set beside the plan's assumptions. */
export function pilotSection(ctx: ReportContext): ReportSection {
	const p = ctx.inputs.pilot;
	if (!p)
		return emptySection(
			ctx,
			'pilot',
			'no pilot data have been analysed for this plan, so its noise, plate effect and effect sizes are still assumptions.',
			'Run a small pilot, then import its CSV in the notebook or run `identiplate report PLAN --pilot DATA.csv` (`identiplate pilot PLAN DATA.csv` re-plans with its estimates).'
		);
	const plan = ctx.inputs.pilotPlan ?? ctx.plan;
	const o = plan.observation;
	const planColumn = ctx.inputs.pilotPlan ? 'Plan before the pilot' : 'Plan';
	const blocks: ReportBlock[] = [];
	blocks.push({
		kind: 'paragraph',
		text: `${p.wells} pilot wells on ${p.plates.length} plate${p.plates.length === 1 ? '' : 's'} (${p.kind === 'cells' ? `${p.rows} cell rows averaged per well` : 'one row per well'}), ${p.controls.negative} negative and ${p.controls.positive} positive controls, ${p.features.kept} of ${p.features.total} features kept.`
	});
	const dim = p.signalDimension;
	blocks.push({
		kind: 'table',
		table: {
			caption: 'Plan assumptions against pilot estimates (plan units)',
			columns: [{ label: 'Quantity' }, { label: planColumn, align: 'right' }, { label: 'Pilot', align: 'right' }],
			rows: [
				['Replicate noise (SD, factor units)', formatNumber(o.replicateNoise, 3), { text: formatNumber(p.replicateNoise, 3), tone: ratioTone(p.replicateNoise, o.replicateNoise) }],
				['Measurement noise (SD, feature units)', formatNumber(o.measurementNoise, 3), { text: formatNumber(p.measurementNoise, 3), tone: ratioTone(p.measurementNoise, o.measurementNoise) }],
				['Plate effect (SD, feature units)', formatNumber(o.plateEffect, 3), { text: p.plateEffect === null ? 'one plate: not estimable' : formatNumber(p.plateEffect, 3), tone: ratioTone(p.plateEffect, o.plateEffect) }],
				['Independent effect directions (signal dimension)', `${plan.factors.length} factors`, { text: `${dim} (${p.signal.rule === 'permutation' ? 'permutation test' : 'noise edge'}; ${p.signal.dimensionByEdge} by the noise edge)`, tone: dim >= plan.factors.length ? 'good' : 'warn' }],
				['Z′ of the controls', '—', p.zPrime === null ? 'needs ≥ 2 positive and negative controls' : { text: `${formatNumber(p.zPrime, 2)} — ${zPrimeWords(p.zPrime).text}`, tone: zPrimeWords(p.zPrime).tone }]
			]
		}
	});
	blocks.push({ kind: 'paragraph', text: `Z′ method: ${p.zPrimeMethod}` });
	if (p.reagents.length)
		blocks.push({
			kind: 'table',
			table: {
				caption: 'Reagent effects: stated against measured (factor SD units; distance in replicate-noise SDs)',
				columns: [{ label: 'Reagent' }, { label: 'Wells', align: 'right' }, { label: 'Stated', align: 'right' }, { label: 'Measured', align: 'right' }, { label: 'Distance', align: 'right' }, { label: 'Replicates agree' }],
				rows: p.reagents.map((r) => [
					ctx.reagentLabel(r.id),
					String(r.wells),
					formatNumber(r.stated, 2),
					{ text: formatNumber(r.effect, 2), tone: r.effect === null ? 'neutral' : ratioTone(r.effect, r.stated) },
					formatNumber(r.distance, 2),
					r.reproducible === null ? '—' : { text: `${r.reproducible ? 'yes' : 'no'} (r = ${formatNumber(r.reproducibility, 2)})`, tone: r.reproducible ? 'good' : 'bad' }
				])
			}
		});
	if (p.notes.length) blocks.push({ kind: 'callout', tone: 'note', title: 'Findings', items: p.notes });
	if (p.warnings.length) blocks.push({ kind: 'callout', tone: 'warning', title: 'What makes these estimates less certain', items: p.warnings });
	return { id: 'pilot', title: SECTION_TITLES.pilot, hasResults: true, blocks };
}
