import { escapeXml } from '../layout/escapeXml';
import { chartSvg } from './chartSvg';
import { formatUtc } from './sections/revisionsSection';
import type { ReportBlock, ReportCell, ReportModel, ReportSection, ReportTable, Tone } from './types';

/** Tables with at most this many rows are kept on one printed page; longer ones break between rows. */
export const KEEP_TABLE_ROWS = 28;

/**
 * Content-Security-Policy of the report: nothing may load from anywhere, no script may run,
 * only the report's own inline styles and `data:` images apply (defence in depth: every user
 * text is escaped as well).
 */
export const REPORT_CSP = "default-src 'none'; style-src 'unsafe-inline'; img-src data:; base-uri 'none'; form-action 'none'";

/** The report's stylesheet: a sober document look on screen, clean A4 pages in print. */
export const REPORT_STYLE = `
:root{--ink:#24221f;--muted:#6b655c;--rule:#d8d2c6;--paper:#fcfbf8;--band:#f3f0e9;--good:#2f5f33;--warn:#8a5a00;--bad:#8e2f25;--accent:#28466e}
*{box-sizing:border-box}
html{background:var(--paper)}
body{margin:0 auto;max-width:62rem;padding:2rem 2.2rem 3rem;color:var(--ink);background:var(--paper);font:16px/1.5 Charter,'Bitstream Charter','Sitka Text',Cambria,Georgia,serif}
header.rp-head{border-bottom:2px solid var(--ink);padding-bottom:.8rem;margin-bottom:1.2rem}
.rp-kicker{font-size:.8rem;letter-spacing:.08em;text-transform:uppercase;color:var(--muted);margin:0}
h1{font-size:1.9rem;line-height:1.2;margin:.2rem 0 .4rem;font-weight:700}
.rp-meta{color:var(--muted);font-size:.9rem;margin:0}
h2{font-size:1.35rem;margin:0 0 .7rem;padding-bottom:.25rem;border-bottom:1px solid var(--rule)}
h2 .rp-num{color:var(--muted);font-weight:400;margin-right:.4rem}
h3{font-size:1.05rem;margin:1.3rem 0 .4rem}
p{margin:.45rem 0}
.rp-prose{white-space:pre-line}
section.rp-section{margin:2.2rem 0 0}
.rp-glance{display:grid;grid-template-columns:repeat(auto-fit,minmax(15rem,1fr));gap:.5rem;margin:1rem 0 1.4rem;padding:0;list-style:none}
.rp-glance li{border:1px solid var(--rule);border-left:4px solid var(--muted);background:#fff;padding:.45rem .7rem}
.rp-glance li.tone-good{border-left-color:var(--good)}.rp-glance li.tone-warn{border-left-color:var(--warn)}.rp-glance li.tone-bad{border-left-color:var(--bad)}
.rp-glance .rp-label{display:block;font-size:.78rem;color:var(--muted)}
.rp-glance a{color:inherit;text-decoration:none}
nav.rp-toc{font-size:.92rem;columns:2;column-gap:2rem;margin:0 0 1rem}
nav.rp-toc h2{column-span:all;font-size:1rem;border:0;margin:0 0 .3rem}
nav.rp-toc ol{margin:0;padding-left:1.4rem}
nav.rp-toc a{color:var(--accent)}
.rp-none{color:var(--muted);font-style:italic}
table{border-collapse:collapse;width:100%;margin:.5rem 0 1rem;font-size:.86rem;background:#fff}
caption{caption-side:top;text-align:left;font-size:.82rem;color:var(--muted);padding:0 0 .25rem}
th,td{border-bottom:1px solid var(--rule);padding:.28rem .5rem;text-align:left;vertical-align:top}
th{border-bottom:1.5px solid var(--ink);font-weight:600;background:var(--band)}
td.num,th.num{text-align:right;font-variant-numeric:tabular-nums}
tbody tr:last-child td{border-bottom:1.5px solid var(--ink)}
code{font-family:ui-monospace,'DejaVu Sans Mono',Menlo,Consolas,monospace;font-size:.86em;overflow-wrap:anywhere}
td code{white-space:nowrap;overflow-wrap:normal}
.tone{font-weight:600;white-space:nowrap}
.tone-good .mark,.tone.tone-good{color:var(--good)}.tone.tone-warn{color:var(--warn)}.tone.tone-bad{color:var(--bad)}
dl.rp-facts{display:grid;grid-template-columns:minmax(12rem,max-content) 1fr;gap:.15rem 1.2rem;margin:.6rem 0 1rem;font-size:.93rem}
dl.rp-facts dt{color:var(--muted)}
dl.rp-facts dd{margin:0;overflow-wrap:anywhere}
ul.rp-list{margin:.4rem 0 1rem;padding-left:1.3rem}
ul.rp-list li{margin:.15rem 0}
.rp-callout{border:1px solid var(--rule);border-left:4px solid var(--accent);background:#fff;padding:.55rem .9rem;margin:.8rem 0 1rem}
.rp-callout h4{margin:0 0 .25rem;font-size:.95rem}
.rp-callout ul{margin:0;padding-left:1.2rem}
.rp-callout.tone-warning{border-left-color:var(--bad)}
.rp-callout.tone-caution{border-left-color:var(--warn);background:#fffaf0}
.rp-callout.tone-empty{border-style:dashed;border-left:4px dashed var(--muted);background:transparent;color:var(--muted)}
figure{margin:1rem 0 1.3rem}
figure svg{display:block;max-width:100%;height:auto}
figcaption{font-size:.83rem;color:var(--muted);margin-top:.3rem}
footer.rp-foot{margin-top:2.5rem;border-top:1px solid var(--rule);padding-top:.5rem;font-size:.8rem;color:var(--muted)}
@page{size:A4;margin:15mm 14mm 16mm}
@media print{
html,body{background:#fff}
body{max-width:none;padding:0;font-size:10pt}
nav.rp-toc a{color:inherit;text-decoration:none}
section.rp-section{break-before:page;page-break-before:always;margin-top:0}
section.rp-section:first-of-type{break-before:auto;page-break-before:auto;margin-top:1.5rem}
h2,h3,h4{break-after:avoid;page-break-after:avoid}
table{font-size:8.4pt}
thead{display:table-header-group}
tr,figure,.rp-callout,dl.rp-facts,.rp-glance li{break-inside:avoid;page-break-inside:avoid}
table.rp-keep{break-inside:avoid;page-break-inside:avoid}
figure svg{max-height:120mm;width:auto;margin:0 auto}
figure.rp-plate svg{max-height:150mm}
.rp-glance{grid-template-columns:repeat(3,1fr)}
footer.rp-foot{break-before:avoid}
}
`;

