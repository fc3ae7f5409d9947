/**
 * Tables of the ziggurat method for standard normal variates (Marsaglia & Tsang 2000, "The
 * ziggurat method for generating random variables", J. Statistical Software 5(8)), 128 layers,
 * tail start R = 3.442619855899 and layer area V = 9.91256303526217e-3 from that paper.
 * Variant: the layer index comes from the low 7 bits of a 32-bit draw and the signed 25-bit
 * value from its high bits, so index and value do not share bits (the dependence noted by
 * Doornik 2005 for the original).
 */
export const ZIG_R = 3.442619855899;
const ZIG_V = 9.91256303526217e-3;
const M1 = 2 ** 24; // |signed 25-bit value| < 2^24

export const ZIG_K = new Int32Array(128);
export const ZIG_W = new Float64Array(128);
export const ZIG_F = new Float64Array(128);

(function build() {
	let dn = ZIG_R;
	let tn = dn;
	const q = ZIG_V / Math.exp(-0.5 * dn * dn);
	ZIG_K[0] = Math.floor((dn / q) * M1);
	ZIG_K[1] = 0;
	ZIG_W[0] = q / M1;
	ZIG_W[127] = dn / M1;
	ZIG_F[0] = 1;
	ZIG_F[127] = Math.exp(-0.5 * dn * dn);
	for (let i = 126; i >= 1; i--) {
		dn = Math.sqrt(-2 * Math.log(ZIG_V / dn + Math.exp(-0.5 * dn * dn)));
		ZIG_K[i + 1] = Math.floor((dn / tn) * M1);
		tn = dn;
		ZIG_F[i] = Math.exp(-0.5 * dn * dn);
		ZIG_W[i] = dn / M1;
	}
})();
