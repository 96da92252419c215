import type { Handle, HandleServerError, ServerInit } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { SESSION_COOKIE, validateSessionToken } from '$lib/server/auth/session';
import { getConfig } from '$lib/server/config';
import { prepare } from '$lib/server/db';
import { seedOnStart } from '$lib/server/seed';
import { startHousekeeping, sweepExpired } from '$lib/server/housekeeping';

export const init: ServerInit = async () => {
	getConfig(); // fail fast on a bad setting
	await prepare();
	await seedOnStart();
	await sweepExpired();
	startHousekeeping();
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

export const handle = sequence(requestId, securityHeaders, authenticate);

/** The unexpected: logged with the request id, shown to the person as a plain message with the id. */
export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const requestId = event.locals.requestId ?? crypto.randomUUID();
	if (status >= 500) {
		console.error(`[${requestId}] ${event.request.method} ${event.url.pathname}`, error);
		return { message: 'Something went wrong on our side.', requestId };
	}
	return { message, requestId };
};
