import { svd } from '../linalg';
import type { Plan } from '../plan/types';
import { rngFor, shuffleInPlace } from '../simulate/rng';
import { groupRoots } from './groupRoots';
import { ledoitWolfShrinkage } from './ledoitWolf';
import { fMatrixUpperEdge, johnstoneCentringScale, spectrumUpperEdge, TRACY_WIDOM_1_99 } from './noiseEdges';
import { normalisePilot } from './normalisePilot';
import { PilotError } from './PilotError';
import { nearestRankQuantile, pearson } from './robust';
import { statedEffectNorm } from './statedEffect';
import { NEGATIVE_CONTROL, POSITIVE_CONTROL, type PilotAnalysisOptions, type PilotEstimates, type PilotReagentEstimate, type PilotTable } from './types';
import { zPrime as zPrimeOf } from './zPrime';

/** Normalised values beyond this many control SDs are refused (their squares would overflow). */
const EXTREME = 1e12;

const SCALE_RULE =
	'features are first divided by their measurement-noise SD (the replicate variance left after the factor directions); ' +
	'k = Σ measured effect norms / Σ (efficacy × stated effect norms) over the pilot reagents that shift means, ' +
	'with a measured norm = √((‖Δ‖² − tr Ĉ·(1/n + 1/n₀)) / p) (RMS per feature); ' +
	'noise and plate SDs are divided by k, so a one-SD factor change moves the profile by an RMS of 1 per feature in plan feature units';

/**
 * Estimates from a pilot table (DESIGN.md "Pilot"), in the plan's units:
 * 1. features constant over all wells are dropped (noted); profiles are centred per plate on
 *    the negative controls' median and scaled by their MAD × 1.4826 (pooled over plates by
 *    default; per plate with `scaling: 'plate'`);
 * 2. plate effect: between-plate variance of the control means, corrected for control scatter;
 * 3. replicate covariance Ĉ from the residuals within (group, plate) cells (groups = reagent ×
 *    context, controls included, positives excluded; ν = wells − cells degrees of freedom). Its eigenvalues above
 *    the edge of the noise bulk (Silverstein & Choi 1995 edge for the per-feature bulk variances,
 *    times a Tracy–Widom 99% margin from Johnstone 2001, iterated until the count is stable)
 *    are replicate noise in factor space; the bulk mean is measurement noise;
 * 4. per-reagent effect: bias-corrected norm of (reagent mean − control mean), and its
 *    Mahalanobis distance with Ĉ (pooled, bias-corrected) when ν ≥ 4p, else with a Ledoit–Wolf
 *    covariance (the bias-corrected pooled distance is too noisy with fewer wells);
 * 5. the scale k (SCALE_RULE) converts feature-space values to factor SD units, after dividing
 *    each feature by its measurement-noise SD (the plan model has the same measurement noise and
 *    plate effect on every feature; without this step features that carry little factor signal
 *    would inflate both by 20–30%);
 * 6. signal dimension: in the leading min(G − 1, ν/2, maxDimensions) principal components of the
 *    profiles, roots of the noise-whitened group means (groupRoots) counted above the
 *    1 − alpha quantile of the largest root under within-plate label permutation, with the
 *    asymptotic F-matrix edge (Marchenko–Pastur generalised) reported beside it;
 * 7. Z′ (Zhang et al. 1999) of positive against negative controls on one readout: the named
 *    feature, or the projection of each well on the leave-one-out difference of the two control
 *    means; sample SDs (n − 1);
 * 8. reproducibility: mean pairwise Pearson correlation of a reagent's replicate profiles, against
 *    the 1 − alpha quantile of pairs of wells from different groups.
 * Throws PilotError when no feature varies or `zPrimeFeature` is not a column.
 */
