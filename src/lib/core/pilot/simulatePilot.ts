import type { FactorShape, Plan, Reagent } from '../plan/types';
import { edgeWellCount, PLATE_GEOMETRY } from '../size/costModel';
import { rngFor, shuffleInPlace, type Rng } from '../simulate/rng';
import { NEGATIVE_CONTROL, POSITIVE_CONTROL } from './types';
import { rowLabel } from './wellName';

/** SD of a clamped factor around its clamped value. */
const CLAMP_SPREAD = 0.1;

/** The invented truth behind a simulated pilot (all effects in factor SD units). */
export interface PilotTruth {
	/** SD τ of well-to-well noise in factor space. */
	replicateNoise: number;
	/** SD of measurement noise per feature (per cell in a cells file), plan feature units. */
	measurementNoise: number;
	/** SD of the per-plate offset per feature, plan feature units. */
	plateEffect: number;
	/** Real effects that differ from the plan's stated ones (same shape as `Reagent.effect`). */
	effects?: Record<string, number | Record<string, number>>;
	/** Real efficacies that differ from the plan's. */
	efficacy?: Record<string, number>;
	/** Real targets of reagents whose plan targets are unknown (default: a seeded random choice). */
	targets?: Record<string, string[]>;
	/** Latent factors missing from the plan: the shift each listed reagent gives them. */
	hiddenFactors?: { name: string; effects: Record<string, number> }[];
	/** Shift of the positive control on each factor id. */
	positive: Record<string, number>;
}

export interface SimulatePilotOptions {
	seed: number;
	/** Plan reagent ids placed on every plate. */
	reagents: string[];
	plates: number;
	replicatesPerPlate: number;
	controlsPerPlate: number;
	positivesPerPlate: number;
	/** 0 writes one row per well; otherwise one row per cell with a `cell` column. */
	cellsPerWell: number;
	truth: PilotTruth;
	/** Feature column names (default f1…fp); their count must equal `plan.observation.features`. */
	featureNames?: string[];
	/** Significant digits written per value (default 6). */
	digits?: number;
}

/**
 * Rows of a simulated pilot CSV (header first) drawn from the plan's generative model
 * (DESIGN.md "Generative model"): well latent z = b·δ_r + η, η ~ N(0, τ²I), b ~ Bernoulli(efficacy)
 * (clamp: targets at the value with spread 0.1; scale: the cells' spread on the targets × (1 + effect));
 * in a cells file each cell adds u_c drawn from the factor's shape. Profile x = A z + β_plate + ε with A (p × d)
 * of independent N(0, 1) entries (an RMS loading of 1 per feature), β ~ N(0, σ²_plate I),
 * ε ~ N(0, σ²_meas I); then each feature gets its own invented unit: offset + scale·x.
 * Wells are placed at random (seeded) among the plate's usable wells, rows sorted by position.
 */
