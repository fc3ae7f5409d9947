import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { binValues, chartSvg, formatMoney, formatNumber, formatPercent, niceStep, niceTicks, tickDecimals, type ChartSpec } from '../../src/lib/core/report';
import { startTags, strayAngles } from './fixtures';

describe('niceTicks', () => {
	it('gives the usual round ticks (common practice: steps of 1, 2 or 5 × 10^k)', () => {
		// Values: common practice for axis labelling (1–2–5 steps); worked by hand.
		expect(niceTicks(0, 1, 5)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
		expect(niceTicks(0, 100, 5)).toEqual([0, 20, 40, 60, 80, 100]);
		expect(niceTicks(0, 15000, 5)).toEqual([0, 5000, 10000, 15000]);
		expect(niceTicks(0.1, 0.3, 2)).toEqual([0.1, 0.2, 0.3]);
		expect(niceTicks(-3, 7, 5)).toEqual([-4, -2, 0, 2, 4, 6, 8]);
		expect(niceTicks(2, 2, 5)).toEqual([2]);
		expect(() => niceTicks(0, NaN)).toThrow(/finite/);
		expect(() => niceTicks(0, 1, 0)).toThrow(/count/);
	});

	it('covers the range with equal 1–2–5 steps and no rounding noise', () => {
		fc.assert(
			fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: 1e-6, max: 1e6, noNaN: true }), fc.integer({ min: 2, max: 10 }), (lo, span, count) => {
				const hi = lo + span;
				fc.pre(hi > lo);
				const t = niceTicks(lo, hi, count);
				const { mantissa, step } = niceStep(lo, hi, count);
				expect([1, 2, 5]).toContain(mantissa);
				// Bounds within a billionth of a step count as covered (the documented rounding allowance).
				expect(t[0]).toBeLessThanOrEqual(lo + 1e-9 * step + 1e-9 * Math.abs(lo));
				expect(t[t.length - 1]).toBeGreaterThanOrEqual(hi - 1e-9 * step - 1e-9 * Math.abs(hi));
				expect(t.length).toBeLessThanOrEqual(3 * count + 3);
				for (let i = 1; i < t.length; i++) expect(Math.abs(t[i] - t[i - 1] - step)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(t[i])));
				const d = tickDecimals(t);
				for (const v of t) expect(Number(v.toFixed(d))).toBe(v);
			}),
			{ numRuns: 300 }
		);
	});
});

describe('formatNumber', () => {
	it('is independent of the locale: fixed decimals, thousands commas from 10 000, a real minus sign, a dash for missing values', () => {
		expect(formatNumber(1234.5, 2)).toBe('1234.50');
		expect(formatNumber(15000, 2)).toBe('15,000.00');
		expect(formatNumber(-1234567.891, 1)).toBe('−1,234,567.9');
		expect(formatNumber(-0.0001, 2)).toBe('0.00');
		expect(formatNumber(NaN)).toBe('—');
		expect(formatNumber(null)).toBe('—');
		expect(formatMoney(1397.5, 'EUR')).toBe('1397.50 EUR');
		expect(formatPercent(0.8123)).toBe('81 %');
	});
});

describe('binValues', () => {
	it('counts every finite value once; the last bin is closed; outliers go to the end bins', () => {
		const bins = binValues([0, 0.25, 0.5, 0.75, 1, -3, 7, NaN], 0, 1, 4);
		expect(bins.map((b) => b.count)).toEqual([2, 1, 1, 3]);
		expect(bins[3].hi).toBe(1);
		fc.assert(
			fc.property(fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { maxLength: 200 }), fc.integer({ min: 1, max: 40 }), (xs, n) => {
				expect(binValues(xs, -1, 1, n).reduce((s, b) => s + b.count, 0)).toBe(xs.length);
			})
		);
		expect(() => binValues([1], 1, 1, 3)).toThrow(/range/);
		expect(() => binValues([1], 0, 1, 0)).toThrow(/bins/);
	});
});

const hostile = '<script>alert(1)</script>" onload="x';

const charts: ChartSpec[] = [
	{
		kind: 'xy',
		title: `Assurance ${hostile}`,
		xLabel: hostile,
		yLabel: 'assurance',
		series: [
			{ label: hostile, points: [{ x: 100, y: 0.2, lo: 0.1, hi: 0.3 }, { x: 300, y: 0.9, lo: 0.8, hi: 0.95 }, { x: 200, y: NaN }], line: true, marker: 'circle', style: 0 },
			{ label: 'second', points: [{ x: 150, y: 0.5 }], line: false, marker: 'square', style: 1 }
		],
		rules: [{ axis: 'y', value: 0.8, label: hostile }, { axis: 'x', value: 250, label: 'budget' }],
		yDomain: [0, 1]
	},
	{ kind: 'histogram', title: 'MCC', xLabel: 'MCC', yLabel: 'runs', bins: binValues([0.8, 0.85, 0.9, 0.95, 0.97], 0.5, 1, 20), rules: [{ axis: 'x', value: 0.9, label: hostile }] },
	{ kind: 'bars', title: 'Per factor', valueLabel: 'corr', bars: [{ label: hostile, value: 0.93 }, { label: 'b', value: Infinity }], domain: [0, 1], rules: [{ axis: 'x', value: 0.9, label: 'goal' }] }
];

describe('chartSvg', () => {
	it('draws self-contained SVG with every label escaped and no markup from the labels', () => {
		for (const c of charts) {
			const svg = chartSvg(c);
			expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
			expect(svg.endsWith('</svg>')).toBe(true);
			expect(svg).not.toMatch(/<script/i);
			expect(strayAngles(svg)).toBe(0);
			const tags = startTags(svg);
			expect(tags.length).toBe((svg.match(/<[A-Za-z]/g) ?? []).length);
			for (const t of tags) {
				for (const [name] of t.attrs) expect(name.startsWith('on'), `${t.raw}`).toBe(false);
				expect(t.attrs.some(([n]) => n === 'href' || n === 'xlink:href' || n === 'src')).toBe(false);
			}
			expect(svg).not.toContain('NaN');
			expect(svg).not.toContain('Infinity');
		}
		expect(chartSvg(charts[0])).toContain('&lt;script&gt;alert(1)&lt;/script&gt;&quot; onload=&quot;x');
	});

	it('draws one marker per finite point, one bar per non-empty bin and one bar per category', () => {
		const xy = chartSvg(charts[0]);
		expect((xy.match(/<g data-series="0">.*?<\/g>/)![0].match(/<circle/g) ?? []).length).toBe(2);
		const hist = chartSvg(charts[1]);
		expect((hist.match(/<rect /g) ?? []).length).toBe(charts[1].kind === 'histogram' ? charts[1].bins.filter((b) => b.count > 0).length : -1);
		expect((chartSvg(charts[2]).match(/<rect /g) ?? []).length).toBe(2);
		expect(() => chartSvg({ kind: 'pie' } as unknown as ChartSpec)).toThrow(/chart.kind/);
	});
});
