/** Shapes shared by the chart components. */
import type { ReferenceLine } from './referenceLines';

/** The numbers behind a chart, as a table for screen readers (visually hidden). */
export interface DataTable {
	caption: string;
	columns: string[];
	rows: string[][];
}

export type { ReferenceLine };

/** One series of an x–y chart. `lo`/`hi` (optional, per point) draw an interval whisker. */
export interface XYSeries {
	label: string;
	points: { x: number; y: number; lo?: number; hi?: number }[];
	/** Join the points with a line (default true). */
	line?: boolean;
	dashed?: boolean;
	/** Indices of points drawn larger and in the highlight colour. */
	highlight?: number[];
	colour?: string;
}

/** One series of a bar chart: one value per category (null = no bar). */
export interface BarSeries {
	label: string;
	values: (number | null)[];
	colour?: string;
}
