import adapter from '@sveltejs/adapter-static';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// Client-only single-page app: every route falls back to index.html.
		adapter: adapter({ fallback: 'index.html' }),
		alias: { $core: 'src/lib/core' }
	}
};

export default config;
