import type { Context, Design, Plan } from '../plan/types';
import { effectiveDesign } from '../plan/planHelpers';
import { designCost, PLATE_GEOMETRY } from '../size/costModel';
import { rngFor, shuffleInPlace } from '../simulate/rng';
import { allocateReplicates } from './allocateReplicates';
import { diagonalOrder } from './diagonalOrder';
import { layoutDiagnostics } from './layoutDiagnostics';
import { LayoutError } from './LayoutError';
import { optimisePlacement } from './optimisePlacement';
import { CONTROL, EMPTY, type Placement } from './placement';
import { edgeDistance } from './plateGeometry';
import type { Layout, LayoutOptions, LayoutPlate, WellAssignment } from './types';
import { rowLabel, wellName } from './wellName';

/** Optimiser proposals per treatment well at effort 1, and the cap on proposals at effort 1. */
const PROPOSALS_PER_WELL = 200;
const MAX_PROPOSALS = 4_000_000;
/** Reagent id that the layout CSV uses for control wells. */
export const CONTROL_LABEL = 'control';

/** RNG stream keys (first path element after the seed). */
const STREAM = { allocate: 1, plate: 2, optimise: 3 } as const;

/**
 * Lays a design out on plates (DESIGN.md "Layout").
 *
 * - Plates: as many as `designCost(plan, design)` counts. Plate-level contexts get plates of
 *   their own; the baseline and well-level contexts share plates (and mix within them).
 * - Edge: with `plan.budget.excludeEdgeWells` the outer ring of every plate stays empty.
 * - Controls: `design.controlsPerPlate` negative controls per plate, spread so every usable row
 *   and column holds a near-equal share (counts differ by at most one). On shared plates with
 *   well-level contexts the controls take the contexts in turn.
 * - Treatments: each (reagent, context) group gets `design.replicates` wells, split over its
 *   plates as evenly as possible (distinct plates when replicates ≤ plates); within a plate a
 *   group's wells sit on distinct rows and distinct columns.
 * - Randomisation: rows and columns of each plate are permuted at random (seeded) before the
 *   wells are dealt along wrapped diagonals, then simulated annealing swaps wells within plates
 *   to minimise the association of groups with row, column and distance to the edge (see
 *   `optimisePlacement`). Same plan, design and seed → identical layout.
 *
 * Throws `LayoutError` (message says what to change) when a reagent's stock is too small, the
 * controls and edge leave no room, or a group has more replicates on one plate than the plate has
 * usable rows. Throws RangeError for malformed options.
 */
