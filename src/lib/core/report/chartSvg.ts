import { escapeXml } from '../layout/escapeXml';
import { formatNumber } from './formatNumber';
import { niceTicks, tickDecimals } from './niceTicks';
import type { BarChart, ChartRule, ChartSpec, HistogramChart, XYChart } from './types';

/** Colours of the report's charts (our own sober palette) and the four series styles. */
export const CHART_COLOURS = {
	ink: '#24221f',
	muted: '#6b655c',
	axis: '#8c867b',
	grid: '#e7e2d8',
	rule: '#8e2f25',
	fill: '#c9d3e0',
	series: ['#28466e', '#a4552a', '#3f6d3a', '#6d4a7e']
} as const;
const DASH = ['', '7 4', '2 3', '9 3 2 3'];

const W = 640;
const FONT = "font-family=\"Charter, 'Bitstream Charter', Cambria, Georgia, serif\"";
const n2 = (x: number) => String(Math.round(x * 100) / 100);

function clip(text: string, max: number): string {
	return text.length > max ? text.slice(0, max - 1) + '…' : text;
}

function text(x: number, y: number, s: string, attrs = ''): string {
	return `<text x="${n2(x)}" y="${n2(y)}"${attrs ? ' ' + attrs : ''}>${escapeXml(s)}</text>`;
}

function open(height: number, title: string): string {
	return (
		`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${height}" viewBox="0 0 ${W} ${height}" role="img" aria-label="${escapeXml(title)}" ${FONT} font-size="12" fill="${CHART_COLOURS.ink}">` +
		`<title>${escapeXml(title)}</title>` +
		text(0, 16, clip(title, 90), 'font-size="14" font-weight="bold"')
	);
}

/** Linear scale from a domain to a pixel range. */
function scale(d0: number, d1: number, r0: number, r1: number) {
	const k = d1 === d0 ? 0 : (r1 - r0) / (d1 - d0);
	return (v: number) => r0 + (v - d0) * k;
}

/** Ticks and the (tick-aligned) domain covering `values` (or the fixed domain). */
function axis(values: number[], fixed: [number, number] | undefined, integers = false): { ticks: number[]; domain: [number, number]; decimals: number } {
	let lo: number;
	let hi: number;
	if (fixed) [lo, hi] = fixed;
	else {
		const finite = values.filter(Number.isFinite);
		lo = finite.length ? Math.min(...finite) : 0;
		hi = finite.length ? Math.max(...finite) : 1;
		if (lo === hi) [lo, hi] = lo === 0 ? [0, 1] : [lo - Math.abs(lo) * 0.1, hi + Math.abs(hi) * 0.1];
	}
	let ticks = niceTicks(lo, hi, 5);
	if (integers) ticks = ticks.filter(Number.isInteger);
	if (integers && ticks.length < 2) ticks = niceTicks(Math.floor(lo), Math.max(Math.ceil(hi), Math.floor(lo) + 1), 2).filter(Number.isInteger);
	const domain: [number, number] = fixed ? [lo, hi] : [Math.min(lo, ticks[0]), Math.max(hi, ticks[ticks.length - 1])];
	if (fixed) ticks = ticks.filter((t) => t >= lo - 1e-12 && t <= hi + 1e-12);
	return { ticks, domain, decimals: integers ? 0 : tickDecimals(ticks) };
}

