/** Cross-site form protection for pages, and a JSON-only body rule for the API. */
import type { Handle } from '@sveltejs/kit';
import { apiError, mediaType } from './http';

const WRITE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
/** The content types a browser may send cross-site without a preflight ("simple" requests). */
const FORM_TYPES = ['application/x-www-form-urlencoded', 'multipart/form-data', 'text/plain'];

const isFormType = (request: Request) => FORM_TYPES.includes(mediaType(request));

/**
 * SvelteKit's own origin check answers before any hook runs, in plain text, so an API client
 * that sends `text/plain` (a bare `fetch` with a string body) got a non-JSON 403. The framework's
 * check is switched off in `svelte.config.js` (`csrf.trustedOrigins: ['*']`) and done here
 * instead, with the same rule for pages: a form-type write from another origin is refused. The
 * JSON API speaks only JSON, so a form-type body there is a 415 in the contract's shape, whatever
 * its origin (a cross-site one can carry no session cookie anyway: SameSite=Lax).
 */
export const checkRequestOrigin: Handle = async ({ event, resolve }) => {
	const { request, url } = event;
	if (!WRITE_METHODS.has(request.method) || !isFormType(request)) return resolve(event);
	if (url.pathname.startsWith('/api/')) {
		return apiError(
			'unsupported_media_type',
			'Send the request body as JSON, with the header content-type: application/json.'
		);
	}
	if (request.headers.get('origin') !== url.origin) {
		const message = `Cross-site ${request.method} form submissions are forbidden`;
		return request.headers.get('accept') === 'application/json'
			? new Response(JSON.stringify({ message }), {
					status: 403,
					headers: { 'content-type': 'application/json' }
				})
			: new Response(message, { status: 403, headers: { 'content-type': 'text/plain' } });
	}
	return resolve(event);
};