export function layoutDesign(plan: Plan, design: Design | null = null, options: LayoutOptions = {}): Layout {
	const d = design ?? effectiveDesign(plan);
	const seed = options.seed ?? 1;
	const effort = options.effort ?? 1;
	if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`options.seed must be an integer ≥ 0, got ${seed}`);
	if (!Number.isFinite(effort) || effort < 0) throw new RangeError(`options.effort must be a finite number ≥ 0, got ${effort}`);
	const { budget } = plan;
	const format = budget.plateFormat;
	const { rows, columns } = PLATE_GEOMETRY[format];

	// --- caller mistakes and capacity problems -------------------------------------------------
	if (!Number.isInteger(d.replicates) || d.replicates < 1) throw new LayoutError('design.replicates', `expected an integer ≥ 1, got ${d.replicates}`);
	if (!Number.isInteger(d.controlsPerPlate) || d.controlsPerPlate < 0) throw new LayoutError('design.controlsPerPlate', `expected an integer ≥ 0, got ${d.controlsPerPlate}`);
	const reagentById = new Map(plan.reagents.map((r) => [r.id, r]));
	const seenReagent = new Set<string>();
	d.reagents.forEach((id, i) => {
		if (!reagentById.has(id)) throw new LayoutError(`design.reagents[${i}]`, `unknown reagent "${id}"; expected one of the plan's reagent ids`);
		if (seenReagent.has(id)) throw new LayoutError(`design.reagents[${i}]`, `reagent "${id}" is listed twice`);
		if (id === CONTROL_LABEL) throw new LayoutError(`design.reagents[${i}]`, `the reagent id "${CONTROL_LABEL}" is reserved for control wells in the layout CSV; rename the reagent`);
		seenReagent.add(id);
	});
	const contextById = new Map(plan.contexts.map((c) => [c.id, c]));
	const seenContext = new Set<string>();
	const contexts: Context[] = d.contexts.map((id, i) => {
		const c = contextById.get(id);
		if (!c) throw new LayoutError(`design.contexts[${i}]`, `unknown context "${id}"; expected one of the plan's context ids`);
		if (seenContext.has(id)) throw new LayoutError(`design.contexts[${i}]`, `context "${id}" is listed twice`);
		seenContext.add(id);
		return c;
	});
	const nContexts = Math.max(1, contexts.length);
	const overStock = d.reagents
		.map((id) => reagentById.get(id)!)
		.filter((r) => r.maxWells !== undefined && d.replicates * nContexts > r.maxWells);
	if (overStock.length > 0) {
		const detail = overStock
			.map((r) => `"${r.id}" (${r.name}) needs ${d.replicates * nContexts} wells (${d.replicates} replicates × ${nContexts} context${nContexts > 1 ? 's' : ''}) but its stock covers ${r.maxWells}`)
			.join('; ');
		const fit = Math.min(...overStock.map((r) => Math.floor(r.maxWells! / nContexts)));
		throw new LayoutError(
			'design.reagents',
			`not enough stock: ${detail}. Lower design.replicates to ${fit >= 1 ? `at most ${fit}` : 'fewer'}, use fewer contexts, drop the reagent, or raise its maxWells.`
		);
	}
	const cost = designCost(plan, d);
	if (cost.problem) throw new LayoutError('design.controlsPerPlate', cost.problem);
	const off = budget.excludeEdgeWells ? 1 : 0;
	const ru = rows - 2 * off;
	const ku = columns - 2 * off;

	// --- plate blocks and (reagent, context) groups ----------------------------------------------
	const wellContexts = contexts.filter((c) => c.level === 'well').map((c) => c.id);
	const blocks = cost.groups.map((g) => ({
		context: g.context,
		contexts: g.context !== null ? [g.context] : wellContexts.length > 0 ? wellContexts : [null],
		plates: g.plates
	}));
	const groupReagent: string[] = [];
	const groupContext: (string | null)[] = [];
	const groupBlockList: number[] = [];
	blocks.forEach((b, bi) => {
		for (const r of d.reagents)
			for (const c of b.contexts) {
				groupReagent.push(r);
				groupContext.push(c);
				groupBlockList.push(bi);
			}
	});
	const nGroups = groupReagent.length;
	blocks.forEach((b, bi) => {
		const perPlate = Math.ceil(d.replicates / b.plates);
		if (d.reagents.length === 0 || perPlate <= ru) return;
		const platesNeeded = Math.ceil(d.replicates / ru);
		const where = b.context === null ? 'the shared plates' : `the plates of context "${b.context}"`;
		const morePlates =
			bi === 0 ? `, or set design.plates to at least ${cost.plates + platesNeeded - b.plates} so that ${where} number ${platesNeeded}` : `, or raise the plate count of ${where} to ${platesNeeded} (only the first plate group takes extra plates from design.plates)`;
		throw new LayoutError(
			'design.replicates',
			`${d.replicates} replicates per reagent and context on ${b.plates} plate${b.plates > 1 ? 's' : ''} put up to ${perPlate} on one plate, but a plate has only ${ru} usable rows and a group's replicates on one plate must sit on distinct rows and columns. Lower design.replicates to at most ${ru * b.plates}${morePlates}${off ? ', or stop excluding the edge wells' : ''}.`
		);
	});

	// --- plates, allocation and the seeded initial placement -------------------------------------
	const plateBlock: number[] = [];
	blocks.forEach((b, bi) => {
		for (let k = 0; k < b.plates; k++) plateBlock.push(bi);
	});
	const nPlates = plateBlock.length;
	const cells = ru * ku;
	// countOn[g][p]: wells of group g on (global) plate p.
	const countOn = new Map<number, Map<number, number>>();
	let plateStart = 0;
	blocks.forEach((b, bi) => {
		const members = groupBlockList.map((blk, g) => (blk === bi ? g : -1)).filter((g) => g >= 0);
		const alloc = allocateReplicates(
			members.map(() => d.replicates),
			b.plates,
			rngFor(seed, STREAM.allocate, bi)
		);
		members.forEach((g, k) => {
			const m = new Map<number, number>();
			for (let q = 0; q < b.plates; q++) if (alloc[k * b.plates + q] > 0) m.set(plateStart + q, alloc[k * b.plates + q]);
			countOn.set(g, m);
		});
		plateStart += b.plates;
	});
	const occ = new Int32Array(nPlates * cells).fill(EMPTY);
	const controlContext: (string | null)[] = new Array(nPlates * cells).fill(null);
	const slotGroup: number[] = [];
	const slotPlate: number[] = [];
	const groupsOnPlate: number[][] = Array.from({ length: nPlates }, () => []);
	for (let g = 0; g < nGroups; g++) for (const p of countOn.get(g)!.keys()) groupsOnPlate[p].push(g);
	for (let p = 0; p < nPlates; p++) {
		const rng = rngFor(seed, STREAM.plate, p);
		const rowPerm = shuffleInPlace(Array.from({ length: ru }, (_, i) => i), rng);
		const colPerm = shuffleInPlace(Array.from({ length: ku }, (_, i) => i), rng);
		const order = diagonalOrder(ru, ku, rowPerm, colPerm);
		const b = blocks[plateBlock[p]];
		let at = 0;
		for (let k = 0; k < d.controlsPerPlate; k++, at++) {
			occ[p * cells + order[at]] = CONTROL;
			controlContext[p * cells + order[at]] = b.contexts[k % b.contexts.length];
		}
		for (const g of shuffleInPlace(groupsOnPlate[p].slice(), rng)) {
			const slot = slotGroup.length;
			slotGroup.push(g);
			slotPlate.push(p);
			const n = countOn.get(g)!.get(p)!;
			for (let k = 0; k < n; k++, at++) occ[p * cells + order[at]] = slot;
		}
	}
	let minRing = Infinity;
	const ringRaw = new Int32Array(cells);
	for (let c = 0; c < cells; c++) {
		ringRaw[c] = edgeDistance(format, Math.floor(c / ku) + off, (c % ku) + off);
		minRing = Math.min(minRing, ringRaw[c]);
	}
	const ring = ringRaw.map((v) => v - minRing);
	const placement: Placement = {
		rows: ru,
		columns: ku,
		plates: nPlates,
		occ,
		slotGroup: Int32Array.from(slotGroup),
		slotPlate: Int32Array.from(slotPlate),
		groups: nGroups,
		groupReplicates: new Int32Array(nGroups).fill(d.replicates),
		groupBlock: Int32Array.from(groupBlockList),
		plateBlock: Int32Array.from(plateBlock),
		blocks: blocks.length,
		ring,
		rings: Math.max(...ring) + 1
	};
	const treatmentWells = nGroups * d.replicates;
	const iterations = Math.round(Math.min(MAX_PROPOSALS, PROPOSALS_PER_WELL * treatmentWells) * effort);
	const optimiser = optimisePlacement(placement, iterations, rngFor(seed, STREAM.optimise));

	// --- wells, replicate numbers ----------------------------------------------------------------
	const replicateCounter = new Int32Array(nGroups);
	const plates: LayoutPlate[] = [];
	const labels = Array.from({ length: rows }, (_, r) => rowLabel(r));
	const names = Array.from({ length: rows * columns }, (_, k) => wellName(Math.floor(k / columns), k % columns));
	for (let p = 0; p < nPlates; p++) {
		const b = blocks[plateBlock[p]];
		const wells: WellAssignment[] = new Array(rows * columns);
		for (let r = 0; r < rows; r++) {
			for (let c = 0; c < columns; c++) {
				const inside = r >= off && r < rows - off && c >= off && c < columns - off;
				const cell = inside ? (r - off) * ku + (c - off) : -1;
				const o = inside ? occ[p * cells + cell] : EMPTY;
				let role: WellAssignment['role'] = 'empty';
				let reagent: string | null = null;
				let context: string | null = null;
				let replicate: number | null = null;
				if (o === CONTROL) {
					role = 'control';
					context = controlContext[p * cells + cell];
				} else if (o >= 0) {
					const g = placement.slotGroup[o];
					role = 'treatment';
					reagent = groupReagent[g];
					context = groupContext[g];
					replicate = ++replicateCounter[g];
				}
				wells[r * columns + c] = { plate: p + 1, row: labels[r], column: c + 1, well: names[r * columns + c], role, reagent, context, replicate };
			}
		}
		plates.push({ index: p + 1, context: b.context, wells });
	}

	const warnings = designWarnings(plan, d, contexts, blocks, { ru, ku, cells, nPlates, treatmentWells, nGroups });
	const shape = { format, excludeEdgeWells: budget.excludeEdgeWells, plates };
	return {
		format,
		seed,
		excludeEdgeWells: budget.excludeEdgeWells,
		reagents: [...d.reagents],
		contexts: [...d.contexts],
		plates,
		diagnostics: layoutDiagnostics(shape, { optimiser, warnings })
	};
}

