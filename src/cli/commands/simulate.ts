import type { Command } from '../main';
import { assertKnownFlags, intFlag, stringFlag, UsageError, seedFlag } from '../args';
import { emit, readPlanFile } from '../io';
import { defaultThreadCount, runReplicatesParallel } from '../pool';
import { effectiveDesign, type Plan } from '../../lib/core/plan';
import { ESTIMATORS, prepareSimulation, summarise, type EstimatorName, type SimulationSummary } from '../../lib/core/simulate';

/** `identiplate simulate PLAN [--reps N] [--seed N] [--threads N] [--estimator NAME] [--json]`. */
export const command: Command = {
	summary: 'How well would the factors be recovered? Monte Carlo recovery score (MCC) and assurance for the plan’s design.',
	usage: 'identiplate simulate PLAN [--reps N (200)] [--seed N (1)] [--threads N (cores)] [--estimator auto|support|sparse|fastica|jointdiag|contrastive] [--json]',
	async run(args) {
		assertKnownFlags(args, ['json', 'reps', 'seed', 'threads', 'estimator']);
		if (args.positional.length > 1) throw new UsageError(`expected one PLAN file, got ${args.positional.length} arguments`);
		const reps = intFlag(args, 'reps', 200, 1, 1_000_000);
		const seed = seedFlag(args);
		const threads = intFlag(args, 'threads', defaultThreadCount(), 1, 256);
		const est = stringFlag(args, 'estimator') ?? 'auto';
		if (est !== 'auto' && !ESTIMATORS.includes(est as EstimatorName)) throw new UsageError(`--estimator must be one of auto, ${ESTIMATORS.join(', ')}; got ${JSON.stringify(est)}`);
		const json = args.flags.has('json');
		const plan = readPlanFile(args.positional[0]);
		const design = effectiveDesign(plan);
		let prep;
		try {
			prep = prepareSimulation(plan, design, { seed, estimator: est as EstimatorName | 'auto' });
		} catch (err) {
			if (err instanceof RangeError) throw new UsageError(err.message);
			throw err;
		}
		const progress = json ? undefined : progressLine(reps);
		const results = await runReplicatesParallel(
			prep,
			Array.from({ length: reps }, (_, i) => i),
			{ threads, onProgress: progress }
		);
		if (progress && process.stderr.isTTY) process.stderr.write('\n');
		const summary = summarise(prep, results);
		emit(json, toJson(summary), () => toText(plan, summary));
	}
};

/** Progress on stderr: one updating line on a terminal, otherwise a line every 10 %. */
function progressLine(total: number) {
	const tty = Boolean(process.stderr.isTTY);
	let last = -1;
	return (done: number) => {
		const pct = Math.floor((100 * done) / total);
		const step = tty ? pct : Math.floor(pct / 10) * 10;
		if (step === last) return;
		last = step;
		process.stderr.write(`${tty ? '\r' : ''}simulating: ${done}/${total} replicates (${pct} %)${tty ? '' : '\n'}`);
	};
}

/** JSON shape of DESIGN.md plus the estimator, route, goal and warnings. */
export function toJson(s: SimulationSummary) {
	return {
		reps: s.reps,
		seed: s.seed,
		mcc: s.mcc,
		assurance: s.assurance,
		factors: s.factors.map((f) => (f.blockR2 === undefined ? { id: f.id, meanCorr: f.meanCorr } : { id: f.id, meanCorr: f.meanCorr, blockR2: f.blockR2 })),
		estimator: s.estimator,
		route: s.route,
		goalMcc: s.goalMcc,
		warnings: s.warnings
	};
}

const f3 = (x: number) => (Number.isFinite(x) ? x.toFixed(3) : '—');

export function toText(plan: Plan, s: SimulationSummary): string {
	const names = new Map(plan.factors.map((f) => [f.id, f.name]));
	const lines = [
		plan.title,
		`route: ${s.route}   estimator: ${s.estimator}   replicates: ${s.reps}   seed: ${s.seed}`,
		`design: ${s.design.reagents.length} reagents × ${s.design.replicates} replicate wells${s.design.contexts.length ? ` × ${s.design.contexts.length} contexts` : ''}, ${s.design.controlsPerPlate} controls per plate`,
		'',
		`recovery score (MCC): mean ${f3(s.mcc.mean)}   10 % ${f3(s.mcc.p10)}   median ${f3(s.mcc.median)}   90 % ${f3(s.mcc.p90)}`,
		`assurance (MCC ≥ ${s.goalMcc}): ${(100 * s.assurance.p).toFixed(1)} %   95 % interval ${(100 * s.assurance.lo).toFixed(1)}–${(100 * s.assurance.hi).toFixed(1)} % (Wilson)   goal ${(100 * plan.goal.assurance).toFixed(0)} %`,
		'',
		'per factor (mean matched |correlation|' + (s.factors.some((f) => f.blockR2 !== undefined) ? ', block R²' : '') + '):'
	];
	for (const f of s.factors) lines.push(`  ${f.id.padEnd(10)} ${f3(f.meanCorr)}${f.blockR2 !== undefined ? `   ${f3(f.blockR2)}` : ''}   ${names.get(f.id) ?? ''}`);
	if (s.warnings.length) {
		lines.push('', 'warnings:');
		for (const w of s.warnings) lines.push(`  - ${w}`);
	}
	lines.push(
		'',
		'cautions:',
		'  - These numbers hold only under the stated model (mixing, noise, effect sizes and their uncertainty); a pilot is the test of those assumptions.',
		`  - ${s.reps} replicates give the assurance to within the Wilson interval above; use more replicates before relying on a borderline result.`,
		'  - The planner does not replace a statistician’s review, the lab’s biosafety rules or institutional approvals for the reagents and organisms used.'
	);
	return lines.join('\n');
}
