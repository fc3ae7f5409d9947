/**
 * The collaborator report: inputs gathered from the other areas, and the model built from them.
 * Everything here is plain, serialisable data (it crosses to a worker and into IndexedDB unchanged).
 */
import type { CheckResult } from '../identify/types';
import type { Layout } from '../layout/types';
import type { Plan } from '../plan/types';
import type { SimulationSummary } from '../simulate/types';
import type { SizeResult } from '../size/types';

/** Section ids, in the order the report shows them. */
export type ReportSectionId = 'question' | 'inputs' | 'verdicts' | 'simulation' | 'sizing' | 'design' | 'layout' | 'pilot' | 'revisions' | 'cautions' | 'reproducibility';

/**
 * What the report needs from a pilot analysis (the fields of the pilot area's `PilotEstimates`
 * it reads; a `PilotEstimates` object fits as it is).
 */
export interface PilotFindings {
	kind: 'wells' | 'cells';
	wells: number;
	rows: number;
	plates: string[];
	features: { total: number; kept: number; dropped: string[] };
	controls: { negative: number; positive: number };
	replicateNoise: number | null;
	measurementNoise: number | null;
	plateEffect: number | null;
	signalDimension: number;
	noiseDimension: number;
	signal: { rule: 'permutation' | 'edge'; singularValues: number[]; edge: number; threshold: number | null; dimensionByEdge: number };
	zPrime: number | null;
	zPrimeMethod: string;
	reagents: { id: string; wells: number; stated: number; effect: number | null; distance: number; reproducibility: number | null; reproducible: boolean | null }[];
	notes: string[];
	warnings: string[];
}

/** One saved revision: its number, label, when it was saved (ms since 1970 or ISO text) and its plan. */
export interface ReportRevision {
	number: number;
	label: string;
	createdAt: number | string;
	plan: Plan;
}

/**
 * Inputs of `buildReport`. Only `plan`, `check`, `generatedAt`, `appVersion` and `seeds` are
 * required; a missing result makes its section say plainly that there are no results yet.
 * - `plan`: the plan as it is now (the working copy); `check`: `checkPlan(plan)`.
 * - `simulation`: a simulation of the adopted or recommended design (or of the default design).
 * - `sizing`: `sizePlan(plan, …)`; `layout`: `layoutDesign(plan, design, …)` of the report's design.
 * - `pilot`: pilot estimates; `pilotPlan` [plan]: the plan the pilot was analysed against (its
 *   assumptions are set beside the estimates — pass it when `plan` already carries the pilot's values).
 * - `revisions`: saved revisions (any order; sorted by number).
 * - `generatedAt`: ISO 8601 date-time of the report; `appVersion`: the app's version (package.json).
 * - `seeds`: the seed of each random result, by name (e.g. `{ simulation: 1, sizing: 1, layout: 1 }`).
 * - `planText` [serializePlan(plan)]: the plan file text whose SHA-256 the report prints.
 * - `planFileName` [none]: shown beside the hash.
 * - `command` [none]: the command line that produced the report, shown for re-running it.
 * - `unavailable` [{}]: per section, why a result could not be computed (shown instead of the
 *   generic "no results yet" hint).
 * - `maxPlateMaps` [12]: plate maps drawn at most (the rest are listed; the layout CSV has every well).
 */
export interface ReportInputs {
	plan: Plan;
	check: CheckResult;
	simulation?: SimulationSummary | null;
	sizing?: SizeResult | null;
	layout?: Layout | null;
	pilot?: PilotFindings | null;
	pilotPlan?: Plan | null;
	revisions?: ReportRevision[];
	generatedAt: string;
	appVersion: string;
	seeds: Record<string, number>;
	planText?: string;
	planFileName?: string;
	command?: string;
	unavailable?: Partial<Record<ReportSectionId, string>>;
	maxPlateMaps?: number;
}

/** Tone of a table cell or callout; rendered as a word or mark as well as a colour. */
export type Tone = 'good' | 'warn' | 'bad' | 'neutral';

export type ReportCell = string | { text: string; tone?: Tone; mono?: boolean };

export interface ReportTable {
	caption: string;
	columns: { label: string; align?: 'left' | 'right' }[];
	rows: ReportCell[][];
}

/** A point with an optional interval (e.g. Wilson 95 %) drawn as a vertical bar. */
export interface ChartPoint {
	x: number;
	y: number;
	lo?: number;
	hi?: number;
}

export interface ChartSeries {
	label: string;
	points: ChartPoint[];
	/** Join the points with a line (in x order). */
	line: boolean;
	/** Marker shape; `none` draws no markers. */
	marker: 'circle' | 'square' | 'triangle' | 'none';
	/** Drawing style index (0–3): colour and dash pattern, distinct in grey print too. */
	style: number;
}

/** A horizontal (`y`) or vertical (`x`) reference line with its label, e.g. the goal. */
export interface ChartRule {
	axis: 'x' | 'y';
	value: number;
	label: string;
}

export interface XYChart {
	kind: 'xy';
	title: string;
	xLabel: string;
	yLabel: string;
	series: ChartSeries[];
	rules: ChartRule[];
	/** Axis ranges; absent = from the data with nice ticks. */
	xDomain?: [number, number];
	yDomain?: [number, number];
	/** Integer ticks only on x (e.g. replicates). */
	xIntegers?: boolean;
}

export interface HistogramChart {
	kind: 'histogram';
	title: string;
	xLabel: string;
	yLabel: string;
	/** Bins in x order: [lo, hi) (the last one closed), with counts. */
	bins: { lo: number; hi: number; count: number }[];
	rules: ChartRule[];
}

export interface BarChart {
	kind: 'bars';
	title: string;
	valueLabel: string;
	/** One horizontal bar per category, value in `domain`. */
	bars: { label: string; value: number }[];
	domain: [number, number];
	rules: ChartRule[];
}

export type ChartSpec = XYChart | HistogramChart | BarChart;

/** Content of a section, in display order. */
export type ReportBlock =
	| { kind: 'heading'; text: string }
	| { kind: 'paragraph'; text: string; prose?: boolean }
	| { kind: 'facts'; items: { label: string; value: string }[] }
	| { kind: 'list'; items: string[] }
	| { kind: 'table'; table: ReportTable }
	| { kind: 'chart'; chart: ChartSpec; caption: string }
	/** A plate map drawn by the layout area's `plateSvg` (all text in it already escaped). */
	| { kind: 'plateMap'; caption: string; svg: string }
	| { kind: 'callout'; tone: 'note' | 'warning' | 'caution' | 'empty'; title: string; items: string[] };

export interface ReportSection {
	id: ReportSectionId;
	title: string;
	/** False when the section has no results yet (it then holds an `empty` callout saying so). */
	hasResults: boolean;
	blocks: ReportBlock[];
}

/** The report as plain data: render it with `renderReportHtml`. */
export interface ReportModel {
	title: string;
	generatedAt: string;
	appVersion: string;
	/** SHA-256 of the plan file text (64 hex digits). */
	planSha256: string;
	/** The few headline results, each with a tone, for the top of the report. */
	glance: { label: string; value: string; tone: Tone; section: ReportSectionId }[];
	sections: ReportSection[];
}