/** Cautions about the design itself (not about a particular placement). */
function designWarnings(
	plan: Plan,
	d: Design,
	contexts: Context[],
	blocks: { context: string | null; plates: number }[],
	n: { ru: number; ku: number; cells: number; nPlates: number; treatmentWells: number; nGroups: number }
): string[] {
	const out: string[] = [];
	if (d.reagents.length === 0) out.push('The design has no reagents: the plates hold controls only.');
	if (d.replicates < 2) out.push('Only one replicate well per reagent and context: replicate noise cannot be estimated from the experiment itself.');
	if (d.controlsPerPlate === 0) out.push('No control wells: plate-to-plate offsets cannot be corrected on the controls.');
	else if (d.controlsPerPlate < Math.max(n.ru, n.ku))
		out.push(
			`${d.controlsPerPlate} controls per plate cannot reach all ${n.ru} usable rows and ${n.ku} usable columns; row or column corrections will lack controls in some of them.`
		);
	for (const b of blocks) {
		if (b.context === null) continue;
		const c = contexts.find((x) => x.id === b.context)!;
		out.push(
			b.plates === 1
				? `Context "${c.id}" (${c.name}) is applied to whole plates and has a single plate: its effect cannot be told apart from that plate's offset.`
				: `Context "${c.id}" (${c.name}) is applied to whole plates (${b.plates}): its effect is separable from plate offsets only through the controls and the spread over plates.`
		);
	}
	if (!plan.budget.excludeEdgeWells)
		out.push('Edge wells are in use. Outer wells often read differently from inner ones; the layout balances distance to the edge across reagents, but check edge effects in the pilot.');
	const unused = n.nPlates * (n.cells - d.controlsPerPlate) - n.treatmentWells;
	const roomForOneMore = n.nGroups > 0 && blocks.every((b) => {
		const groups = d.reagents.length * (b.context === null ? Math.max(1, contexts.filter((c) => c.level === 'well').length) : 1);
		return b.plates * (n.cells - d.controlsPerPlate) - groups * d.replicates >= groups && Math.ceil((d.replicates + 1) / b.plates) <= n.ru;
	});
	if (roomForOneMore)
		out.push(`${unused} usable wells stay empty: one more replicate per reagent and context would fit on the same ${n.nPlates} plate${n.nPlates > 1 ? 's' : ''}.`);
	else if (unused > 0) out.push(`${unused} usable wells stay empty.`);
	return out;
}
