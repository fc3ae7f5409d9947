import { describe, expect, it } from 'vitest';
import { edgeDistance, FOOTPRINT, plateGeometry, wellCentre } from '../../src/lib/core/layout';
import { edgeWellCount } from '../../src/lib/core/size/costModel';

// Check values: REFERENCES.md "Microplate geometry — ANSI/SLAS 1-2004 (footprint), ANSI/SLAS
// 4-2004 (well positions)" (secondary): footprint 127.76 × 85.48 mm; pitch and A1 centre offsets
// from the left and top edges per format.
const ANSI_SLAS = [
	{ format: 96, rows: 8, columns: 12, pitch: 9.0, a1x: 14.38, a1y: 11.24, last: 'H12' },
	{ format: 384, rows: 16, columns: 24, pitch: 4.5, a1x: 12.13, a1y: 8.99, last: 'P24' },
	{ format: 1536, rows: 32, columns: 48, pitch: 2.25, a1x: 11.005, a1y: 7.865, last: 'AF48' }
] as const;

describe('plate geometry per ANSI/SLAS 1-2004 and 4-2004', () => {
	it('footprint is 127.76 mm × 85.48 mm (ANSI/SLAS 1-2004)', () => {
		expect(FOOTPRINT).toEqual({ width: 127.76, height: 85.48 });
	});
	it.each(ANSI_SLAS)('$format wells: rows, columns, pitch, A1 centre', (ref) => {
		const g = plateGeometry(ref.format);
		expect([g.rows, g.columns, g.pitch, g.a1x, g.a1y]).toEqual([ref.rows, ref.columns, ref.pitch, ref.a1x, ref.a1y]);
		expect(g.rowLabels[g.rows - 1] + g.columns).toBe(ref.last);
		expect(wellCentre(ref.format, 0, 0)).toEqual({ x: ref.a1x, y: ref.a1y });
	});
	it.each(ANSI_SLAS)('$format wells: x = xA1 + (col−1)·pitch, y = yA1 + (row−1)·pitch (REFERENCES.md formula)', (ref) => {
		for (const [r, c] of [
			[1, 0],
			[0, 1],
			[3, 5],
			[ref.rows - 1, ref.columns - 1]
		]) {
			const { x, y } = wellCentre(ref.format, r, c);
			expect(x).toBeCloseTo(ref.a1x + c * ref.pitch, 9);
			expect(y).toBeCloseTo(ref.a1y + r * ref.pitch, 9);
		}
	});
	// REFERENCES.md, computed consistency: wells are centred on the footprint, e.g.
	// 11.005 + 47 × 2.25 + 11.005 = 127.76 — so the last well sits as far from the right and
	// bottom edges as A1 from the left and top.
	it.each(ANSI_SLAS)('$format wells are centred on the footprint', (ref) => {
		const last = wellCentre(ref.format, ref.rows - 1, ref.columns - 1);
		expect(FOOTPRINT.width - last.x).toBeCloseTo(ref.a1x, 9);
		expect(FOOTPRINT.height - last.y).toBeCloseTo(ref.a1y, 9);
	});
	// REFERENCES.md: "Outer 36 of 96 wells form the edge ring" (Mansoury et al. 2021, verified).
	it('edge distance: 36 wells of a 96-well plate are in the outer ring, rings count inward', () => {
		let outer = 0;
		for (let r = 0; r < 8; r++) for (let c = 0; c < 12; c++) if (edgeDistance(96, r, c) === 0) outer++;
		expect(outer).toBe(36);
		expect(outer).toBe(edgeWellCount(96));
		expect(edgeDistance(96, 1, 1)).toBe(1);
		expect(edgeDistance(96, 3, 5)).toBe(3);
		expect(edgeDistance(384, 15, 10)).toBe(0);
		expect(edgeDistance(1536, 16, 20)).toBe(15);
	});
	it('rejects unknown formats and wells outside the plate', () => {
		expect(() => plateGeometry(48 as never)).toThrow(/96, 384, 1536/);
		expect(() => wellCentre(96, 8, 0)).toThrow(/row0 must be an integer in \[0, 7\]/);
		expect(() => wellCentre(384, 0, 24)).toThrow(/col0 must be an integer in \[0, 23\]/);
	});
});
