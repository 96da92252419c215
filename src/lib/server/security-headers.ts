/** Headers that keep signed-in pages out of caches and, in production, the site on HTTPS. */
import type { Handle } from '@sveltejs/kit';
import { isProduction } from './config';
import { SESSION_COOKIE } from './auth/session';

/** One year, the floor for browsers' preload lists (hstspreload.org); subdomains included. */
const HSTS = 'max-age=31536000; includeSubDomains';

const setsSessionCookie = (response: Response) =>
	response.headers.getSetCookie().some((cookie) => cookie.startsWith(`${SESSION_COOKIE}=`));

/**
 * A page or its data (`__data.json`, form actions, the JSON API) answered to a signed-in person,
 * or an answer that sets or clears the session cookie, must not be stored by a browser or proxy:
 * the next person at a shared bay computer could read it from the cache. HSTS only in production,
 * where the site is served over HTTPS; a development server on http would be unreachable.
 */
export const privateAndTransportHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	if (event.locals.user || setsSessionCookie(response)) {
		response.headers.set('cache-control', 'no-store');
	}
	if (isProduction()) response.headers.set('strict-transport-security', HSTS);
	return response;
};
