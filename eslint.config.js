import js from '@eslint/js';
import tseslint from 'typescript-eslint';

// The core must stay pure: no DOM, no Svelte, no storage, no console, no Math.random.
const coreRestrictions = {
	files: ['src/lib/core/**/*.ts'],
	rules: {
		'no-restricted-imports': [
			'error',
			{
				patterns: [
					{ group: ['svelte', 'svelte/*', '$app/*', 'dexie', '**/storage/**', '**/ui/**', '**/workers/**'], message: 'src/lib/core is pure: no Svelte, $app, dexie, storage, UI or workers.' }
				]
			}
		],
		'no-restricted-globals': ['error', 'window', 'document', 'navigator', 'localStorage', 'indexedDB'],
		'no-restricted-properties': ['error', { object: 'Math', property: 'random', message: 'Use a seeded RNG from core/simulate/rng.' }],
		'no-console': 'error'
	}
};

export default tseslint.config(
	{ ignores: ['build/', '.svelte-kit/', 'node_modules/', '**/*.svelte'] },
	js.configs.recommended,
	...tseslint.configs.recommended,
	{
		languageOptions: { globals: { console: 'readonly', process: 'readonly', URL: 'readonly', setTimeout: 'readonly', clearTimeout: 'readonly', performance: 'readonly', self: 'readonly', structuredClone: 'readonly', TextEncoder: 'readonly', crypto: 'readonly' } },
		rules: {
			'@typescript-eslint/no-explicit-any': 'off',
			'@typescript-eslint/no-unused-vars': ['warn', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
			'no-constant-condition': 'off',
			'prefer-const': 'warn'
		}
	},
	coreRestrictions
);
