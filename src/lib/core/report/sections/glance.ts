import { formatNumber } from '../formatNumber';
import type { ReportModel } from '../types';
import type { ReportContext } from './context';
import { reportDesign } from './designSection';

/** Headline results for the top of the report: verdicts, checks, simulation, sizing, design, pilot. */
export function glance(ctx: ReportContext): ReportModel['glance'] {
	const { inputs, plan } = ctx;
	const out: ReportModel['glance'] = [];
	const n = inputs.check.factors.length;
	const individual = inputs.check.factors.filter((f) => f.verdict === 'individual').length;
	out.push({ label: 'Factors recoverable individually', value: `${individual} of ${n}`, tone: individual === n ? 'good' : individual > 0 ? 'warn' : 'bad', section: 'verdicts' });
	const fails = inputs.check.checks.filter((c) => c.status === 'fail').length;
	const warns = inputs.check.checks.filter((c) => c.status === 'warn').length;
	out.push({ label: 'Checks', value: `${fails} failed, ${warns} warning${warns === 1 ? '' : 's'}, ${inputs.check.checks.length - fails - warns} passed`, tone: fails ? 'bad' : warns ? 'warn' : 'good', section: 'verdicts' });
	const sim = inputs.simulation;
	out.push(
		sim && sim.reps > 0
			? {
					label: `Simulated assurance (MCC ≥ ${sim.goalMcc})`,
					value: `${formatNumber(sim.assurance.p, 2)} (95 %: ${formatNumber(sim.assurance.lo, 2)}–${formatNumber(sim.assurance.hi, 2)}), goal ${plan.goal.assurance}`,
					tone: sim.assurance.lo >= plan.goal.assurance ? 'good' : sim.assurance.hi < plan.goal.assurance ? 'bad' : 'warn',
					section: 'simulation'
				}
			: { label: 'Simulated assurance', value: 'no results yet', tone: 'neutral', section: 'simulation' }
	);
	const s = inputs.sizing;
	out.push(
		s
			? { label: 'Sizing', value: s.feasible && s.design ? `feasible, ${ctx.money(s.design.cost)}` : `not feasible${s.budgetNeeded !== null ? `; the goal needs ${ctx.money(s.budgetNeeded)}` : ''}`, tone: s.feasible ? 'good' : 'bad', section: 'sizing' }
			: { label: 'Sizing', value: plan.design ? 'not run (design fixed in the plan)' : 'no results yet', tone: 'neutral', section: 'sizing' }
	);
	const chosen = reportDesign(plan, inputs.sizing);
	out.push(
		chosen
			? { label: `Design (${chosen.role})`, value: `${chosen.design.reagents.length} reagents × ${chosen.design.replicates} replicates`, tone: chosen.role === 'best affordable' ? 'warn' : 'neutral', section: 'design' }
			: { label: 'Design', value: 'none yet', tone: 'neutral', section: 'design' }
	);
	out.push(
		inputs.pilot
			? { label: 'Pilot', value: `${inputs.pilot.wells} wells analysed`, tone: inputs.pilot.warnings.length ? 'warn' : 'good', section: 'pilot' }
			: { label: 'Pilot', value: 'none yet — the assumptions are untested', tone: 'warn', section: 'pilot' }
	);
	return out;
}
