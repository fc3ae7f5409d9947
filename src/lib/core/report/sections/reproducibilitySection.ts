import { planInputHash } from '../../plan/hashPlan';
import type { ReportBlock, ReportSection } from '../types';
import { SECTION_TITLES, type ReportContext } from './context';
import { formatUtc } from './revisionsSection';

/** What is needed to reproduce every number: version, seeds, date and the plan file's SHA-256. */
export function reproducibilitySection(ctx: ReportContext, planSha256: string): ReportSection {
	const { inputs, plan } = ctx;
	const seeds = Object.entries(inputs.seeds);
	const items = [
		{ label: 'App version', value: `identiplate ${inputs.appVersion}` },
		{ label: 'Report generated', value: `${inputs.generatedAt} (${formatUtc(inputs.generatedAt)})` },
		{ label: 'Plan file SHA-256', value: planSha256 },
		...(inputs.planFileName ? [{ label: 'Plan file', value: inputs.planFileName }] : []),
		{ label: 'Plan input hash (FNV-1a, inputs only)', value: planInputHash(plan) },
		{ label: 'Seeds', value: seeds.length ? seeds.map(([k, v]) => `${k} ${v}`).join('; ') : 'none (no random result in this report)' }
	];
	if (inputs.simulation) items.push({ label: 'Simulation', value: `${inputs.simulation.reps} replicates, estimator ${inputs.simulation.estimator}, seed ${inputs.simulation.seed}` });
	if (inputs.sizing) items.push({ label: 'Sizing', value: `${inputs.sizing.evaluations} replicates over ${inputs.sizing.designsEvaluated} designs, seed ${inputs.sizing.seed}` });
	if (inputs.layout) items.push({ label: 'Layout', value: `seed ${inputs.layout.seed}` });
	if (inputs.command) items.push({ label: 'Command', value: inputs.command });
	const blocks: ReportBlock[] = [
		{ kind: 'facts', items },
		{
			kind: 'paragraph',
			text: 'The same plan file (same SHA-256), the same app version, the same seeds and the same replicate counts give the same results bit for bit. The SHA-256 is taken over the plan file’s exact text (UTF-8); the input hash ignores the title and notes, so it tells whether two plans share every input that a computation uses.'
		}
	];
	return { id: 'reproducibility', title: SECTION_TITLES.reproducibility, hasResults: true, blocks };
}
