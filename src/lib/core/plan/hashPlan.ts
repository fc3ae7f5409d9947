import type { Plan } from './types';

/**
 * Hashes of plans, used to tell whether a stored result (simulation, sizing, layout…) was
 * computed from the plan's current inputs. Pure and deterministic in every runtime.
 */

const FNV64_OFFSET = 0xcbf29ce484222325n;
const FNV64_PRIME = 0x100000001b3n;

/** UTF-8 bytes of a string (no TextEncoder: the core runs without DOM or Node types). */
function utf8(text: string): number[] {
	const out: number[] = [];
	for (const ch of text) {
		const c = ch.codePointAt(0)!;
		if (c < 0x80) out.push(c);
		else if (c < 0x800) out.push(0xc0 | (c >> 6), 0x80 | (c & 63));
		else if (c < 0x10000) out.push(0xe0 | (c >> 12), 0x80 | ((c >> 6) & 63), 0x80 | (c & 63));
		else out.push(0xf0 | (c >> 18), 0x80 | ((c >> 12) & 63), 0x80 | ((c >> 6) & 63), 0x80 | (c & 63));
	}
	return out;
}

/**
 * 64-bit FNV-1a of the UTF-8 bytes of `text`, as 16 lowercase hex digits
 * (Fowler–Noll–Vo, offset basis 0xcbf29ce484222325, prime 0x100000001b3).
 */
export function fnv1a64(text: string): string {
	let h = FNV64_OFFSET;
	for (const byte of utf8(text)) {
		h ^= BigInt(byte);
		h = BigInt.asUintN(64, h * FNV64_PRIME);
	}
	return h.toString(16).padStart(16, '0');
}

/** JSON text with object keys sorted at every level, so equal values give equal text. */
export function canonicalJson(value: unknown): string {
	if (value === null || typeof value !== 'object') {
		if (typeof value === 'number' && !Number.isFinite(value)) return 'null';
		return JSON.stringify(value) ?? 'null';
	}
	if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
	const obj = value as Record<string, unknown>;
	const keys = Object.keys(obj)
		.filter((k) => obj[k] !== undefined)
		.sort();
	return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(obj[k])}`).join(',')}}`;
}

/**
 * Hash of everything in a plan that a computation can depend on: factors, reagents, contexts,
 * observation, budget, goal and design. Title, notes and section notes are left out, so editing
 * prose never makes a result stale. Key order does not matter; array order does (it is the
 * factor and reagent order that results are reported in).
 */
export function planInputHash(plan: Plan): string {
	return fnv1a64(
		canonicalJson({
			factors: plan.factors,
			reagents: plan.reagents,
			contexts: plan.contexts,
			observation: plan.observation,
			budget: plan.budget,
			goal: plan.goal,
			design: plan.design
		})
	);
}
