import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { parseArgs, seedFlag } from '../../src/cli/args';
import { seedRule } from '../../src/lib/core/plan/constraints';

// One seed range for every command and for the notebook's seed fields (the constraint table).
describe('--seed', () => {
	it('accepts 0 … 2^32 − 1 and defaults to the fallback', () => {
		expect(seedFlag(parseArgs([]))).toBe(1);
		expect(seedFlag(parseArgs([]), 7)).toBe(7);
		expect(seedFlag(parseArgs(['--seed', '0']))).toBe(0);
		expect(seedFlag(parseArgs(['--seed', '4294967295']))).toBe(4294967295);
		expect(seedRule.max).toBe(4294967295);
		expect(() => seedFlag(parseArgs(['--seed', '4294967296']))).toThrow(/--seed must be an integer in \[0, 4294967295\], got "4294967296"/);
		expect(() => seedFlag(parseArgs(['--seed', '-1']))).toThrow(/--seed must be an integer/);
	});

	it.each([
		['simulate', 'templates/demo.json'],
		['size', 'templates/demo.json'],
		['layout', 'templates/demo.json', '--csv', '/tmp/identiplate-seed-test.csv'],
		['pilot', 'templates/demo.json', 'static/demo-pilot.csv'],
		['report', 'templates/demo.json', '--out', '/tmp/identiplate-seed-test.html']
	])('%s refuses a seed outside the shared range with exit 2', (...args) => {
		const r = spawnSync(process.execPath, ['bin/identiplate.mjs', ...args, '--seed', '4294967296'], { encoding: 'utf8' });
		expect(r.status).toBe(2);
		expect(r.stderr).toMatch(/--seed must be an integer in \[0, 4294967295\]/);
	});
});