function ruleSvg(rule: ChartRule, x: (v: number) => number, y: (v: number) => number, box: { left: number; right: number; top: number; bottom: number }): string {
	const attrs = `stroke="${CHART_COLOURS.rule}" stroke-width="1.3" stroke-dasharray="5 3"`;
	if (rule.axis === 'y') {
		const py = y(rule.value);
		if (!(py >= box.top - 0.5 && py <= box.bottom + 0.5)) return '';
		return `<line x1="${n2(box.left)}" x2="${n2(box.right)}" y1="${n2(py)}" y2="${n2(py)}" ${attrs}/>` + text(box.right - 4, py - 4, clip(rule.label, 60), `text-anchor="end" font-size="11" fill="${CHART_COLOURS.rule}"`);
	}
	const px = x(rule.value);
	if (!(px >= box.left - 0.5 && px <= box.right + 0.5)) return '';
	// Vertical rules are labelled just above the plot area, where no data or value label sits.
	const anchor = px > (box.left + box.right) / 2 ? 'end' : 'start';
	return `<line x1="${n2(px)}" x2="${n2(px)}" y1="${n2(box.top - 2)}" y2="${n2(box.bottom)}" ${attrs}/>` + text(px + (anchor === 'end' ? -3 : 3), box.top - 5, clip(rule.label, 40), `text-anchor="${anchor}" font-size="11" fill="${CHART_COLOURS.rule}"`);
}

function markerSvg(shape: string, x: number, y: number, colour: string): string {
	if (shape === 'circle') return `<circle cx="${n2(x)}" cy="${n2(y)}" r="3.6" fill="${colour}"/>`;
	if (shape === 'square') return `<rect x="${n2(x - 3.3)}" y="${n2(y - 3.3)}" width="6.6" height="6.6" fill="#ffffff" stroke="${colour}" stroke-width="1.6"/>`;
	if (shape === 'triangle') return `<path d="M${n2(x)} ${n2(y - 4.2)}L${n2(x + 4)} ${n2(y + 3)}L${n2(x - 4)} ${n2(y + 3)}Z" fill="${colour}"/>`;
	return '';
}

function frame(box: { left: number; right: number; top: number; bottom: number }, xt: { ticks: number[]; decimals: number }, yt: { ticks: number[]; decimals: number }, x: (v: number) => number, y: (v: number) => number, xLabel: string, yLabel: string): string {
	let s = '';
	for (const t of yt.ticks) {
		const py = y(t);
		s += `<line x1="${n2(box.left)}" x2="${n2(box.right)}" y1="${n2(py)}" y2="${n2(py)}" stroke="${CHART_COLOURS.grid}"/>`;
		s += text(box.left - 6, py + 4, formatNumber(t, yt.decimals), `text-anchor="end" fill="${CHART_COLOURS.muted}"`);
	}
	for (const t of xt.ticks) {
		const px = x(t);
		s += `<line x1="${n2(px)}" x2="${n2(px)}" y1="${n2(box.bottom)}" y2="${n2(box.bottom + 4)}" stroke="${CHART_COLOURS.axis}"/>`;
		s += text(px, box.bottom + 17, formatNumber(t, xt.decimals), `text-anchor="middle" fill="${CHART_COLOURS.muted}"`);
	}
	s += `<path d="M${n2(box.left)} ${n2(box.top)}V${n2(box.bottom)}H${n2(box.right)}" fill="none" stroke="${CHART_COLOURS.axis}"/>`;
	s += text((box.left + box.right) / 2, box.bottom + 34, clip(xLabel, 80), 'text-anchor="middle"');
	s += text(14, (box.top + box.bottom) / 2, clip(yLabel, 40), `text-anchor="middle" transform="rotate(-90 14 ${n2((box.top + box.bottom) / 2)})"`);
	return s;
}

