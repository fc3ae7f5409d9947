/**
 * A chart.js plugin that draws an interval (e.g. a Wilson 95 % interval) as a vertical
 * whisker through each point of a dataset:
 * `options.plugins.intervals.series = [{ dataset: 0, lo: [...], hi: [...] }]`, one lo/hi per point.
 */
import type { Chart, ChartType, Plugin } from 'chart.js';

export interface IntervalSeries {
	/** Index of the dataset whose points get whiskers. */
	dataset: number;
	lo: number[];
	hi: number[];
	colour?: string;
}

export interface IntervalsOptions {
	series?: IntervalSeries[];
}

declare module 'chart.js' {
	// eslint-disable-next-line @typescript-eslint/no-unused-vars
	interface PluginOptionsByType<TType extends ChartType> {
		intervals?: IntervalsOptions;
	}
}

export const intervals: Plugin<ChartType, IntervalsOptions> = {
	id: 'intervals',
	beforeDatasetsDraw(chart: Chart, _args, opts) {
		const series = opts?.series ?? [];
		const y = chart.scales.y;
		if (!series.length || !y) return;
		const { ctx } = chart;
		for (const s of series) {
			if (!chart.isDatasetVisible(s.dataset)) continue;
			const meta = chart.getDatasetMeta(s.dataset);
			const dataset = chart.data.datasets[s.dataset] as { borderColor?: unknown };
			ctx.save();
			ctx.strokeStyle = s.colour ?? (typeof dataset.borderColor === 'string' ? dataset.borderColor : '#555');
			ctx.globalAlpha = 0.55;
			ctx.lineWidth = 1.5;
			meta.data.forEach((point, i) => {
				const lo = s.lo[i];
				const hi = s.hi[i];
				if (!Number.isFinite(lo) || !Number.isFinite(hi)) return;
				const x = point.x;
				const top = y.getPixelForValue(hi);
				const bottom = y.getPixelForValue(lo);
				ctx.beginPath();
				ctx.moveTo(x, top);
				ctx.lineTo(x, bottom);
				ctx.moveTo(x - 3, top);
				ctx.lineTo(x + 3, top);
				ctx.moveTo(x - 3, bottom);
				ctx.lineTo(x + 3, bottom);
				ctx.stroke();
			});
			ctx.restore();
		}
	}
};