export function analysePilot(plan: Plan, table: PilotTable, options: PilotAnalysisOptions = {}): PilotEstimates {
	const seed = options.seed ?? 1;
	const permutations = options.permutations ?? 200;
	const alpha = options.alpha ?? 0.05;
	const maxDimensions = options.maxDimensions ?? 60;
	if (!Number.isFinite(seed)) throw new RangeError(`seed must be a finite number, got ${seed}`);
	if (!(Number.isInteger(permutations) && permutations >= 0 && permutations <= 100000)) throw new RangeError(`permutations must be an integer in [0, 100000], got ${permutations}`);
	if (!(alpha > 0 && alpha <= 0.5)) throw new RangeError(`alpha must be in (0, 0.5], got ${alpha}`);
	if (!(Number.isInteger(maxDimensions) && maxDimensions >= 1)) throw new RangeError(`maxDimensions must be an integer ≥ 1, got ${maxDimensions}`);
	const nAll = table.wells.length;
	const pAll = table.features.length;
	if (table.values.length !== nAll * pAll) throw new RangeError(`table.values must hold wells × features = ${nAll * pAll} numbers, got ${table.values.length}`);

	const notes: string[] = [];
	const warnings: string[] = [];

	// 1. Constant features.
	const kept: number[] = [];
	const dropped: string[] = [];
	for (let j = 0; j < pAll; j++) {
		let lo = Infinity;
		let hi = -Infinity;
		for (let i = 0; i < nAll; i++) {
			const v = table.values[i * pAll + j];
			if (v < lo) lo = v;
			if (v > hi) hi = v;
		}
		if (hi > lo) kept.push(j);
		else dropped.push(table.features[j]);
	}
	if (kept.length === 0) throw new PilotError(1, table.features[0] ?? null, 'at least one feature that varies between wells', 'only constant features');
	if (dropped.length) notes.push(`Dropped ${dropped.length} feature${dropped.length > 1 ? 's' : ''} constant over all wells: ${dropped.slice(0, 10).join(', ')}${dropped.length > 10 ? ', …' : ''}.`);
	const p = kept.length;
	const x = new Float64Array(nAll * p);
	for (let i = 0; i < nAll; i++) for (let j = 0; j < p; j++) x[i * p + j] = table.values[i * pAll + kept[j]];

	// 2. Normalisation and plate effect.
	const norm = normalisePilot(x, table.wells, p, table.plates.length, options.scaling ?? 'pooled');
	const y = norm.y;
	for (let i = 0; i < nAll; i++) {
		for (let j = 0; j < p; j++) {
			const v = y[i * p + j];
			if (!(Math.abs(v) <= EXTREME)) {
				throw new PilotError(table.wells[i].line, table.features[kept[j]], `a value within 10¹² control SDs of its plate's control median (an extreme outlier or a unit error)`, String(x[i * p + j]));
			}
		}
	}
	if (norm.fallbacks) notes.push(`${norm.fallbacks} feature${norm.fallbacks > 1 ? 's' : ''} had a zero control MAD on some plate; the pooled control scale was used there.`);

	// 3. Groups and replicate covariance.
	const analysis: number[] = [];
	const groupKey = new Map<string, number>();
	const groupInfo: { reagent: string; context: string | null; rows: number[] }[] = [];
	table.wells.forEach((w, i) => {
		if (w.reagent === POSITIVE_CONTROL) return;
		const key = `${w.reagent}\u0000${w.context ?? ''}`;
		let g = groupKey.get(key);
		if (g === undefined) {
			g = groupInfo.length;
			groupKey.set(key, g);
			groupInfo.push({ reagent: w.reagent, context: w.context, rows: [] });
		}
		groupInfo[g].rows.push(analysis.length);
		analysis.push(i);
	});
	const n = analysis.length;
	const G = groupInfo.length;
	const ya = new Float64Array(n * p);
	analysis.forEach((i, r) => ya.set(y.subarray(i * p, (i + 1) * p), r * p));
	// Centre each context on its control mean, so that context means are not counted as signal.
	const contextsInData = new Set(groupInfo.map((g) => g.context ?? ''));
	if (contextsInData.size > 1) {
		for (const ctx of contextsInData) {
			const ctrl = groupInfo.find((g) => g.reagent === NEGATIVE_CONTROL && (g.context ?? '') === ctx);
			if (!ctrl) continue;
			const mean = groupMean(ya, ctrl.rows, p);
			for (const g of groupInfo) {
				if ((g.context ?? '') !== ctx) continue;
				for (const r of g.rows) for (let j = 0; j < p; j++) ya[r * p + j] -= mean[j];
			}
		}
		notes.push(`Wells were centred on their context's control mean before the dimension test (${contextsInData.size} contexts).`);
	}
	const means = groupInfo.map((g) => groupMean(ya, g.rows, p));
	const labels = new Int32Array(n);
	groupInfo.forEach((g, gi) => g.rows.forEach((r) => (labels[r] = gi)));
	// Replicate residuals within (group, plate) cells: plate-centring errors do not count as noise.
	const cellRows = new Map<string, number[]>();
	for (let r = 0; r < n; r++) {
		const key = `${labels[r]}\u0000${table.wells[analysis[r]].plate}`;
		const c = cellRows.get(key);
		if (c) c.push(r);
		else cellRows.set(key, [r]);
	}
	const nu = n - cellRows.size;
	if (nu < 1) throw new PilotError(table.wells[0].line, 'reagent', 'replicate wells of the same reagent on the same plate (needed to estimate noise)', 'none');
	const resid = new Float64Array(n * p);
	for (const rows of cellRows.values()) {
		const m = groupMean(ya, rows, p);
		for (const r of rows) for (let j = 0; j < p; j++) resid[r * p + j] = ya[r * p + j] - m[j];
	}
	const scaledResid = Float64Array.from(resid, (v) => v / Math.sqrt(nu));
	const cov = svd(scaledResid, n, p);
	const rank = cov.r;
	const lambda = Float64Array.from(cov.values, (s) => s * s);
	let traceC = 0;
	for (const l of lambda) traceC += l;

	// Noise spikes above the bulk: the bulk edge allows unequal measurement noise per feature.
	const diagC = new Float64Array(p);
	for (let r = 0; r < n; r++) for (let j = 0; j < p; j++) diagC[j] += (resid[r * p + j] * resid[r * p + j]) / nu;
	let spikes = 0;
	let bulk = traceC / p;
	let spikeThreshold = Infinity;
	if (p >= 2) {
		const seen = new Set<number>();
		for (let iter = 0; iter < 100 && !seen.has(spikes); iter++) {
			seen.add(spikes);
			const t = bulkVariances(diagC, cov.v, lambda, rank, p, spikes);
			let head = 0;
			for (let i = 0; i < spikes; i++) head += lambda[i];
			bulk = (traceC - head) / (p - spikes);
			spikeThreshold = spectrumUpperEdge(t, p / nu) * spikeMargin(nu, p - spikes);
			let count = 0;
			while (count < Math.min(p - 1, rank) && lambda[count] > spikeThreshold) count++;
			spikes = count;
		}
	} else warnings.push('Only one feature varies: replicate noise and measurement noise cannot be told apart; all replicate scatter is counted as measurement noise.');
	// Put every feature on a common measurement-noise scale (divide by its bulk SD) before converting
	// to plan units: the plan's measurement noise and plate effect are the same on every feature.
	const noiseVar = bulkVariances(diagC, cov.v, lambda, rank, p, spikes);
	let noiseMax = 0;
	for (const t of noiseVar) noiseMax = Math.max(noiseMax, t);
	const weight = Float64Array.from(noiseVar, (t) => 1 / Math.max(t, 1e-9 * noiseMax, 1e-300));
	let traceW = 0;
	for (let j = 0; j < p; j++) traceW += diagC[j] * weight[j];
	// Replicate variance beyond the measurement noise, summed over features (whitened units).
	const excess = p >= 2 ? Math.max(0, traceW - p) : 0;

	// 4. Effects and distances.
	const controlOf = new Map<string, number>();
	groupInfo.forEach((g, gi) => {
		if (g.reagent === NEGATIVE_CONTROL) controlOf.set(g.context ?? '', gi);
	});
	const pooled = 4 * p <= nu && lambda[rank - 1] > 1e-10 * lambda[0] && rank === p;
	let shrinkage = 0;
	if (!pooled) {
		shrinkage = Math.max(ledoitWolfShrinkage(resid, n, p).shrinkage, 1e-6);
		notes.push(`Mahalanobis distances use a Ledoit–Wolf covariance (shrinkage ${shrinkage.toFixed(3)}): ${p} features against ${nu} residual degrees of freedom.`);
	}
	const mu = traceC / p;
	const mahalanobis2 = (delta: Float64Array, nG: number, nC: number): number => {
		let proj2 = 0;
		let d2 = 0;
		for (let k = 0; k < rank; k++) {
			let t = 0;
			for (let j = 0; j < p; j++) t += cov.v[j * rank + k] * delta[j];
			proj2 += t * t;
			d2 += (t * t) / (pooled ? lambda[k] : (1 - shrinkage) * lambda[k] + shrinkage * mu);
		}
		if (pooled) return ((nu - p - 1) / nu) * d2 - p * (1 / nG + 1 / nC);
		let norm2 = 0;
		for (let j = 0; j < p; j++) norm2 += delta[j] * delta[j];
		return d2 + Math.max(0, norm2 - proj2) / (shrinkage * mu);
	};
	const reagentRows = new Map<string, { groups: number[]; wells: number }>();
	groupInfo.forEach((g, gi) => {
		if (g.reagent === NEGATIVE_CONTROL) return;
		const e = reagentRows.get(g.reagent) ?? { groups: [], wells: 0 };
		e.groups.push(gi);
		e.wells += g.rows.length;
		reagentRows.set(g.reagent, e);
	});
	const byId = new Map(plan.reagents.map((r) => [r.id, r]));
	const measured = new Map<string, { featureNorm: number; distance: number }>();
	for (const [id, e] of reagentRows) {
		let norm2 = 0;
		let dist2 = 0;
		for (const gi of e.groups) {
			const g = groupInfo[gi];
			const c = controlOf.get(g.context ?? '')!;
			const nG = g.rows.length;
			const nC = groupInfo[c].rows.length;
			const delta = new Float64Array(p);
			for (let j = 0; j < p; j++) delta[j] = means[gi][j] - means[c][j];
			let d = 0;
			for (let j = 0; j < p; j++) d += delta[j] * delta[j] * weight[j];
			norm2 += nG * (d - traceW * (1 / nG + 1 / nC));
			dist2 += nG * mahalanobis2(delta, nG, nC);
		}
		measured.set(id, { featureNorm: Math.sqrt(Math.max(0, norm2 / e.wells) / p), distance: Math.sqrt(Math.max(0, dist2 / e.wells)) });
	}

	// 5. Scale.
	const anchor = [...reagentRows.keys()].filter((id) => {
		const r = byId.get(id)!;
		return r.kind !== 'scale' && statedEffectNorm(r) > 0;
	});
	let sumMeasured = 0;
	let sumStated = 0;
	for (const id of anchor) {
		const r = byId.get(id)!;
		sumMeasured += measured.get(id)!.featureNorm;
		sumStated += r.efficacy * statedEffectNorm(r);
	}
	const k = anchor.length && sumMeasured > 0 ? sumMeasured / sumStated : null;
	if (k === null) warnings.push('No reagent effect was measurable above the noise (or no pilot reagent shifts means): the estimates cannot be converted to factor SD units, so noise, plate effect and effects are left unset.');
	const plannedCells = plan.observation.cellsPerWell;
	let cells: number | null = null;
	if (plannedCells > 0) {
		if (table.kind === 'cells') {
			let inv = 0;
			for (const i of analysis) inv += 1 / table.wells[i].rows;
			cells = n / inv;
		} else {
			cells = plannedCells;
			notes.push(`The plan simulates ${plannedCells} cells per well and the pilot gives well profiles: the conversion assumes the pilot imaged as many cells per well.`);
		}
	}
	let replicateNoise: number | null = null;
	let measurementNoise: number | null = null;
	let plateEffect: number | null = null;
	if (k !== null) {
		let tau2 = spikes > 0 ? excess / (p * spikes) / (k * k) : 0;
		if (cells !== null) tau2 = Math.max(0, tau2 - 1 / cells);
		replicateNoise = Math.sqrt(Math.max(0, tau2));
		// In whitened units the measurement variance is 1 per feature.
		measurementNoise = Math.sqrt(p >= 2 ? (cells ?? 1) : traceW * (cells ?? 1)) / k;
		if (norm.plateVariances !== null) {
			let pv = 0;
			for (let j = 0; j < p; j++) pv += norm.plateVariances[j] * weight[j];
			plateEffect = Math.sqrt(Math.max(0, pv / p)) / k;
		}
		if (spikes === 0) notes.push('No replicate-noise direction stands above the measurement-noise bulk: replicate noise in factor space is estimated as 0.');
	}
	if (norm.plateVariances === null) notes.push('One plate per context: the plate effect cannot be estimated; the plan keeps its value.');

	// 6. Signal dimension.
	// Test in at most G − 1 dimensions (the rank of the group means): more dimensions only add noise roots.
	const nuGroups = n - G;
	const qMax = Math.max(1, Math.min(maxDimensions, Math.floor(nuGroups / 2), G - 1));
	const centred = new Float64Array(n * p);
	const grand = groupMean(ya, Array.from({ length: n }, (_, i) => i), p);
	for (let i = 0; i < n; i++) for (let j = 0; j < p; j++) centred[i * p + j] = ya[i * p + j] - grand[j];
	let z = centred;
	let q = p;
	if (p > qMax) {
		const pcs = svd(centred, n, p);
		q = Math.min(qMax, pcs.r);
		z = new Float64Array(n * q);
		for (let i = 0; i < n; i++) for (let c = 0; c < q; c++) z[i * q + c] = pcs.u[i * pcs.r + c] * pcs.values[c];
		notes.push(`The dimension test used the ${q} leading principal components of the ${p} features (${nuGroups} within-group degrees of freedom).`);
	}
	const total = new Float64Array(q * q);
	for (let i = 0; i < n; i++) for (let a = 0; a < q; a++) for (let b = 0; b <= a; b++) total[a * q + b] += z[i * q + a] * z[i * q + b];
	for (let a = 0; a < q; a++) for (let b = 0; b < a; b++) total[b * q + a] = total[a * q + b];
	const observed = groupRoots(z, n, q, total, labels, G);
	if (!observed.positiveDefinite) warnings.push('The replicate covariance is singular in the tested dimensions: the dimension test is unreliable.');
	const roots = observed.roots;
	const edge = G >= 2 && q < nuGroups ? fMatrixUpperEdge(q / (G - 1), q / nuGroups) : Infinity;
	let threshold: number | null = null;
	if (permutations > 0 && G >= 2) {
		const rng = rngFor(seed, 1);
		const strata = new Map<string, number[]>();
		analysis.forEach((i, r) => {
			const w = table.wells[i];
			const key = `${w.plate}\u0000${w.context ?? ''}`;
			const s = strata.get(key) ?? [];
			s.push(r);
			strata.set(key, s);
		});
		const permuted = new Int32Array(n);
		const largest = new Float64Array(permutations);
		for (let b = 0; b < permutations; b++) {
			for (const rows of strata.values()) {
				const lab = rows.map((r) => labels[r]);
				shuffleInPlace(lab, rng);
				rows.forEach((r, t) => (permuted[r] = lab[t]));
			}
			largest[b] = groupRoots(z, n, q, total, permuted, G).roots[0] ?? 0;
		}
		threshold = nearestRankQuantile(largest, 1 - alpha);
	}
	const countAbove = (t: number) => {
		let c = 0;
		while (c < roots.length && roots[c] > t) c++;
		return c;
	};
	const dimensionByEdge = countAbove(edge);
	const signalDimension = threshold === null ? dimensionByEdge : countAbove(threshold);

	// 7. Z′.
	const z0 = zPrimeScores(y, table, p, kept, options.zPrimeFeature);
	let zPrime: number | null = null;
	const zPrimeByPlate: PilotEstimates['zPrimeByPlate'] = [];
	const positives = table.wells.filter((w) => w.reagent === POSITIVE_CONTROL).length;
	const negatives = table.wells.filter((w) => w.reagent === NEGATIVE_CONTROL).length;
	if (z0) {
		const value = zPrimeOf(z0.pos.map((s) => s.score), z0.neg.map((s) => s.score));
		zPrime = Number.isFinite(value) ? value : null;
		if (zPrime === null) warnings.push('Positive and negative controls have the same mean on the Z′ readout: Z′ is undefined.');
		else if (zPrime < 0.5) warnings.push(`Z′ = ${zPrime.toFixed(2)} is below 0.5, the usual bar for a screening assay (Zhang et al. 1999): controls overlap.`);
		table.plates.forEach((name, plate) => {
			const ps = z0.pos.filter((s) => s.plate === plate).map((s) => s.score);
			const ns = z0.neg.filter((s) => s.plate === plate).map((s) => s.score);
			const v = ps.length >= 2 && ns.length >= 2 ? zPrimeOf(ps, ns) : NaN;
			zPrimeByPlate.push({ plate: name, zPrime: Number.isFinite(v) ? v : null, positives: ps.length, negatives: ns.length });
		});
	} else notes.push(positives === 0 ? 'No positive controls: Z′ is not computed.' : 'Fewer than 2 positive or negative controls: Z′ is not computed.');
	const zPrimeMethod = options.zPrimeFeature
		? `feature "${options.zPrimeFeature}" after per-plate control normalisation; sample SDs (n − 1)`
		: 'projection on the leave-one-out difference of the positive and negative control means (normalised features); sample SDs (n − 1)';

	// 8. Reproducibility.
	let reproducibilityThreshold: number | null = null;
	if (p >= 3 && G >= 2) {
		const rng = rngFor(seed, 2);
		const nulls: number[] = [];
		for (let t = 0; t < 4000 && nulls.length < 1000; t++) {
			const a = rng.int(n);
			const b = rng.int(n);
			if (labels[a] === labels[b]) continue;
			const c = pearson(ya.subarray(a * p, (a + 1) * p), ya.subarray(b * p, (b + 1) * p));
			if (Number.isFinite(c)) nulls.push(c);
		}
		if (nulls.length >= 20) reproducibilityThreshold = nearestRankQuantile(nulls, 1 - alpha);
	}

	const reagents: PilotReagentEstimate[] = [];
	for (const r of plan.reagents) {
		const e = reagentRows.get(r.id);
		if (!e) continue;
		const m = measured.get(r.id)!;
		let reproducibility: number | null = null;
		if (p >= 3) {
			let sum = 0;
			let pairs = 0;
			for (const gi of e.groups) {
				const rows = groupInfo[gi].rows;
				for (let a = 0; a < rows.length; a++) {
					for (let b = a + 1; b < rows.length; b++) {
						const c = pearson(ya.subarray(rows[a] * p, (rows[a] + 1) * p), ya.subarray(rows[b] * p, (rows[b] + 1) * p));
						if (Number.isFinite(c)) {
							sum += c;
							pairs++;
						}
					}
				}
			}
			reproducibility = pairs ? sum / pairs : null;
		}
		const effect = k === null || r.kind === 'scale' ? null : m.featureNorm / k / r.efficacy;
		reagents.push({
			id: r.id,
			wells: e.wells,
			stated: statedEffectNorm(r),
			effect,
			distance: m.distance,
			reproducibility,
			reproducible: reproducibility === null || reproducibilityThreshold === null ? null : reproducibility > reproducibilityThreshold
		});
		if (r.kind === 'scale') notes.push(`Reagent ${r.id} is a scale reagent (it changes spread, not means): its effect is not measured from means; the plan keeps its value.`);
		else if (effect === 0 && k !== null) warnings.push(`Reagent ${r.id}: no effect above the replicate noise was measured.`);
	}

	// Dimension notes.
	const d = plan.factors.length;
	const targeted = new Set<string>();
	let unknownTargets = 0;
	for (const id of reagentRows.keys()) {
		const r = byId.get(id)!;
		if (r.kind === 'scale') continue;
		if (r.targets) r.targets.forEach((t) => targeted.add(t));
		else unknownTargets += r.expectedTargets ?? 1;
	}
	if (signalDimension > d) notes.push(`The pilot shows ${signalDimension} independent effect directions but the plan has ${d} factors: a factor may be missing from the plan (or a reagent acts outside the stated factors).`);
	else if (signalDimension < targeted.size) notes.push(`The pilot shows ${signalDimension} independent effect directions, fewer than the ${targeted.size} factors its reagents target: some effects are too weak to see or move the readout the same way.`);
	else if (signalDimension > targeted.size + unknownTargets) notes.push(`The pilot shows ${signalDimension} independent effect directions, more than the ${targeted.size + unknownTargets} its reagents are stated to target.`);
	if (spikes !== d && p >= 2) notes.push(`Replicate noise stands out in ${spikes} direction${spikes === 1 ? '' : 's'} (the plan has ${d} factors).`);
	if (signalDimension !== dimensionByEdge && threshold !== null) notes.push(`The asymptotic noise edge counts ${dimensionByEdge} directions; the permutation null (used) counts ${signalDimension}.`);
	if (nu < 2 * p && pooled === false && p > 1) warnings.push(`Few replicate wells for ${p} features (${nu} residual degrees of freedom): noise estimates are rough.`);
	if (k !== null) notes.push('Absolute effect sizes are anchored to the stated ones on average; the pilot measures effects relative to each other and to the noise.');

	return {
		kind: table.kind,
		wells: nAll,
		rows: table.rows,
		plates: [...table.plates],
		features: { total: pAll, kept: p, dropped },
		controls: { negative: negatives, positive: positives },
		scale: { featureUnitsPerSd: k, anchorReagents: anchor, cellsPerWell: cells, rule: SCALE_RULE },
		replicateNoise,
		measurementNoise,
		plateEffect,
		featureSpace: { noiseSpikes: Array.from(lambda.subarray(0, spikes)), bulkVariance: bulk, spikeThreshold, plateVariance: norm.plateVariance, degreesOfFreedom: nu },
		noiseDimension: spikes,
		signalDimension,
		signal: {
			rule: threshold === null ? 'edge' : 'permutation',
			singularValues: Array.from(roots, Math.sqrt),
			edge: Math.sqrt(edge),
			threshold: threshold === null ? null : Math.sqrt(threshold),
			dimensionByEdge,
			permutations: threshold === null ? 0 : permutations,
			dimensions: q,
			groups: G
		},
		covariance: { method: pooled ? 'pooled' : 'ledoit-wolf', shrinkage: pooled ? 0 : shrinkage },
		zPrime,
		zPrimeMethod,
		zPrimeByPlate,
		reproducibilityThreshold,
		reagents,
		notes,
		warnings
	};
}

