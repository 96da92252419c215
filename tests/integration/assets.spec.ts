import { describe, expect, it } from 'vitest';
import { newClient } from './helpers';

/** The scripts a page loads, read from its HTML the way a browser finds them. */
async function scriptPaths() {
	const html = await (await newClient().get('/signin')).text();
	return [...html.matchAll(/\/_app\/immutable\/[^"'\s]+\.js/g)].map((m) => m[0]);
}

describe('static assets on a shop tablet', () => {
	it('serves the page scripts compressed to a browser that accepts it', async () => {
		const paths = await scriptPaths();
		expect(paths.length).toBeGreaterThan(0);
		for (const path of new Set(paths)) {
			const res = await fetch(newClient().baseUrl + path, {
				headers: { 'accept-encoding': 'br, gzip' }
			});
			expect(res.status, path).toBe(200);
			expect(res.headers.get('content-encoding'), path).toMatch(/^(br|gzip)$/);
			await res.arrayBuffer();
		}
	});
});
