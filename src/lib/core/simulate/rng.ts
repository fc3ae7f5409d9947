/**
 * Seeded, splittable pseudo-random numbers: xoshiro128** (Blackman & Vigna 2018) seeded through
 * splitmix32. `rngFor(seed, ...path)` gives an independent stream for any path of integers
 * (e.g. [replicate, purpose]), so results are identical for a seed whatever the number of
 * workers or the order in which replicates run, and candidate designs can share common random
 * numbers by using the same path.
 */
export interface Rng {
	/** The integers this stream was derived from. */
	readonly path: readonly number[];
	/** Uniform in [0, 1) with 32 bits of resolution. */
	next(): number;
	/** Standard normal (Marsaglia polar method). */
	normal(): number;
	/** Uniform integer in [0, n). */
	int(n: number): number;
	/** Independent child stream. */
	split(key: number): Rng;
}

function splitmix32(state: number): () => number {
	let s = state >>> 0;
	return () => {
		s = (s + 0x9e3779b9) >>> 0;
		let z = s;
		z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
		z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
		return (z ^ (z >>> 16)) >>> 0;
	};
}

/** Mixes a path of integers (any finite numbers; non-integers are truncated) into one 32-bit seed. */
function hashPath(path: readonly number[]): number {
	let h = 0x243f6a88;
	for (const raw of path) {
		const v = Math.trunc(raw);
		const lo = v >>> 0;
		const hi = Math.floor(v / 4294967296) >>> 0;
		for (const w of [lo, hi]) {
			h = Math.imul(h ^ w, 0x9e3779b1) >>> 0;
			h = (h ^ (h >>> 15)) >>> 0;
			h = Math.imul(h, 0x85ebca77) >>> 0;
		}
		h = (h ^ (h >>> 13)) >>> 0;
	}
	return h >>> 0;
}

class Xoshiro128 implements Rng {
	readonly path: readonly number[];
	private a: number;
	private b: number;
	private c: number;
	private d: number;
	private spare = 0;
	private hasSpare = false;

	constructor(path: readonly number[]) {
		this.path = path;
		const sm = splitmix32(hashPath(path));
		this.a = sm();
		this.b = sm();
		this.c = sm();
		this.d = sm();
		if ((this.a | this.b | this.c | this.d) === 0) this.a = 1;
	}

	private nextU32(): number {
		const result = Math.imul(rotl(Math.imul(this.b, 5), 7), 9) >>> 0;
		const t = this.b << 9;
		this.c ^= this.a;
		this.d ^= this.b;
		this.b ^= this.c;
		this.a ^= this.d;
		this.c ^= t;
		this.d = rotl(this.d, 11);
		return result;
	}

	next(): number {
		return this.nextU32() / 4294967296;
	}

	normal(): number {
		if (this.hasSpare) {
			this.hasSpare = false;
			return this.spare;
		}
		let u: number, v: number, s: number;
		do {
			u = 2 * this.next() - 1;
			v = 2 * this.next() - 1;
			s = u * u + v * v;
		} while (s >= 1 || s === 0);
		const m = Math.sqrt((-2 * Math.log(s)) / s);
		this.spare = v * m;
		this.hasSpare = true;
		return u * m;
	}

	int(n: number): number {
		return Math.floor(this.next() * n);
	}

	split(key: number): Rng {
		return new Xoshiro128([...this.path, key]);
	}
}

function rotl(x: number, k: number): number {
	return ((x << k) | (x >>> (32 - k))) >>> 0;
}

/** A stream for `seed` and an optional path of integer keys. */
export function rngFor(seed: number, ...path: number[]): Rng {
	if (!Number.isFinite(seed)) throw new RangeError(`seed must be a finite number, got ${seed}`);
	return new Xoshiro128([seed, ...path]);
}

/** Fisher–Yates shuffle in place using `rng`; returns the array. */
export function shuffleInPlace<T>(items: T[], rng: Rng): T[] {
	for (let i = items.length - 1; i > 0; i--) {
		const j = rng.int(i + 1);
		const t = items[i];
		items[i] = items[j];
		items[j] = t;
	}
	return items;
}
