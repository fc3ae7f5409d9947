import { describe, expect, it } from 'vitest';
import { escapeXml } from '../../src/lib/core/layout';
import { buildReport, renderReportHtml, REPORT_CSP, REPORT_STYLE } from '../../src/lib/core/report';
import { demoWithDesign, fullInputs, HOSTILE, hostilePlan, minimalInputs, startTags, strayAngles, templatePlans } from './fixtures';

/** Markup that must never come out of user text. */
const FORBIDDEN_TAGS = ['script', 'img', 'iframe', 'object', 'embed', 'link', 'base', 'textarea', 'form', 'input', 'image', 'use', 'foreignobject', 'audio', 'video', 'source'];

/**
 * Checks that an HTML text references nothing outside itself and holds no active content:
 * every start tag parsed (user text is escaped, so each raw "<" starts markup), no forbidden
 * element, no event-handler attribute, href/src only to #fragments or data: URIs, and no
 * url(…) or @import in styles except to #fragments or data:.
 */
function expectSelfContainedAndInert(html: string) {
	expect(strayAngles(html)).toBe(0);
	const tags = startTags(html);
	expect(tags.length).toBe((html.match(/<[A-Za-z]/g) ?? []).length);
	for (const t of tags) {
		expect(FORBIDDEN_TAGS, t.raw).not.toContain(t.name);
		if (t.name === 'meta') expect(t.attrs.find(([n]) => n === 'http-equiv')?.[1] ?? 'none', t.raw).not.toMatch(/refresh/i);
		for (const [name, value] of t.attrs) {
			expect(name.startsWith('on'), t.raw).toBe(false);
			if (name === 'href' || name === 'src' || name === 'xlink:href' || name === 'action' || name === 'formaction' || name === 'srcset' || name === 'poster') expect(value, t.raw).toMatch(/^(#|data:)/);
			if (name === 'style') expect(value, t.raw).not.toMatch(/url\(|@import|expression\(/i);
		}
	}
	const styles = [...html.matchAll(/<style>([\s\S]*?)<\/style>/g)].map((m) => m[1]);
	expect(styles.length).toBe(1);
	for (const css of styles) {
		expect(css).not.toMatch(/@import/i);
		for (const m of css.matchAll(/url\(\s*['"]?([^'")]*)/gi)) expect(m[1]).toMatch(/^(#|data:)/);
	}
	expect(html).not.toMatch(/<script/i);
}

describe('renderReportHtml', () => {
	it('escapes hostile titles, notes, names, currency, section notes and revision labels so they stay inert text', () => {
		const plan = hostilePlan();
		const html = renderReportHtml(buildReport(fullInputs(plan)));
		expectSelfContainedAndInert(html);
		// Each payload is present, escaped, as text.
		for (const p of Object.values(HOSTILE)) expect(html, p).toContain(escapeXml(p));
		// The tags and attributes the payloads try to create are absent.
		expect(html).not.toContain('<b id="pwned-3">');
		expect(html).not.toMatch(/<svg onload/i);
		expect(html).not.toContain('</textarea>');
		const attrs = startTags(html).flatMap((t) => t.attrs.map(([n]) => n));
		for (const n of ['onmouseover', 'onfocus', 'onerror', 'onload', 'data-x', 'data-y', 'rel']) expect(attrs).not.toContain(n);
		expect(html).not.toContain('https://example.invalid/track.png)}</style>');
		// The hostile title is escaped inside <title> and the section notes keep their (escaped) key.
		expect(html).toContain(`<title>${escapeXml(plan.title)} — planning report</title>`);
	});

	it('references nothing outside the file for every template plan, with and without results', () => {
		for (const { file, plan } of templatePlans()) {
			const html = renderReportHtml(buildReport(minimalInputs(plan)));
			expect(() => expectSelfContainedAndInert(html), file).not.toThrow();
		}
		expectSelfContainedAndInert(renderReportHtml(buildReport(fullInputs(demoWithDesign()))));
	});

	it('links only to its own sections, one anchor per section', () => {
		const model = buildReport(fullInputs(demoWithDesign()));
		const html = renderReportHtml(model);
		const ids = new Set(startTags(html).flatMap((t) => t.attrs.filter(([n]) => n === 'id').map(([, v]) => v)));
		const links = startTags(html).flatMap((t) => t.attrs.filter(([n]) => n === 'href').map(([, v]) => v));
		expect(links.length).toBeGreaterThanOrEqual(model.sections.length);
		for (const l of links) expect(ids.has(l.slice(1)), l).toBe(true);
	});

	it('forbids loading anything with its Content-Security-Policy and declares UTF-8', () => {
		const html = renderReportHtml(buildReport(minimalInputs(demoWithDesign())));
		expect(html.startsWith('<!DOCTYPE html>\n<html lang="en">\n<head>\n<meta charset="utf-8">')).toBe(true);
		expect(REPORT_CSP).toMatch(/default-src 'none'/);
		expect(REPORT_CSP).not.toMatch(/script-src/);
		expect(html).toContain(`<meta http-equiv="Content-Security-Policy" content="${escapeXml(REPORT_CSP)}">`);
	});

	it('has a print stylesheet: A4 pages, a page break before each section, rows, figures and short tables kept whole, repeated table headers', () => {
		expect(REPORT_STYLE).toMatch(/@page\{size:A4/);
		const print = REPORT_STYLE.slice(REPORT_STYLE.indexOf('@media print'));
		expect(print).toMatch(/section\.rp-section\{break-before:page/);
		expect(print).toMatch(/tr,figure,[^{]*\{break-inside:avoid/);
		expect(print).toMatch(/table\.rp-keep\{break-inside:avoid/);
		expect(print).toMatch(/thead\{display:table-header-group\}/);
		// Only system and serif fonts: no web font is declared.
		expect(REPORT_STYLE).not.toMatch(/@font-face/);
	});

	it('marks tables short enough to keep on one page, and lets long ones break between rows', () => {
		const html = renderReportHtml(buildReport(minimalInputs(demoWithDesign())));
		const tables = [...html.matchAll(/<table( class="rp-keep")?>[\s\S]*?<\/table>/g)];
		expect(tables.length).toBeGreaterThan(3);
		for (const t of tables) {
			const rows = (t[0].match(/<tr>/g) ?? []).length - 1;
			expect(Boolean(t[1]), `${rows} rows`).toBe(rows <= 28);
		}
	});
});
