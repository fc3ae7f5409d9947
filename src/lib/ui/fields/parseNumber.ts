import { checkRule, describeRule, type NumberRule } from '$core/plan';

/** What a number field's text means: a value to write, nothing yet (still typing), or a problem. */
export type NumberEntry = { kind: 'value'; value: number | undefined } | { kind: 'incomplete' } | { kind: 'invalid'; message: string };

const NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;
const PREFIX = /^([-+]?\.?|[-+]?(\d+\.?\d*|\.\d+)[eE][-+]?)$/;

/**
 * Reads the text of a number field against its rule. A decimal comma ("1,5") is read as a
 * point. Empty text is `undefined` when `allowEmpty`, else a problem. Text that could still
 * become a number ("-", "1e") is `incomplete`. Never returns NaN.
 */
export function parseNumberEntry(text: string, rule: NumberRule, allowEmpty: boolean, extra?: (v: number) => string | null): NumberEntry {
	const t = text.trim();
	const expected = describeRule(rule);
	if (t === '') return allowEmpty ? { kind: 'value', value: undefined } : { kind: 'invalid', message: `Expected ${expected}; this field cannot be empty.` };
	const normalised = /^[-+]?\d*,\d+$/.test(t) ? t.replace(',', '.') : t;
	if (PREFIX.test(normalised)) return { kind: 'incomplete' };
	if (!NUMBER.test(normalised)) return { kind: 'invalid', message: `Expected ${expected}, got "${t}".` };
	const value = Number(normalised);
	const problem = checkRule(rule, value);
	if (problem) return { kind: 'invalid', message: `Expected ${problem}, got ${t}.` };
	const more = extra?.(value);
	if (more) return { kind: 'invalid', message: more };
	return { kind: 'value', value };
}
