import type { PlateFormat } from '../plan/types';

/** What a well holds: a reagent replicate, a negative control, or nothing (incl. excluded edge wells). */
export type WellRole = 'treatment' | 'control' | 'empty';

/**
 * One well of one plate. Plain data; the same fields as a line of the layout CSV.
 * - `plate`: 1-based plate number.
 * - `row`: row label ("A", …, "AF"); `column`: 1-based column number; `well`: e.g. "B7".
 * - `reagent`: reagent id for treatments, null for controls and empty wells (the CSV writes
 *   `control` in the reagent column of control wells).
 * - `context`: context id of the treatment or control; null for baseline wells and empty wells.
 * - `replicate`: 1-based number within its (reagent, context) group, counted in plate order
 *   then well order (A1, A2, …); null for controls and empty wells.
 */
export interface WellAssignment {
	plate: number;
	row: string;
	column: number;
	well: string;
	role: WellRole;
	reagent: string | null;
	context: string | null;
	replicate: number | null;
}

/**
 * One plate. `wells` lists every well of the plate in row-major order (A1, A2, …, A<cols>,
 * B1, …), so `wells[row0 * columns + col0]` is the well at (row0, col0).
 */
export interface LayoutPlate {
	/** 1-based plate number. */
	index: number;
	/** Plate-level context applied to the whole plate, or null for shared plates (baseline and well-level contexts). */
	context: string | null;
	wells: WellAssignment[];
}

/** Association of treatment group with one position variable. */
export interface AssociationStat {
	/** `cramersV` for nominal positions (plate, row, column), `etaSquared` for edge distance. */
	measure: 'cramersV' | 'etaSquared';
	/** The measure, in [0, 1]; 0 = no association. */
	value: number;
	/**
	 * Bias-corrected Cramér's V (Bergsma 2013) for nominal positions, null for η². With a few
	 * wells per group the plain V is large even for a perfectly balanced layout; read this one.
	 */
	corrected: number | null;
	/** `chiSquare`: Pearson test of independence; `kruskalWallis`: rank test across groups (tie-corrected). */
	test: 'chiSquare' | 'kruskalWallis';
	statistic: number;
	df: number;
	/** Upper-tail p-value from the chi-square distribution (jStat). Approximate for sparse tables. */
	pValue: number;
	/** Plate context the figure comes from (plate association is computed per group of plates sharing a context); null = shared plates or all plates. */
	scope: string | null;
}

export interface LayoutDiagnostics {
	/**
	 * Association of the (reagent, context) group of treatment wells with plate, row, column
	 * and edge distance. `plate` is the largest over the groups of plates that share a context
	 * (null when no group has two plates); row and column are over all plates; edge distance
	 * is the ring index counted from the outside.
	 */
	maxAssociation: { plate: AssociationStat | null; row: AssociationStat; column: AssociationStat; edge: AssociationStat };
	/** Controls per usable row and per usable column, smallest and largest over all plates. */
	controlsPerRow: { min: number; max: number };
	controlsPerColumn: { min: number; max: number };
	/**
	 * Shares (0–1) of (reagent, context) groups whose replicates are spread as evenly over their
	 * plates as the plate count allows (distinct plates when replicates ≤ plates), and that sit
	 * on distinct rows / distinct columns within every plate.
	 */
	replicateSpread: { groups: number; distinctPlates: number; distinctRows: number; distinctColumns: number };
	/** Wells by role; `excluded` counts the edge wells left empty by edge exclusion (they are also in `empty`). */
	counts: { treatment: number; control: number; empty: number; excluded: number };
	/**
	 * Placement optimiser: proposals tried, swaps accepted, imbalance score before and after
	 * (mean over groups; 0 = as balanced as whole wells allow, a random placement scores up to
	 * about 6). Null for a layout whose diagnostics were computed without a placement run.
	 */
	optimiser: { iterations: number; accepted: number; initialScore: number; finalScore: number } | null;
	warnings: string[];
}

export interface Layout {
	format: PlateFormat;
	seed: number;
	excludeEdgeWells: boolean;
	/** Reagent ids and context ids of the design, in design order (for legends and colours). */
	reagents: string[];
	contexts: string[];
	plates: LayoutPlate[];
	diagnostics: LayoutDiagnostics;
}

/** Options of `layoutDesign`. */
export interface LayoutOptions {
	/** Seed of the randomisation (default 1). The same seed gives the same layout bit for bit. */
	seed?: number;
	/**
	 * Multiplier of the optimiser's iteration budget (default 1 = 200 proposals per treatment
	 * well, at most 4 million); 0 keeps the seeded random placement unimproved.
	 */
	effort?: number;
}