function xySvg(c: XYChart): string {
	const legendRows = Math.ceil(c.series.length / 3);
	const height = 300 + legendRows * 18;
	const box = { left: 62, right: W - 18, top: 40, bottom: 246 };
	const xs: number[] = [];
	const ys: number[] = [];
	for (const s of c.series)
		for (const p of s.points) {
			xs.push(p.x);
			ys.push(p.y, p.lo ?? p.y, p.hi ?? p.y);
		}
	for (const r of c.rules) (r.axis === 'x' ? xs : ys).push(r.value);
	const xt = axis(xs, c.xDomain, c.xIntegers);
	const yt = axis(ys, c.yDomain);
	const x = scale(xt.domain[0], xt.domain[1], box.left + 8, box.right - 8);
	const y = scale(yt.domain[0], yt.domain[1], box.bottom, box.top);
	let s = open(height, c.title) + frame(box, xt, yt, x, y, c.xLabel, c.yLabel);
	c.series.forEach((series, k) => {
		const colour = CHART_COLOURS.series[series.style % 4];
		const dash = DASH[series.style % 4];
		const pts = series.points.filter((p) => Number.isFinite(p.x) && Number.isFinite(p.y)).sort((a, b) => a.x - b.x);
		let g = `<g data-series="${k}">`;
		for (const p of pts)
			if (p.lo !== undefined && p.hi !== undefined && Number.isFinite(p.lo) && Number.isFinite(p.hi)) {
				const px = n2(x(p.x));
				g += `<path d="M${px} ${n2(y(p.lo))}V${n2(y(p.hi))}M${n2(x(p.x) - 3)} ${n2(y(p.lo))}h6M${n2(x(p.x) - 3)} ${n2(y(p.hi))}h6" stroke="${colour}" stroke-width="1" fill="none" opacity="0.75"/>`;
			}
		if (series.line && pts.length > 1)
			g += `<path d="${pts.map((p, i) => `${i ? 'L' : 'M'}${n2(x(p.x))} ${n2(y(p.y))}`).join('')}" fill="none" stroke="${colour}" stroke-width="1.8"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`;
		for (const p of pts) g += markerSvg(series.marker, x(p.x), y(p.y), colour);
		s += g + '</g>';
	});
	for (const r of c.rules) s += ruleSvg(r, x, y, box);
	// Legend: up to three entries per row below the x label.
	c.series.forEach((series, k) => {
		const colour = CHART_COLOURS.series[series.style % 4];
		const dash = DASH[series.style % 4];
		const lx = box.left + (k % 3) * 190;
		const ly = 300 + Math.floor(k / 3) * 18 - 10;
		s += `<line x1="${lx}" x2="${lx + 24}" y1="${ly}" y2="${ly}" stroke="${colour}" stroke-width="1.8"${series.line ? (dash ? ` stroke-dasharray="${dash}"` : '') : ' stroke-opacity="0"'}/>`;
		s += markerSvg(series.marker, lx + 12, ly, colour);
		s += text(lx + 30, ly + 4, clip(series.label, 26));
	});
	return s + '</svg>';
}

function histogramSvg(c: HistogramChart): string {
	const height = 290;
	const box = { left: 62, right: W - 18, top: 40, bottom: 246 };
	const xs = c.bins.flatMap((b) => [b.lo, b.hi]).concat(c.rules.filter((r) => r.axis === 'x').map((r) => r.value));
	const xt = axis(xs, xs.length ? [Math.min(...xs), Math.max(...xs)] : [0, 1]);
	const yt = axis([0, ...c.bins.map((b) => b.count)], undefined, true);
	const x = scale(xt.domain[0], xt.domain[1], box.left + 4, box.right - 4);
	const y = scale(0, yt.domain[1], box.bottom, box.top);
	let s = open(height, c.title) + frame(box, xt, yt, x, y, c.xLabel, c.yLabel);
	for (const b of c.bins) {
		if (b.count <= 0) continue;
		const x0 = x(b.lo);
		const x1 = x(b.hi);
		s += `<rect x="${n2(x0 + 0.5)}" y="${n2(y(b.count))}" width="${n2(Math.max(0.5, x1 - x0 - 1))}" height="${n2(box.bottom - y(b.count))}" fill="${CHART_COLOURS.fill}" stroke="${CHART_COLOURS.series[0]}" stroke-width="0.8"><title>${escapeXml(`${formatNumber(b.lo, 3)}–${formatNumber(b.hi, 3)}: ${b.count}`)}</title></rect>`;
	}
	for (const r of c.rules) s += ruleSvg(r, x, y, box);
	return s + '</svg>';
}

