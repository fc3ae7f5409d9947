import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createHash } from 'node:crypto';
import { sha256Bytes, sha256Hex, utf8Bytes } from '../../src/lib/core/report';

/** Node's SHA-256 (OpenSSL): the reference implementation the pure-TS one must agree with. */
const reference = (data: string | Uint8Array) => createHash('sha256').update(data).digest('hex');

describe('sha256Hex', () => {
	it('gives the FIPS 180-2 Appendix B example digests', () => {
		// Source: FIPS 180-2 (NIST 2002), Appendix B.1 "abc" and B.2 (448-bit message); empty string from the NIST
		// SHA-256 example values. Each is also checked against node:crypto below.
		const cases: [string, string][] = [
			['abc', 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'],
			['abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq', '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1'],
			['', 'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855']
		];
		for (const [msg, digest] of cases) {
			expect(sha256Hex(msg)).toBe(digest);
			expect(reference(msg)).toBe(digest);
		}
	});

	it('gives the FIPS 180-2 Appendix B.3 digest of one million "a"', () => {
		// Source: FIPS 180-2 (NIST 2002), Appendix B.3.
		expect(sha256Hex('a'.repeat(1_000_000))).toBe('cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0');
	});

	it('agrees with node:crypto at every padding boundary (lengths 0–130 bytes)', () => {
		for (let n = 0; n <= 130; n++) {
			const bytes = Uint8Array.from({ length: n }, (_, i) => (i * 37 + n) & 255);
			expect(sha256Hex(bytes), `length ${n}`).toBe(reference(bytes));
		}
	});

	it('agrees with node:crypto on random Unicode text, including astral characters and lone surrogates', () => {
		fc.assert(
			fc.property(fc.string({ unit: 'binary', maxLength: 200 }), (s) => {
				expect(sha256Hex(s)).toBe(reference(Buffer.from(s, 'utf8')));
			}),
			{ numRuns: 100 }
		);
	});

	it('hashes a template plan file exactly as node:crypto hashes its bytes on disk', async () => {
		const { readFileSync } = await import('node:fs');
		const bytes = readFileSync('templates/demo.json');
		expect(sha256Hex(bytes.toString('utf8'))).toBe(reference(bytes));
		expect(sha256Bytes(new Uint8Array(bytes)).length).toBe(32);
	});
});

describe('utf8Bytes', () => {
	it('encodes like Buffer.from(text, "utf8") (WHATWG: lone surrogates become U+FFFD)', () => {
		// Source: RFC 3629 encoding; replacement of lone surrogates as in the WHATWG Encoding Standard (TextEncoder).
		const samples = ['', 'A', 'é', '€', '𝄞', 'Z′ ≥ 0.5', '\ud800', 'a\udc00b', '\ud83d\ude00'];
		for (const s of samples) expect(Array.from(utf8Bytes(s))).toEqual(Array.from(Buffer.from(s, 'utf8')));
		expect(Array.from(utf8Bytes('€'))).toEqual([0xe2, 0x82, 0xac]); // RFC 3629 section 3 example range (U+0800–U+FFFF → 3 bytes)
	});
});
