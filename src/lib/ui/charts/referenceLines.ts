/**
 * A chart.js plugin that draws labelled reference lines (a goal, a budget) across the plot:
 * `options.plugins.referenceLines.lines = [{ axis: 'y', value: 0.9, label: 'goal' }]`.
 * A line whose value falls outside the visible scale is not drawn.
 */
import type { Chart, ChartType, Plugin } from 'chart.js';
import { REFERENCE_COLOUR } from './palette';

export interface ReferenceLine {
	/** 'x' draws a vertical line at x = value; 'y' a horizontal one at y = value. */
	axis: 'x' | 'y';
	value: number;
	label?: string;
	colour?: string;
	/** Canvas line dash; default [6, 4]. */
	dash?: number[];
}

export interface ReferenceLinesOptions {
	lines?: ReferenceLine[];
}

declare module 'chart.js' {
	// eslint-disable-next-line @typescript-eslint/no-unused-vars
	interface PluginOptionsByType<TType extends ChartType> {
		referenceLines?: ReferenceLinesOptions;
	}
}

export const referenceLines: Plugin<ChartType, ReferenceLinesOptions> = {
	id: 'referenceLines',
	afterDatasetsDraw(chart: Chart, _args, opts) {
		const lines = opts?.lines ?? [];
		if (!lines.length) return;
		const { ctx, chartArea: area } = chart;
		for (const line of lines) {
			const scale = chart.scales[line.axis];
			if (!scale || !Number.isFinite(line.value)) continue;
			const px = scale.getPixelForValue(line.value);
			const inside = line.axis === 'x' ? px >= area.left - 0.5 && px <= area.right + 0.5 : px >= area.top - 0.5 && px <= area.bottom + 0.5;
			if (!Number.isFinite(px) || !inside) continue;
			const colour = line.colour ?? REFERENCE_COLOUR;
			ctx.save();
			ctx.strokeStyle = colour;
			ctx.lineWidth = 1.5;
			ctx.setLineDash(line.dash ?? [6, 4]);
			ctx.beginPath();
			if (line.axis === 'x') {
				ctx.moveTo(px, area.top);
				ctx.lineTo(px, area.bottom);
			} else {
				ctx.moveTo(area.left, px);
				ctx.lineTo(area.right, px);
			}
			ctx.stroke();
			const text = line.label;
			if (text) {
				ctx.setLineDash([]);
				ctx.font = `600 11px ${chart.options.font?.family ?? 'sans-serif'}`;
				ctx.textBaseline = 'bottom';
				ctx.textAlign = 'left';
				const width = ctx.measureText(text).width;
				/** Writes the label with its left end at x and its baseline at y, on a light backing so bars do not hide it. */
				const label = (x: number, y: number) => {
					ctx.fillStyle = 'rgba(255, 255, 255, 0.85)';
					ctx.fillRect(x - 2, y - 12, width + 4, 13);
					ctx.fillStyle = colour;
					ctx.fillText(text, x, y);
				};
				if (line.axis === 'x') {
					const right = px + 4 + width > area.right;
					label(right ? px - 4 - width : px + 4, area.top + 13);
				} else {
					label(area.left + 4, px - 3 < area.top + 12 ? px + 14 : px - 3);
				}
			}
			ctx.restore();
		}
	}
};