export function* simulatePilotRows(plan: Plan, options: SimulatePilotOptions): Generator<string[]> {
	const { truth } = options;
	const p = plan.observation.features;
	const names = options.featureNames ?? Array.from({ length: p }, (_, j) => `f${j + 1}`);
	if (names.length !== p) throw new RangeError(`featureNames must have ${p} names (observation.features), got ${names.length}`);
	for (const [key, v] of Object.entries({ plates: options.plates, replicatesPerPlate: options.replicatesPerPlate, controlsPerPlate: options.controlsPerPlate, positivesPerPlate: options.positivesPerPlate, cellsPerWell: options.cellsPerWell })) {
		if (!(Number.isInteger(v) && v >= 0)) throw new RangeError(`${key} must be an integer ≥ 0, got ${v}`);
	}
	for (const [key, v] of Object.entries({ replicateNoise: truth.replicateNoise, measurementNoise: truth.measurementNoise, plateEffect: truth.plateEffect })) {
		if (!(v >= 0 && Number.isFinite(v))) throw new RangeError(`truth.${key} must be a number ≥ 0, got ${v}`);
	}
	const byId = new Map(plan.reagents.map((r) => [r.id, r]));
	const reagents = options.reagents.map((id) => {
		const r = byId.get(id);
		if (!r) throw new RangeError(`reagents: unknown plan reagent ${JSON.stringify(id)}`);
		return r;
	});
	const factorIds = plan.factors.map((f) => f.id);
	const hidden = truth.hiddenFactors ?? [];
	const d = factorIds.length + hidden.length;
	const shapes: FactorShape[] = [...plan.factors.map((f) => f.shape), ...hidden.map(() => 'laplace' as const)];
	const digits = options.digits ?? 6;

	const setup = rngFor(options.seed, 1);
	const a = new Float64Array(p * d);
	for (let i = 0; i < a.length; i++) a[i] = setup.normal();
	const offset = Float64Array.from({ length: p }, () => 50 + 450 * setup.next());
	const unit = Float64Array.from({ length: p }, () => 10 * Math.exp(0.7 * setup.normal()));
	const plateShift = Array.from({ length: options.plates }, () => Float64Array.from({ length: p }, () => truth.plateEffect * setup.normal()));

	const effectRng = rngFor(options.seed, 2);
	const specs = reagents.map((r) => reagentSpec(r, truth, factorIds, hidden, effectRng));
	const positive = new Float64Array(d);
	for (const [f, v] of Object.entries(truth.positive)) {
		const j = factorIds.indexOf(f);
		if (j < 0) throw new RangeError(`truth.positive: unknown factor ${JSON.stringify(f)}`);
		positive[j] = v;
	}

	const format = plan.budget.plateFormat;
	const { rows: nRows, columns: nCols } = PLATE_GEOMETRY[format];
	const usable: { row: number; col: number }[] = [];
	for (let r = 1; r <= nRows; r++) {
		for (let c = 1; c <= nCols; c++) {
			if (plan.budget.excludeEdgeWells && (r === 1 || c === 1 || r === nRows || c === nCols)) continue;
			usable.push({ row: r, col: c });
		}
	}
	const perPlate = options.controlsPerPlate + options.positivesPerPlate + options.replicatesPerPlate * reagents.length;
	if (perPlate > usable.length) throw new RangeError(`${perPlate} wells per plate do not fit the ${usable.length} usable wells of a ${format}-well plate${plan.budget.excludeEdgeWells ? ` without its ${edgeWellCount(format)} edge wells` : ''}`);

	yield ['plate', 'well', 'reagent', ...(options.cellsPerWell > 0 ? ['cell'] : []), ...names];
	const fmt = (v: number) => String(Number(v.toPrecision(digits)));
	const rows: string[][] = [];
	const z = new Float64Array(d);
	const zc = new Float64Array(d);
	for (let q = 0; q < options.plates; q++) {
		const plateName = `P${q + 1}`;
		const contents: (number | 'control' | 'positive')[] = [
			...Array<'control'>(options.controlsPerPlate).fill('control'),
			...Array<'positive'>(options.positivesPerPlate).fill('positive'),
			...reagents.flatMap((_, ri) => Array<number>(options.replicatesPerPlate).fill(ri))
		];
		const positions = shuffleInPlace(usable.slice(), rngFor(options.seed, 3, q)).slice(0, contents.length);
		const placed = contents.map((c, i) => ({ c, pos: positions[i] })).sort((u, v) => u.pos.row - v.pos.row || u.pos.col - v.pos.col);
		placed.forEach(({ c, pos }, w) => {
			const rng = rngFor(options.seed, 4, q, w);
			const label = c === 'control' ? NEGATIVE_CONTROL : c === 'positive' ? POSITIVE_CONTROL : reagents[c as number].id;
			const spec = typeof c === 'number' ? specs[c] : null;
			const acts = spec ? rng.next() < spec.efficacy : true;
			// Well latent: responding wells get the reagent's change, every well replicate noise.
			// (clamp at well level: the clamped value with its spread; scale changes only the cells' spread)
			for (let j = 0; j < d; j++) {
				let v = truth.replicateNoise * rng.normal();
				if (c === 'positive') v += positive[j];
				if (spec && acts) {
					if (spec.kind === 'shift') v += spec.delta[j];
					else if (spec.kind === 'clamp' && spec.targets[j]) v += spec.delta[j] + (options.cellsPerWell === 0 ? CLAMP_SPREAD * rng.normal() : 0);
				}
				z[j] = v;
			}
			const wellName = `${rowLabel(pos.row)}${pos.col}`;
			const emit = (latent: Float64Array, cell: number | null): string[] => {
				const out = [plateName, wellName, label];
				if (cell !== null) out.push(String(cell + 1));
				for (let f = 0; f < p; f++) {
					let s = plateShift[q][f] + options.truth.measurementNoise * rng.normal();
					for (let j = 0; j < d; j++) s += a[f * d + j] * latent[j];
					out.push(fmt(offset[f] + unit[f] * s));
				}
				return out;
			};
			if (options.cellsPerWell === 0) return void rows.push(emit(z, null));
			for (let cell = 0; cell < options.cellsPerWell; cell++) {
				for (let j = 0; j < d; j++) {
					let u = drawShape(shapes[j], rng);
					if (spec && acts && spec.targets[j]) {
						if (spec.kind === 'clamp') u = CLAMP_SPREAD * rng.normal();
						else if (spec.kind === 'scale') u *= Math.max(0, 1 + spec.delta[j]);
					}
					zc[j] = z[j] + u;
				}
				rows.push(emit(zc, cell));
			}
		});
		// Yield the plate's rows, then free them (a cells file can be large).
		yield* rows.splice(0, rows.length);
	}
}

