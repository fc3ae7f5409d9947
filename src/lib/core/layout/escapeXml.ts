/**
 * Escapes text for XML/HTML element content and quoted attribute values, and drops the control
 * characters XML 1.0 does not allow (so any plan text yields a well-formed SVG).
 */
export function escapeXml(text: string): string {
	return text
		// eslint-disable-next-line no-control-regex
		.replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '')
		.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}
