import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// SvelteKit's cross-site form check stays on (its default): set ORIGIN when serving the build.
		adapter: adapter({ out: 'build' })
	}
};

export default config;