interface ReagentSpec {
	kind: Reagent['kind'];
	efficacy: number;
	delta: Float64Array;
	targets: boolean[];
}

function reagentSpec(r: Reagent, truth: PilotTruth, factorIds: string[], hidden: NonNullable<PilotTruth['hiddenFactors']>, rng: Rng): ReagentSpec {
	const d = factorIds.length + hidden.length;
	const delta = new Float64Array(d);
	const targets = Array<boolean>(d).fill(false);
	const effect = truth.effects?.[r.id] ?? r.effect;
	let targetIds = r.targets ?? truth.targets?.[r.id];
	if (!targetIds) {
		const k = Math.min(r.expectedTargets ?? 1, factorIds.length);
		targetIds = shuffleInPlace(factorIds.slice(), rng).slice(0, k);
	}
	for (const t of targetIds) {
		const j = factorIds.indexOf(t);
		if (j < 0) throw new RangeError(`reagent ${r.id}: unknown target factor ${JSON.stringify(t)}`);
		targets[j] = true;
		delta[j] = typeof effect === 'number' ? effect : (effect[t] ?? 0);
	}
	hidden.forEach((h, i) => {
		const v = h.effects[r.id];
		if (v !== undefined) {
			delta[factorIds.length + i] = v;
			targets[factorIds.length + i] = true;
		}
	});
	return { kind: r.kind, efficacy: truth.efficacy?.[r.id] ?? r.efficacy, delta, targets };
}

/** One draw of a standardised (mean 0, variance 1) factor shape. */
function drawShape(shape: FactorShape, rng: Rng): number {
	switch (shape) {
		case 'gaussian':
			return rng.normal();
		case 'laplace': {
			const u = rng.next() - 0.5;
			return (-Math.sign(u) * Math.log(Math.max(1 - 2 * Math.abs(u), 1e-300))) / Math.SQRT2;
		}
		case 'uniform':
			return (2 * rng.next() - 1) * Math.sqrt(3);
		case 'bimodal':
			return (rng.next() < 0.5 ? -0.9 : 0.9) + Math.sqrt(0.19) * rng.normal();
	}
}
