/**
 * tanh(x) = 1 − 2/(e^{2x} + 1) with e^{2x} from `expAccurate`: about twice as fast as Math.exp
 * or Math.tanh in V8 on the FastICA hot path, and accurate to a few units in the last place.
 * The argument of the exponential is clamped to ±700, where tanh is ±1 in double precision.
 */
export function tanhViaExp(x: number): number {
	let u = 2 * x;
	if (u > 700) u = 700;
	else if (u < -700) u = -700;
	return 1 - 2 / (expAccurate(u) + 1);
}

/** 2^(i − 1100) for i = 0 … 2200 (exact powers of two; those below 2^(−1074) are 0). */
const POW2 = new Float64Array(2201);
for (let i = 0; i < POW2.length; i++) POW2[i] = 2 ** (i - 1100);
/** ln 2 split so that k·LN2_HI is exact for |k| < 2^20 (Cody–Waite reduction; fdlibm's constants). */
const LN2_HI = 6.93147180369123816490e-1;
const LN2_LO = 1.90821492927058770002e-10;
const LOG2E = 1.4426950408889634;
// Taylor coefficients 1/i! for i = 2 … 13.
const C2 = 1 / 2;
const C3 = 1 / 6;
const C4 = 1 / 24;
const C5 = 1 / 120;
const C6 = 1 / 720;
const C7 = 1 / 5040;
const C8 = 1 / 40320;
const C9 = 1 / 362880;
const C10 = 1 / 3628800;
const C11 = 1 / 39916800;
const C12 = 1 / 479001600;
const C13 = 1 / 6227020800;

/**
 * e^x for x in [−700, 700]: x = k·ln 2 + r with |r| ≤ ln 2 / 2, e^r by its Taylor polynomial of
 * degree 13 (truncation error below 3e-18 relative) evaluated in Estrin's scheme, times 2^k
 * from a table. Outside [−700, 700] the result is undefined (callers clamp).
 */
export function expAccurate(x: number): number {
	const k = Math.floor(x * LOG2E + 0.5);
	const r = x - k * LN2_HI - k * LN2_LO;
	const r2 = r * r;
	const r4 = r2 * r2;
	const r8 = r4 * r4;
	const q0 = 1 + r + (C2 + C3 * r) * r2;
	const q1 = C4 + C5 * r + (C6 + C7 * r) * r2;
	const q2 = C8 + C9 * r + (C10 + C11 * r) * r2;
	const q3 = C12 + C13 * r;
	return (q0 + q1 * r4 + (q2 + q3 * r4) * r8) * POW2[k + 1100];
}
