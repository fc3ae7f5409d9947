/**
 * Plain data of the pilot area: the table read from a pilot CSV and the estimates made from it.
 * Everything here is serialisable (it crosses to workers and into IndexedDB unchanged).
 */

/** `control` marks a negative-control well, `positive` a positive-control well. */
export const NEGATIVE_CONTROL = 'control';
export const POSITIVE_CONTROL = 'positive';

export type PilotKind = 'wells' | 'cells';

/** One well of the pilot, after aggregating its cell rows (cells files) or as read (wells files). */
export interface PilotWell {
	/** Index into `PilotTable.plates`. */
	plate: number;
	/** Canonical ANSI/SLAS well name without zero padding, e.g. "B3", "AF48". */
	well: string;
	/** A plan reagent id, `control` or `positive`. */
	reagent: string;
	/** A plan context id, or null for the baseline (empty cell or no context column). */
	context: string | null;
	/** Rows aggregated into this well (cells in a cells file; 1 in a wells file). */
	rows: number;
	/** Line of the well's first row. */
	line: number;
}

/**
 * What `createPilotReader(...).finish()` returns. `values` holds the well profiles (means of the
 * well's rows), row-major: well i, feature j at `values[i * features.length + j]`.
 */
export interface PilotTable {
	kind: PilotKind;
	features: string[];
	plates: string[];
	wells: PilotWell[];
	values: Float64Array;
	/** Data rows read (cells in a cells file). */
	rows: number;
}

export interface PilotReaderOptions {
	/**
	 * `wells`: one row per well (a repeated well is an error). `cells`: one row per cell,
	 * averaged per well. `auto` (default): cells when there is a `cell` column or when more than
	 * half of the wells have several rows; otherwise wells.
	 */
	kind?: 'auto' | PilotKind;
	/** Plate format whose well names are accepted; default: the plan's `budget.plateFormat`. */
	plateFormat?: 96 | 384 | 1536;
	/** Fewest negative-control wells per plate (default 3: median and MAD need at least 3). */
	minControlsPerPlate?: number;
	/** Fewest wells per plan reagent and context (default 2: one well gives no replicate noise). */
	minReplicates?: number;
}

export interface PilotAnalysisOptions {
	/** Seed of the label permutations and the reproducibility null (default 1). */
	seed?: number;
	/** Label permutations for the signal-dimension null (default 200; 0 uses the edge rule only). */
	permutations?: number;
	/** Upper tail probability of the nulls (default 0.05). */
	alpha?: number;
	/**
	 * Feature used for Z′; default none: the wells are projected on the leave-one-out
	 * difference of the positive and negative control means (see `zPrimeMethod`).
	 */
	zPrimeFeature?: string;
	/** Control scaling: 'pooled' (default) or 'plate' (see normalisePilot). */
	scaling?: 'pooled' | 'plate';
	/** Most dimensions kept for the signal-dimension test (default 60). */
	maxDimensions?: number;
}

export interface PilotReagentEstimate {
	id: string;
	/** Wells of this reagent in the pilot (all contexts). */
	wells: number;
	/** Norm of the stated effect vector in factor SD units (the plan's value). */
	stated: number;
	/**
	 * Measured effect: norm of the effect vector in factor SD units, converted with the pilot's
	 * scale (see `PilotEstimates.scale`), divided by the stated efficacy. Null for `scale`
	 * reagents (they change spread, not means) and when the scale is unknown.
	 */
	effect: number | null;
	/**
	 * Mahalanobis distance of the reagent mean from the control mean, in replicate-noise SD
	 * units (bias-corrected with the pooled covariance, or with the Ledoit–Wolf covariance).
	 */
	distance: number;
	/** Mean pairwise Pearson correlation of the reagent's replicate profiles (null: < 2 wells or < 3 features). */
	reproducibility: number | null;
	/** True when `reproducibility` exceeds the null threshold of non-replicate pairs. */
	reproducible: boolean | null;
}

export interface PilotEstimates {
	kind: PilotKind;
	wells: number;
	rows: number;
	plates: string[];
	features: { total: number; kept: number; dropped: string[] };
	controls: { negative: number; positive: number };
	/**
	 * Conversion to plan units. `featureUnitsPerSd` (k) is the RMS per-feature shift (in
	 * control-normalised units) of a one-SD factor change: the mean measured effect norm of the
	 * pilot's reagents divided by the mean stated one (efficacy-weighted), so that the stated
	 * effects keep their SD units on average. Feature-space values are divided by k.
	 */
	scale: { featureUnitsPerSd: number | null; anchorReagents: string[]; cellsPerWell: number | null; rule: string };
	/** Replicate (well-to-well) noise SD in factor SD units (the plan's `observation.replicateNoise`). */
	replicateNoise: number | null;
	/** Measurement noise SD in plan feature units (the plan's `observation.measurementNoise`). */
	measurementNoise: number | null;
	/** Plate-to-plate offset SD in plan feature units (the plan's `observation.plateEffect`); null with one plate. */
	plateEffect: number | null;
	/** The same quantities in control-normalised feature units (variances per dimension). */
	featureSpace: {
		/** Replicate covariance eigenvalues above the noise bulk (descending). */
		noiseSpikes: number[];
		/** Mean eigenvalue of the noise bulk (measurement variance per feature). */
		bulkVariance: number;
		/** Threshold separating spikes from the bulk (bulk edge for unequal feature variances × a TW₁ 99% margin). */
		spikeThreshold: number;
		/** Between-plate variance of the control means per feature; null with one plate. */
		plateVariance: number | null;
		/** Residual degrees of freedom of the replicate covariance. */
		degreesOfFreedom: number;
	};
	/** Number of replicate-noise directions above the noise bulk (a second view of the factor count). */
	noiseDimension: number;
	/** Number of independent effect directions among the pilot's reagents. */
	signalDimension: number;
	signal: {
		/** `permutation` (default) or `edge` (when permutations = 0). */
		rule: 'permutation' | 'edge';
		/** Singular values of the noise-whitened group means, in replicate-noise SD units, descending. */
		singularValues: number[];
		/** Asymptotic noise edge for them (Marchenko–Pastur edge generalised to an estimated noise covariance). */
		edge: number;
		/** 1 − alpha quantile of the largest null singular value under label permutation; null when not run. */
		threshold: number | null;
		/** Count above `edge` (reported beside the permutation count). */
		dimensionByEdge: number;
		permutations: number;
		/** Dimensions kept for the test (principal components of the well profiles when fewer than the features). */
		dimensions: number;
		groups: number;
	};
	covariance: { method: 'pooled' | 'ledoit-wolf'; shrinkage: number };
	/** Z′ of the positive against the negative controls; null without ≥ 2 of each. */
	zPrime: number | null;
	zPrimeMethod: string;
	zPrimeByPlate: { plate: string; zPrime: number | null; positives: number; negatives: number }[];
	reproducibilityThreshold: number | null;
	reagents: PilotReagentEstimate[];
	/** Plain-words findings worth keeping with the plan. */
	notes: string[];
	/** Things that make the estimates less trustworthy. */
	warnings: string[];
}
