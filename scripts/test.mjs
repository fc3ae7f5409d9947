// `npm test`: install dependencies (and Debian's chromium) when missing, then run the type checks,
// lint, unit/property/reference tests, build the app and run the browser tests against the build.
import { existsSync } from 'node:fs';
import { ensureDeps, run } from './ensure-deps.mjs';

ensureDeps();
if (!existsSync('/usr/bin/chromium')) {
	console.log('Installing Debian chromium for the browser tests…');
	run('apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium');
}
run('npx svelte-kit sync');
run('npx svelte-check --tsconfig ./tsconfig.json --threshold error');
run('npx tsc -p tsconfig.core.json');
run('npx eslint src test bench scripts');
run('npx vitest run --project unit');
run('npx vite build');
run('npx vitest run --project browser');
