/**
 * Chart components for the notebook (chart.js 4, only the parts registered in
 * `registerCharts.ts`): a histogram, grouped bars and an x–y chart with intervals, each with a
 * text summary and a visually hidden table of its numbers.
 */
export { default as Histogram } from './Histogram.svelte';
export { default as BarChart } from './BarChart.svelte';
export { default as XYChart } from './XYChart.svelte';
export { default as ChartFrame } from './ChartFrame.svelte';
export { histogramBins, alignedRange, type HistogramBins } from './histogramBins';
export { SERIES_COLOURS, REFERENCE_COLOUR, HIGHLIGHT_COLOUR, seriesColour, withAlpha } from './palette';
export { fixed, percent, count } from './formatNumber';
export type { DataTable, XYSeries, BarSeries, ReferenceLine } from './types';