function barsSvg(c: BarChart): string {
	const rowH = 22;
	const labelW = 190;
	const box = { left: labelW + 8, right: W - 60, top: 42, bottom: 42 + Math.max(1, c.bars.length) * rowH };
	const height = box.bottom + 46;
	const xt = axis([], c.domain);
	const x = scale(c.domain[0], c.domain[1], box.left, box.right);
	const y = (v: number) => v; // rules on the value axis only
	let s = open(height, c.title);
	for (const t of xt.ticks) {
		const px = x(t);
		s += `<line x1="${n2(px)}" x2="${n2(px)}" y1="${box.top}" y2="${box.bottom}" stroke="${CHART_COLOURS.grid}"/>`;
		s += text(px, box.bottom + 16, formatNumber(t, xt.decimals), `text-anchor="middle" fill="${CHART_COLOURS.muted}"`);
	}
	c.bars.forEach((b, i) => {
		const top = box.top + i * rowH + 4;
		const v = Number.isFinite(b.value) ? Math.min(Math.max(b.value, c.domain[0]), c.domain[1]) : c.domain[0];
		s += text(labelW, top + 11, clip(b.label, 30), 'text-anchor="end"');
		s += `<rect x="${box.left}" y="${n2(top)}" width="${n2(Math.max(0, x(v) - box.left))}" height="${rowH - 8}" fill="${CHART_COLOURS.fill}" stroke="${CHART_COLOURS.series[0]}" stroke-width="0.8"><title>${escapeXml(`${b.label}: ${formatNumber(b.value, 3)}`)}</title></rect>`;
		s += text(x(v) + 5, top + 11, formatNumber(b.value, 3), `fill="${CHART_COLOURS.muted}" font-size="11"`);
	});
	s += `<path d="M${box.left} ${box.top}V${box.bottom}" stroke="${CHART_COLOURS.axis}"/>`;
	s += text((box.left + box.right) / 2, box.bottom + 34, clip(c.valueLabel, 80), 'text-anchor="middle"');
	for (const r of c.rules) if (r.axis === 'x') s += ruleSvg(r, x, y, box);
	return s + '</svg>';
}

/**
 * Draws a chart of the report as a self-contained SVG string: no scripts, no external
 * references, every label XML-escaped (titles, series names and category labels may hold user
 * text). Series differ in colour, dash pattern and marker shape so they stay apart in grey print.
 */
export function chartSvg(chart: ChartSpec): string {
	if (chart.kind === 'xy') return xySvg(chart);
	if (chart.kind === 'histogram') return histogramSvg(chart);
	if (chart.kind === 'bars') return barsSvg(chart);
	throw new RangeError(`chart.kind must be one of xy, histogram, bars, got ${(chart as { kind: unknown }).kind}`);
}

/**
 * Equal-width bins over [lo, hi] (the last bin closed) for a histogram; values outside are
 * counted in the end bins. Throws a RangeError for bins < 1 or a bad range.
 */
export function binValues(values: readonly number[], lo: number, hi: number, bins: number): { lo: number; hi: number; count: number }[] {
	if (!(Number.isInteger(bins) && bins >= 1)) throw new RangeError(`bins must be an integer ≥ 1, got ${bins}`);
	if (!(Number.isFinite(lo) && Number.isFinite(hi) && hi > lo)) throw new RangeError(`the range must be finite with hi > lo, got [${lo}, ${hi}]`);
	const width = (hi - lo) / bins;
	const out = Array.from({ length: bins }, (_, i) => ({ lo: lo + i * width, hi: i === bins - 1 ? hi : lo + (i + 1) * width, count: 0 }));
	for (const v of values) {
		if (!Number.isFinite(v)) continue;
		const i = Math.min(bins - 1, Math.max(0, Math.floor((v - lo) / width)));
		out[i].count++;
	}
	return out;
}
