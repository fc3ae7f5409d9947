import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseWellName, rowLabel, wellName } from '../../src/lib/core/layout';

// Source: ANSI/SLAS 4-2004 (Microplates — Well Positions): rows lettered from A at the top,
// columns numbered from 1 at the left; 96 = A–H × 1–12, 384 = A–P × 1–24 (REFERENCES.md,
// "Microplate geometry", secondary). 1536 = A–Z, AA–AF × 1–48: common convention, not read in
// the standard (REFERENCES.md says so).
describe('wellName (ANSI/SLAS 4-2004 naming)', () => {
	it('names the corner wells of the three formats', () => {
		expect(wellName(0, 0)).toBe('A1');
		expect(wellName(7, 11)).toBe('H12'); // last well of a 96-well plate
		expect(wellName(15, 23)).toBe('P24'); // last well of a 384-well plate
		expect(wellName(31, 47)).toBe('AF48'); // last well of a 1536-well plate (common convention)
	});
	it('continues after Z with AA…AF', () => {
		expect(rowLabel(25)).toBe('Z');
		expect(rowLabel(26)).toBe('AA');
		expect(rowLabel(31)).toBe('AF');
		expect(rowLabel(51)).toBe('AZ');
		expect(rowLabel(52)).toBe('BA');
	});
	it('parses names back, accepting lower case and zero-padded columns', () => {
		expect(parseWellName('A1')).toEqual({ row0: 0, col0: 0 });
		expect(parseWellName('p24')).toEqual({ row0: 15, col0: 23 });
		expect(parseWellName('AF48')).toEqual({ row0: 31, col0: 47 });
		expect(parseWellName('B07')).toEqual({ row0: 1, col0: 6 });
	});
	it('round-trips every well of every format (property)', () => {
		fc.assert(
			fc.property(fc.integer({ min: 0, max: 31 }), fc.integer({ min: 0, max: 47 }), (r, c) => {
				expect(parseWellName(wellName(r, c))).toEqual({ row0: r, col0: c });
			})
		);
	});
	it('rejects malformed names and indices with a message naming the input', () => {
		expect(() => parseWellName('1A')).toThrow(/"1A"/);
		expect(() => parseWellName('A0')).toThrow(/"A0"/);
		expect(() => parseWellName('')).toThrow(RangeError);
		expect(() => wellName(-1, 0)).toThrow(/row0/);
		expect(() => wellName(0, 1.5)).toThrow(/col0/);
	});
});
