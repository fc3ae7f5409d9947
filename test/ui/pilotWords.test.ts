/** Texts of the Pilot section (src/lib/ui/pilot/pilotWords.ts). */
import { describe, expect, it } from 'vitest';
import { bytesText, problemText, ratioWords } from '../../src/lib/ui/pilot/pilotWords';

describe('ratioWords', () => {
	// Bands: within ±25 % good, within a factor of 2 warn, beyond bad (common practice, no published source).
	it('puts a pilot estimate against the plan in bands, edges included', () => {
		expect(ratioWords(0.5, 0.5)).toEqual({ text: '1.00 × the plan (within ±25 %)', tone: 'good' });
		expect(ratioWords(0.375, 0.5).tone).toBe('good');
		expect(ratioWords(0.625, 0.5).tone).toBe('good');
		expect(ratioWords(0.37, 0.5).tone).toBe('warn');
		expect(ratioWords(0.25, 0.5)).toEqual({ text: '0.50 × the plan (within a factor of 2)', tone: 'warn' });
		expect(ratioWords(1, 0.5).tone).toBe('warn');
		expect(ratioWords(1.01, 0.5)).toEqual({ text: '2.02 × the plan (more than a factor of 2 off)', tone: 'bad' });
		expect(ratioWords(0.2, 0.5).tone).toBe('bad');
	});

	it('says when there is nothing to compare', () => {
		expect(ratioWords(null, 0.5)).toEqual({ text: 'not estimable from this pilot', tone: 'neutral' });
		expect(ratioWords(Number.NaN, 0.5).tone).toBe('neutral');
		expect(ratioWords(0.3, 0)).toEqual({ text: 'the plan assumes 0', tone: 'neutral' });
	});
});

describe('bytesText', () => {
	it('uses decimal (SI) prefixes', () => {
		expect(bytesText(1)).toBe('1 byte');
		expect(bytesText(999)).toBe('999 bytes');
		expect(bytesText(1000)).toBe('1.0 kB');
		expect(bytesText(48_213)).toBe('48.2 kB');
		expect(bytesText(103_500_000)).toBe('103.5 MB');
		expect(bytesText(2_500_000_000)).toBe('2.5 GB');
		expect(bytesText(-1)).toBe('—');
	});
});

describe('problemText', () => {
	it('names the file, line and column of a problem', () => {
		expect(problemText({ line: 12, column: 'f3', expected: 'a finite number', got: '"abc"', message: '' }, 'pilot.csv')).toBe(
			'pilot.csv, line 12, column “f3”: expected a finite number, got "abc".'
		);
		expect(problemText({ line: 1, column: null, expected: 'a header row', got: '', message: '' }, 'empty.csv')).toBe('empty.csv, line 1: expected a header row.');
		expect(problemText({ line: null, column: null, expected: 'a readable file', got: '', message: '' }, 'x.csv')).toBe('x.csv: expected a readable file.');
	});
});