/**
 * Per-feature variance of the noise bulk once the top `spikes` eigen-directions of the replicate
 * covariance are removed: Ĉⱼⱼ − Σᵢ λᵢvⱼᵢ², floored at 0 and scaled by p/(p − spikes) so that
 * they average to the bulk mean.
 */
function bulkVariances(diagC: Float64Array, v: Float64Array, lambda: Float64Array, rank: number, p: number, spikes: number): Float64Array {
	const t = new Float64Array(p);
	for (let j = 0; j < p; j++) {
		let c = diagC[j];
		for (let i = 0; i < spikes; i++) c -= lambda[i] * v[j * rank + i] * v[j * rank + i];
		t[j] = (Math.max(c, 0) * p) / (p - spikes);
	}
	return t;
}

/** Finite-sample margin over the asymptotic edge: 1 + TW₁(99%)·scale/centre (Johnstone 2001). */
function spikeMargin(nu: number, p: number): number {
	const { centre, scale } = johnstoneCentringScale(nu + 1, Math.max(1, p));
	return 1 + (TRACY_WIDOM_1_99 * scale) / centre;
}

function groupMean(v: Float64Array, rows: number[], p: number): Float64Array {
	const m = new Float64Array(p);
	for (const r of rows) for (let j = 0; j < p; j++) m[j] += v[r * p + j];
	for (let j = 0; j < p; j++) m[j] /= rows.length || 1;
	return m;
}

