/**
 * Seeded, splittable pseudo-random numbers: xoshiro128** (Blackman & Vigna 2018) seeded through
 * splitmix32. `rngFor(seed, ...path)` gives an independent stream for any path of integers
 * (e.g. [replicate, purpose]), so results are identical for a seed whatever the number of
 * workers or the order in which replicates run, and candidate designs can share common random
 * numbers by using the same path.
 */
import { ZIG_F, ZIG_K, ZIG_R, ZIG_W } from './ziggurat';

export interface Rng {
	/** The integers this stream was derived from. */
	readonly path: readonly number[];
	/** Uniform in [0, 1) with 32 bits of resolution. */
	next(): number;
	/** Standard normal (Marsaglia polar method). */
	normal(): number;
	/** Uniform integer in [0, n). */
	int(n: number): number;
	/**
	 * Fills out[offset … offset+count) with independent N(0, scale²) variates by the ziggurat
	 * method (see ziggurat.ts) — several times faster than `normal()` for bulk draws; a separate
	 * sequence from `normal()`.
	 */
	fillNormal(out: Float64Array, offset: number, count: number, scale?: number): void;
	/**
	 * Fills out[offset … offset+count) with uniforms in [0, 1): exactly the values that `count`
	 * calls of `next()` would return, in the same order, without a call per value.
	 */
	fillUniform(out: Float64Array, offset: number, count: number): void;
	/** Independent child stream. */
	split(key: number): Rng;
}

/** Output of splitmix32 for the state after `step` increments from `state` (its `step`-th draw). */
function splitmix32At(state: number, step: number): number {
	let z = (state + Math.imul(step, 0x9e3779b9)) >>> 0;
	z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
	z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
	return (z ^ (z >>> 16)) >>> 0;
}

/** Mixes a path of integers (any finite numbers; non-integers are truncated) into one 32-bit seed. */
function hashPath(path: readonly number[]): number {
	let h = 0x243f6a88;
	for (let i = 0; i < path.length; i++) {
		const v = Math.trunc(path[i]);
		h = mixWord(h, v >>> 0);
		h = mixWord(h, Math.floor(v / 4294967296) >>> 0);
		h = (h ^ (h >>> 13)) >>> 0;
	}
	return h >>> 0;
}

function mixWord(h: number, w: number): number {
	h = Math.imul(h ^ w, 0x9e3779b1) >>> 0;
	h = (h ^ (h >>> 15)) >>> 0;
	return Math.imul(h, 0x85ebca77) >>> 0;
}

class Xoshiro128 implements Rng {
	readonly path: readonly number[];
	/** State words a, b, c, d as int32 (typed storage avoids boxing 32-bit values). */
	private readonly s = new Int32Array(4);
	private spare = 0;
	private hasSpare = false;

	constructor(path: readonly number[]) {
		this.path = path;
		const h = hashPath(path);
		const s = this.s;
		s[0] = splitmix32At(h, 1);
		s[1] = splitmix32At(h, 2);
		s[2] = splitmix32At(h, 3);
		s[3] = splitmix32At(h, 4);
		if ((s[0] | s[1] | s[2] | s[3]) === 0) s[0] = 1;
	}

	/** Next output as a signed 32-bit integer (same bits as nextU32). */
	private nextI32(): number {
		const s = this.s;
		const b = s[1];
		const result = Math.imul(rotl(Math.imul(b, 5), 7), 9);
		const t = b << 9;
		s[2] ^= s[0];
		s[3] ^= s[1];
		s[1] ^= s[2];
		s[0] ^= s[3];
		s[2] ^= t;
		s[3] = rotl(s[3], 11);
		return result;
	}

	private nextU32(): number {
		return this.nextI32() >>> 0;
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

	fillNormal(out: Float64Array, offset: number, count: number, scale = 1): void {
		const st = this.s;
		const K = ZIG_K;
		const W = ZIG_W;
		let a = st[0];
		let b = st[1];
		let c = st[2];
		let d = st[3];
		// Draws that fall outside their layer's rectangle (about 3 %) are finished after the loop,
		// in order, so the hot loop has no calls and keeps the state in registers.
		let pending: number[] | null = null;
		const end = offset + count;
		for (let t = offset; t < end; t++) {
			// Inlined xoshiro128** step on local words (same sequence as nextI32).
			const b5 = Math.imul(b, 5);
			const u = Math.imul((b5 << 7) | (b5 >>> 25), 9);
			const sh = b << 9;
			c ^= a;
			d ^= b;
			b ^= c;
			a ^= d;
			c ^= sh;
			d = (d << 11) | (d >>> 21);
			const iz = u & 127;
			const hz = u >> 7;
			out[t] = scale * hz * W[iz];
			if (Math.abs(hz) >= K[iz]) (pending ??= []).push(t, u); // branch-free |hz| (a sign branch mispredicts half the time)
		}
		st[0] = a;
		st[1] = b;
		st[2] = c;
		st[3] = d;
		if (pending) for (let i = 0; i < pending.length; i += 2) out[pending[i]] = scale * this.zigguratSlow(pending[i + 1] >> 7, pending[i + 1] & 127);
	}

	fillUniform(out: Float64Array, offset: number, count: number): void {
		const st = this.s;
		let a = st[0];
		let b = st[1];
		let c = st[2];
		let d = st[3];
		const end = offset + count;
		for (let t = offset; t < end; t++) {
			// Inlined xoshiro128** step on local words (same sequence as nextI32).
			const b5 = Math.imul(b, 5);
			const u = Math.imul((b5 << 7) | (b5 >>> 25), 9);
			const sh = b << 9;
			c ^= a;
			d ^= b;
			b ^= c;
			a ^= d;
			c ^= sh;
			d = (d << 11) | (d >>> 21);
			out[t] = (u >>> 0) / 4294967296;
		}
		st[0] = a;
		st[1] = b;
		st[2] = c;
		st[3] = d;
	}

	/** Ziggurat rejection step for draws outside a layer's rectangle (Marsaglia & Tsang 2000, nfix). */
	private zigguratSlow(hz: number, iz: number): number {
		for (;;) {
			if (iz === 0) {
				let x: number;
				let y: number;
				do {
					x = -Math.log(1 - this.next()) / ZIG_R;
					y = -Math.log(1 - this.next());
				} while (y + y < x * x);
				return hz > 0 ? ZIG_R + x : -ZIG_R - x;
			}
			const x = hz * ZIG_W[iz];
			if (ZIG_F[iz] + this.next() * (ZIG_F[iz - 1] - ZIG_F[iz]) < Math.exp(-0.5 * x * x)) return x;
			const u = this.nextI32();
			iz = u & 127;
			hz = u >> 7;
			if (Math.abs(hz) < ZIG_K[iz]) return hz * ZIG_W[iz];
		}
	}

	split(key: number): Rng {
		return new Xoshiro128([...this.path, key]);
	}
}

/** 32-bit rotate left; int32 result. */
function rotl(x: number, k: number): number {
	return (x << k) | (x >>> (32 - k));
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