const esc = escapeXml;

const MARK: Record<Tone, string> = { good: '✓', warn: '!', bad: '✗', neutral: '' };

function cellHtml(cell: ReportCell, align: 'left' | 'right' | undefined, header = false): string {
	const tag = header ? 'th' : 'td';
	const cls = align === 'right' ? ' class="num"' : '';
	if (typeof cell === 'string') return `<${tag}${cls}>${esc(cell)}</${tag}>`;
	let inner = cell.mono ? `<code>${esc(cell.text)}</code>` : esc(cell.text);
	if (cell.tone && cell.tone !== 'neutral') inner = `<span class="tone tone-${cell.tone}"><span class="mark" aria-hidden="true">${MARK[cell.tone]}</span> ${inner}</span>`;
	return `<${tag}${cls}>${inner}</${tag}>`;
}

function tableHtml(t: ReportTable): string {
	const keep = t.rows.length <= KEEP_TABLE_ROWS ? ' class="rp-keep"' : '';
	const head = `<thead><tr>${t.columns.map((c) => `<th scope="col"${c.align === 'right' ? ' class="num"' : ''}>${esc(c.label)}</th>`).join('')}</tr></thead>`;
	const body = t.rows.length
		? t.rows.map((r) => `<tr>${t.columns.map((c, k) => cellHtml(r[k] ?? '', c.align)).join('')}</tr>`).join('\n')
		: `<tr><td colspan="${t.columns.length}" class="rp-none">none</td></tr>`;
	return `<table${keep}><caption>${esc(t.caption)}</caption>${head}<tbody>\n${body}\n</tbody></table>`;
}