interface Score {
	plate: number;
	score: number;
}

/** One readout per control well for Z′, or null with fewer than 2 positive or negative controls. */
function zPrimeScores(y: Float64Array, table: PilotTable, p: number, kept: number[], feature?: string): { pos: Score[]; neg: Score[] } | null {
	const posRows: number[] = [];
	const negRows: number[] = [];
	table.wells.forEach((w, i) => {
		if (w.reagent === POSITIVE_CONTROL) posRows.push(i);
		else if (w.reagent === NEGATIVE_CONTROL) negRows.push(i);
	});
	if (feature !== undefined) {
		const column = table.features.indexOf(feature);
		if (column < 0) throw new PilotError(1, feature, `a feature column of the file for Z′ (${table.features.slice(0, 8).join(', ')}${table.features.length > 8 ? ', …' : ''})`, 'no such column');
		const j = kept.indexOf(column);
		if (posRows.length < 2 || negRows.length < 2) return null;
		const read = (i: number) => ({ plate: table.wells[i].plate, score: j < 0 ? 0 : y[i * p + j] });
		return { pos: posRows.map(read), neg: negRows.map(read) };
	}
	if (posRows.length < 2 || negRows.length < 2) return null;
	const mPos = groupMean(y, posRows, p);
	const mNeg = groupMean(y, negRows, p);
	const diff = new Float64Array(p);
	for (let j = 0; j < p; j++) diff[j] = mPos[j] - mNeg[j];
	// Leave-one-out direction: removing well i from its group moves that group's mean by −(yᵢ − m)/(n − 1).
	const score = (i: number, own: Float64Array, sign: number, count: number): Score => {
		const dir = new Float64Array(p);
		let len = 0;
		for (let j = 0; j < p; j++) {
			dir[j] = diff[j] - (sign * (y[i * p + j] - own[j])) / (count - 1);
			len += dir[j] * dir[j];
		}
		len = Math.sqrt(len);
		let s = 0;
		for (let j = 0; j < p; j++) s += y[i * p + j] * dir[j];
		return { plate: table.wells[i].plate, score: len > 0 ? s / len : 0 };
	};
	return { pos: posRows.map((i) => score(i, mPos, 1, posRows.length)), neg: negRows.map((i) => score(i, mNeg, -1, negRows.length)) };
}
