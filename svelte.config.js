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
		csrf: { trustedOrigins: ['*'] },
		// SvelteKit adds a nonce (rendered pages) or a hash (prerendered) to its own inline script.
		// Style attributes stay allowed: components set widths inline (the rank bars).
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self'],
				'style-src-attr': ['unsafe-inline'],
				'img-src': ['self', 'data:'],
				'font-src': ['self'],
				'connect-src': ['self'],
				'form-action': ['self'],
				'base-uri': ['self'],
				'object-src': ['none']
			}
		}
	}
};

export default config;
