// Server start-up (config, migrations, seed, housekeeping) and the pipeline every request passes.
import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { SESSION_COOKIE, validateSessionToken } from '$lib/server/auth/session';
import { getConfig } from '$lib/server/config';
import { prepare } from '$lib/server/db';
import { seedOnStart } from '$lib/server/seed';
import { startHousekeeping, sweepExpired } from '$lib/server/housekeeping';
import { apiRateCounter } from '$lib/server/auth/api-rate-limit';
import { checkRequestOrigin } from '$lib/server/request-origin';
import { privateAndTransportHeaders } from '$lib/server/security-headers';
import { apiErrorsAsJson } from '$lib/server/api-errors';
import { refuseUnreadableForms } from '$lib/server/form-posts';

export const init: ServerInit = async () => {
	getConfig(); // fail fast on a bad setting
	await prepare();
	await seedOnStart();
	await sweepExpired();
	startHousekeeping();
	// adapter-node's graceful stop: write the last API hits before the process ends.
	process.once('sveltekit:shutdown', () => {
		apiRateCounter()
			.close()
			.catch((error) => console.error('writing API rate counters failed', error));
	});
};

const requestId: Handle = async ({ event, resolve }) => {
	event.locals.requestId = crypto.randomUUID();
	const response = await resolve(event);
	response.headers.set('x-request-id', event.locals.requestId);
	return response;
};

const authenticate: Handle = async ({ event, resolve }) => {
	const { user, session, refreshCookie } = await validateSessionToken(
		event.cookies.get(SESSION_COOKIE)
	);
	event.locals.user = user;
	event.locals.session = session;
	if (refreshCookie) {
		event.cookies.set(refreshCookie.name, refreshCookie.value, {
			...refreshCookie.attributes,
			path: '/'
		});
	}
	return resolve(event);
};

const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('x-content-type-options', 'nosniff');
	response.headers.set('referrer-policy', 'same-origin');
	if (!event.url.pathname.startsWith('/intake')) response.headers.set('x-frame-options', 'DENY');
	return response;
};

/**
 * The v1 API may be called from a shop's own website (its intake form) in the browser. Any origin
 * may call it with an API key; `*` never carries cookies, so a session cannot be used
 * cross-site (and SameSite=Lax keeps the cookie off cross-site posts anyway).
 */
const CORS_HEADERS = {
	'access-control-allow-origin': '*',
	'access-control-allow-methods': 'GET, POST, OPTIONS',
	'access-control-allow-headers': 'authorization, content-type',
	'access-control-expose-headers': 'retry-after, x-request-id',
	'access-control-max-age': '600'
};

const cors: Handle = async ({ event, resolve }) => {
	if (!event.url.pathname.startsWith('/api/v1/')) return resolve(event);
	if (event.request.method === 'OPTIONS')
		return new Response(null, { status: 204, headers: CORS_HEADERS });
	const response = await resolve(event);
	for (const [name, value] of Object.entries(CORS_HEADERS)) response.headers.set(name, value);
	return response;
};

export const handle = sequence(
	requestId,
	securityHeaders,
	privateAndTransportHeaders,
	cors,
	apiErrorsAsJson,
	checkRequestOrigin,
	refuseUnreadableForms,
	authenticate
);

/** The unexpected: logged with the request id, shown to the person as a plain message with the id. */
export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const requestId = event.locals.requestId ?? crypto.randomUUID();
	if (status >= 500) {
		console.error(`[${requestId}] ${event.request.method} ${event.url.pathname}`, error);
		return { message: 'Something went wrong on our side.', requestId };
	}
	return { message, requestId };
};
