const ALPHABET = 'abcdefghijkmnpqrstuvwxyz23456789';

/**
 * A random record id of 12 characters from a 32-letter alphabet (60 bits), safe in URLs.
 * Uses `crypto.getRandomValues`, which (unlike `randomUUID`) also exists on plain-http pages.
 */
export function newId(): string {
	const bytes = new Uint8Array(12);
	crypto.getRandomValues(bytes);
	let id = '';
	for (const b of bytes) id += ALPHABET[b & 31];
	return id;
}
