/**
 * SHA-256 (FIPS 180-4, section 6.2) in plain TypeScript: synchronous and free of Web Crypto,
 * Node and DOM, so the report builder runs unchanged in a worker, the browser and Node.
 */

/** First 32 bits of the fractional parts of the cube roots of the first 64 primes (FIPS 180-4, 4.2.2). */
const K = new Uint32Array([
	0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4, 0xab1c5ed5, 0xd807aa98, 0x12835b01, 0x243185be, 0x550c7dc3,
	0x72be5d74, 0x80deb1fe, 0x9bdc06a7, 0xc19bf174, 0xe49b69c1, 0xefbe4786, 0x0fc19dc6, 0x240ca1cc, 0x2de92c6f, 0x4a7484aa, 0x5cb0a9dc, 0x76f988da,
	0x983e5152, 0xa831c66d, 0xb00327c8, 0xbf597fc7, 0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967, 0x27b70a85, 0x2e1b2138, 0x4d2c6dfc, 0x53380d13,
	0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85, 0xa2bfe8a1, 0xa81a664b, 0xc24b8b70, 0xc76c51a3, 0xd192e819, 0xd6990624, 0xf40e3585, 0x106aa070,
	0x19a4c116, 0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a, 0x5b9cca4f, 0x682e6ff3, 0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208,
	0x90befffa, 0xa4506ceb, 0xbef9a3f7, 0xc67178f2
]);

/** Initial hash value: first 32 bits of the fractional parts of the square roots of the first 8 primes (FIPS 180-4, 5.3.3). */
const H0 = [0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a, 0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19];

/**
 * UTF-8 bytes of a string (RFC 3629). Lone surrogates become U+FFFD, as the WHATWG
 * `TextEncoder` does, so the bytes equal what a browser or Node would write to a file.
 */
export function utf8Bytes(text: string): Uint8Array {
	// At most 3 bytes per UTF-16 code unit (a surrogate pair: 4 bytes for 2 units).
	const out = new Uint8Array(text.length * 3);
	let n = 0;
	for (let i = 0; i < text.length; i++) {
		let c = text.charCodeAt(i);
		if (c >= 0xd800 && c <= 0xdbff && i + 1 < text.length) {
			const lo = text.charCodeAt(i + 1);
			if (lo >= 0xdc00 && lo <= 0xdfff) {
				c = 0x10000 + ((c - 0xd800) << 10) + (lo - 0xdc00);
				i++;
			} else c = 0xfffd;
		} else if (c >= 0xd800 && c <= 0xdfff) c = 0xfffd;
		if (c < 0x80) out[n++] = c;
		else if (c < 0x800) {
			out[n++] = 0xc0 | (c >> 6);
			out[n++] = 0x80 | (c & 63);
		} else if (c < 0x10000) {
			out[n++] = 0xe0 | (c >> 12);
			out[n++] = 0x80 | ((c >> 6) & 63);
			out[n++] = 0x80 | (c & 63);
		} else {
			out[n++] = 0xf0 | (c >> 18);
			out[n++] = 0x80 | ((c >> 12) & 63);
			out[n++] = 0x80 | ((c >> 6) & 63);
			out[n++] = 0x80 | (c & 63);
		}
	}
	return out.slice(0, n);
}

/** SHA-256 digest (32 bytes) of `bytes`. */
export function sha256Bytes(bytes: Uint8Array): Uint8Array {
	const n = bytes.length;
	// Padding (FIPS 180-4, 5.1.1): 0x80, zeros, then the bit length as a 64-bit big-endian integer.
	const blocks = Math.ceil((n + 9) / 64);
	const msg = new Uint8Array(blocks * 64);
	msg.set(bytes);
	msg[n] = 0x80;
	const bitsHigh = Math.floor(n / 0x20000000); // n * 8 / 2^32
	const bitsLow = (n * 8) >>> 0;
	const view = new DataView(msg.buffer);
	view.setUint32(msg.length - 8, bitsHigh);
	view.setUint32(msg.length - 4, bitsLow);

	const h = Uint32Array.from(H0);
	const w = new Uint32Array(64);
	const rotr = (x: number, k: number) => (x >>> k) | (x << (32 - k));
	for (let b = 0; b < blocks; b++) {
		// Message schedule (6.2.2 step 1).
		for (let t = 0; t < 16; t++) w[t] = view.getUint32(b * 64 + t * 4);
		for (let t = 16; t < 64; t++) {
			const x = w[t - 15];
			const y = w[t - 2];
			const s0 = rotr(x, 7) ^ rotr(x, 18) ^ (x >>> 3);
			const s1 = rotr(y, 17) ^ rotr(y, 19) ^ (y >>> 10);
			w[t] = (w[t - 16] + s0 + w[t - 7] + s1) >>> 0;
		}
		// Compression (steps 2–4).
		let [a, bb, c, d, e, f, g, hh] = h;
		for (let t = 0; t < 64; t++) {
			const S1 = rotr(e, 6) ^ rotr(e, 11) ^ rotr(e, 25);
			const ch = (e & f) ^ (~e & g);
			const t1 = (hh + S1 + ch + K[t] + w[t]) >>> 0;
			const S0 = rotr(a, 2) ^ rotr(a, 13) ^ rotr(a, 22);
			const maj = (a & bb) ^ (a & c) ^ (bb & c);
			const t2 = (S0 + maj) >>> 0;
			hh = g;
			g = f;
			f = e;
			e = (d + t1) >>> 0;
			d = c;
			c = bb;
			bb = a;
			a = (t1 + t2) >>> 0;
		}
		h[0] = (h[0] + a) >>> 0;
		h[1] = (h[1] + bb) >>> 0;
		h[2] = (h[2] + c) >>> 0;
		h[3] = (h[3] + d) >>> 0;
		h[4] = (h[4] + e) >>> 0;
		h[5] = (h[5] + f) >>> 0;
		h[6] = (h[6] + g) >>> 0;
		h[7] = (h[7] + hh) >>> 0;
	}
	const out = new Uint8Array(32);
	const ov = new DataView(out.buffer);
	for (let i = 0; i < 8; i++) ov.setUint32(i * 4, h[i]);
	return out;
}

/** SHA-256 of the UTF-8 bytes of `text` (or of raw bytes), as 64 lowercase hex digits. */
export function sha256Hex(input: string | Uint8Array): string {
	const digest = sha256Bytes(typeof input === 'string' ? utf8Bytes(input) : input);
	let s = '';
	for (const byte of digest) s += byte.toString(16).padStart(2, '0');
	return s;
}
