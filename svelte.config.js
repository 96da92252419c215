import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	compilerOptions: {
		// Runes per file: library components written in the old syntax keep working.
		runes: ({ filename }) => (filename.split(/[/\\]/).includes('node_modules') ? undefined : true)
	},
	kit: {
		adapter: adapter({ out: 'build', precompress: true }),
		// The origin check of form posts is done in a hook (src/lib/server/request-origin.ts), so
		// that the JSON API can answer a non-JSON body in the contract's JSON error shape.
		csrf: { trustedOrigins: ['*'] }
	}
};

export default config;
