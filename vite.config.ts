import { sveltekit } from '@sveltejs/kit/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [sveltekit()],
	worker: { format: 'es' },
	test: {
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					include: ['test/**/*.test.ts'],
					exclude: ['test/**/*.e2e.test.ts'],
					environment: 'node',
					testTimeout: 60_000
				}
			},
			{
				extends: true,
				test: {
					name: 'browser',
					include: ['test/**/*.e2e.test.ts'],
					environment: 'node',
					testTimeout: 120_000,
					hookTimeout: 120_000,
					fileParallelism: false
				}
			}
		]
	}
});
