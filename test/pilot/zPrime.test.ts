import { describe, expect, it } from 'vitest';
import pkg from 'jstat';
import { analysePilot, parsePilotCsvText, zPrime, zPrimeFromMoments } from '../../src/lib/core/pilot';
import { demoPlan } from './fixtures';

const { jStat } = pkg;

// Controls of the computed example in REFERENCES.md ("Assay quality — Z′"), Zhang, Chung & Oldenburg
// 1999 formula (verified in the IUPAC Gold Book).
const POS = [95.2, 97.1, 94.8, 96.5, 95.9, 96.8, 94.3, 97.5];
const NEG = [12.3, 11.8, 13.1, 12.0, 11.5, 12.8, 11.2, 13.5];

describe('zPrime (Zhang, Chung & Oldenburg 1999)', () => {
	it('μ₊=100, σ₊=5, μ₋=10, σ₋=5 gives 0.6667 (REFERENCES.md computed example)', () => {
		expect(zPrimeFromMoments(100, 5, 10, 5)).toBeCloseTo(0.6667, 4);
		expect(zPrimeFromMoments(10, 5, 100, 5)).toBeCloseTo(0.6667, 4); // |μ₊ − μ₋| is symmetric
	});

	it('the eight-well example gives 0.92987 with sample SDs (n − 1) (REFERENCES.md computed example)', () => {
		expect(zPrime(POS, NEG)).toBeCloseTo(0.92987, 5);
	});

	it('uses the n − 1 SD convention: agrees with jStat sample SDs, differs from population SDs', () => {
		const viaJstat = 1 - (3 * (jStat.stdev(POS, true) + jStat.stdev(NEG, true))) / Math.abs(jStat.mean(POS) - jStat.mean(NEG));
		const population = 1 - (3 * (jStat.stdev(POS, false) + jStat.stdev(NEG, false))) / Math.abs(jStat.mean(POS) - jStat.mean(NEG));
		expect(zPrime(POS, NEG)).toBeCloseTo(viaJstat, 12);
		expect(Math.abs(zPrime(POS, NEG) - population)).toBeGreaterThan(1e-3);
	});

	it('overlapping controls give Z′ ≤ 0; equal means give NaN; fewer than 2 values throw', () => {
		expect(zPrime([1, 2, 3], [1.5, 2.5, 3.5])).toBeLessThan(0);
		expect(zPrime([1, 3], [0, 4])).toBeNaN();
		expect(() => zPrime([1], [1, 2])).toThrow(/at least 2 positive/);
		expect(() => zPrimeFromMoments(1, -1, 0, 1)).toThrow(/≥ 0/);
	});

	it('analysePilot reports the same 0.92987 on a one-plate CSV, on the named feature and on the default projection', () => {
		const lines = ['plate,well,reagent,signal'];
		POS.forEach((v, i) => lines.push(`P1,B${i + 2},positive,${v}`));
		NEG.forEach((v, i) => lines.push(`P1,C${i + 2},control,${v}`));
		[40.1, 42.3, 41.7].forEach((v, i) => lines.push(`P1,D${i + 2},kb101,${v}`));
		const plan = demoPlan();
		const table = parsePilotCsvText(plan, lines.join('\n'));
		const named = analysePilot(plan, table, { zPrimeFeature: 'signal', permutations: 20 });
		expect(named.zPrime).toBeCloseTo(0.92987, 5);
		expect(named.zPrimeMethod).toMatch(/signal.*n − 1/);
		// One feature: the leave-one-out direction is +1, and Z′ is invariant to the per-plate shift and scale.
		const projected = analysePilot(plan, table, { permutations: 20 });
		expect(projected.zPrime).toBeCloseTo(0.92987, 5);
		expect(projected.zPrimeByPlate).toEqual([{ plate: 'P1', zPrime: projected.zPrime, positives: 8, negatives: 8 }]);
	});
});