function blockHtml(b: ReportBlock): string {
	switch (b.kind) {
		case 'heading':
			return `<h3>${esc(b.text)}</h3>`;
		case 'paragraph':
			return `<p${b.prose ? ' class="rp-prose"' : ''}>${esc(b.text)}</p>`;
		case 'facts':
			return `<dl class="rp-facts">${b.items.map((i) => `<dt>${esc(i.label)}</dt><dd>${esc(i.value)}</dd>`).join('')}</dl>`;
		case 'list':
			return `<ul class="rp-list">${b.items.map((i) => `<li>${esc(i)}</li>`).join('')}</ul>`;
		case 'table':
			return tableHtml(b.table);
		case 'chart':
			return `<figure class="rp-chart">${chartSvg(b.chart)}<figcaption>${esc(b.caption)}</figcaption></figure>`;
		case 'plateMap':
			// The SVG comes from the layout area's plateSvg, which escapes every text it writes.
			return `<figure class="rp-plate">${b.svg}<figcaption>${esc(b.caption)}</figcaption></figure>`;
		case 'callout':
			return `<div class="rp-callout tone-${b.tone}" role="note"><h4>${esc(b.title)}</h4><ul>${b.items.map((i) => `<li>${esc(i)}</li>`).join('')}</ul></div>`;
		default:
			throw new RangeError(`unknown report block kind ${JSON.stringify((b as { kind: unknown }).kind)}`);
	}
}

function sectionHtml(s: ReportSection, n: number): string {
	return (
		`<section class="rp-section" id="${esc(s.id)}" data-section="${esc(s.id)}" data-results="${s.hasResults ? 'yes' : 'no'}">\n` +
		`<h2><span class="rp-num">${n}.</span>${esc(s.title)}</h2>\n` +
		s.blocks.map(blockHtml).join('\n') +
		'\n</section>'
	);
}

/**
 * Renders a report model as one self-contained HTML document (UTF-8 text): no scripts, no
 * external resources (no fonts, images, styles or links outside the file — only `#section`
 * links), a Content-Security-Policy that forbids loading anything, every piece of text escaped
 * for element content and attributes, charts and plate maps as inline SVG, and a print
 * stylesheet that starts every section on a new A4 page and keeps short tables, figures and
 * table rows whole. Pure: runs in a worker.
 */
export function renderReportHtml(model: ReportModel): string {
	const toc = model.sections
		.map((s) => `<li><a href="#${esc(s.id)}">${esc(s.title)}</a>${s.hasResults ? '' : ' <span class="rp-none">(no results yet)</span>'}</li>`)
		.join('');
	const glance = model.glance
		.map((g) => `<li class="tone-${g.tone}"><a href="#${esc(g.section)}"><span class="rp-label">${esc(g.label)}</span>${g.tone !== 'neutral' ? `<span class="tone tone-${g.tone}" aria-hidden="true">${MARK[g.tone]}</span> ` : ''}${esc(g.value)}</a></li>`)
		.join('');
	return [
		'<!DOCTYPE html>',
		'<html lang="en">',
		'<head>',
		'<meta charset="utf-8">',
		`<meta http-equiv="Content-Security-Policy" content="${esc(REPORT_CSP)}">`,
		'<meta name="viewport" content="width=device-width, initial-scale=1">',
		`<meta name="generator" content="identiplate ${esc(model.appVersion)}">`,
		`<title>${esc(model.title)} — planning report</title>`,
		`<style>${REPORT_STYLE}</style>`,
		'</head>',
		'<body>',
		'<header class="rp-head">',
		'<p class="rp-kicker">Experiment planning report</p>',
		`<h1>${esc(model.title)}</h1>`,
		`<p class="rp-meta">Generated ${esc(formatUtc(model.generatedAt))} by identiplate ${esc(model.appVersion)} · plan SHA-256 <code>${esc(model.planSha256.slice(0, 16))}…</code></p>`,
		'</header>',
		`<ul class="rp-glance" aria-label="At a glance">${glance}</ul>`,
		`<nav class="rp-toc" aria-label="Contents"><h2>Contents</h2><ol>${toc}</ol></nav>`,
		model.sections.map((s, i) => sectionHtml(s, i + 1)).join('\n'),
		`<footer class="rp-foot">identiplate ${esc(model.appVersion)} · ${esc(model.generatedAt)} · plan SHA-256 <code>${esc(model.planSha256)}</code> · results hold only under the stated assumptions (see Cautions).</footer>`,
		'</body>',
		'</html>',
		''
	].join('\n');
}
