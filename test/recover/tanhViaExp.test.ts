import { describe, expect, it } from 'vitest';
import { create, all } from 'mathjs';
import { expAccurate, tanhViaExp } from '../../src/lib/core/recover/tanhViaExp';

// Reference values: mathjs BigNumber arithmetic at 40 significant digits (a general-purpose
// library from the npm registry), rounded to double only at the end.
const big = create(all, { number: 'BigNumber', precision: 40 });
const refExp = (x: number) => Number(big.exp(big.bignumber(x)));
const refTanh = (x: number) => Number(big.tanh(big.bignumber(x)));
const EPS = 2 ** -52;

/** Multiples of 1/1024 from lo to hi in `step` units: exact doubles with exact short decimals, so the BigNumber reference sees exactly the same argument. */
function grid(lo: number, hi: number, step: number): number[] {
	const out: number[] = [];
	for (let i = Math.ceil(lo * 1024); i <= hi * 1024; i += step) out.push(i / 1024);
	return out;
}

describe('expAccurate / tanhViaExp (FastICA contrast kernel)', () => {
	it('e^x within 2 units of double rounding of the 40-digit value over [−700, 700]', () => {
		for (const x of [...grid(-700, 700, 3581), ...grid(-1, 1, 7), 2 ** -40, -(2 ** -40)]) {
			const ref = refExp(x);
			expect(Math.abs(expAccurate(x) - ref) / ref).toBeLessThanOrEqual(2 * EPS);
		}
	});

	it('tanh within 2 units in the last place of 1 (absolute) everywhere, and relatively for |x| ≥ 0.5', () => {
		for (const x of [...grid(-30, 30, 97), ...grid(-0.01, 0.01, 1)]) {
			const ref = refTanh(x);
			const got = tanhViaExp(x);
			expect(Math.abs(got - ref)).toBeLessThanOrEqual(2 * EPS);
			if (Math.abs(x) >= 0.5) expect(Math.abs(got - ref) / Math.abs(ref)).toBeLessThanOrEqual(2 * EPS);
		}
	});

	it('saturates to ±1 without overflow and is odd at the ends (tanh(±400) = ±1 in double precision)', () => {
		expect(tanhViaExp(400)).toBe(1);
		expect(tanhViaExp(-400)).toBe(-1);
		expect(tanhViaExp(1e300)).toBe(1);
		expect(tanhViaExp(-1e300)).toBe(-1);
		expect(tanhViaExp(0)).toBe(0);
	});
});
