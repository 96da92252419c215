import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { authenticateApiKey } from './auth/api-keys';
import { hitRateLimit } from './auth/rate-limit';
import { can, type Permission } from './auth/roles';
import type { SessionUser } from './auth/session';
import { getConfig } from './config';
import { AppError } from './errors';
import { clientIp } from './http';

/** For pages and form actions: signed in, or off to the sign-in page and back afterwards. */
export function requireUser(event: RequestEvent): SessionUser {
	const user = event.locals.user;
	if (!user) {
		const next = event.url.pathname + event.url.search;
		redirect(303, `/signin?next=${encodeURIComponent(next)}`);
	}
	return user;
}

/** For pages and form actions: signed in and allowed, else 403. */
export function requirePermission(event: RequestEvent, permission: Permission): SessionUser {
	const user = requireUser(event);
	if (!can(user.role, permission)) {
		error(403, { message: 'Your role does not give access to this page.' });
	}
	return user;
}

/** An intake key ranks causes and runs calculators; everything else needs a person. */
const API_KEY_PERMISSIONS: Permission[] = ['diagnose:use', 'calculators:use'];

export type ApiCaller = {
	shopId: string;
	userId: string | null;
	apiKeyId: string | null;
};

/**
 * For JSON endpoints: a Bearer key of the shop or a session cookie, rate-limited per key (or
 * user) and per IP. Failures are AppErrors that apiHandler turns into the contract's shape.
 */
export async function authenticateApi(
	event: RequestEvent,
	permission: Permission
): Promise<ApiCaller> {
	const config = getConfig();
	const ip = clientIp(event);
	const ipLimit = await hitRateLimit(`api:ip:${ip}`, config.API_IP_RATE_LIMIT_PER_MINUTE, 60);
	if (!ipLimit.allowed) {
		throw new AppError('rate_limited', 'Too many requests from this address; slow down.', {
			retryAfterS: ipLimit.retryAfterS
		});
	}
	const authorization = event.request.headers.get('authorization');
	let caller: ApiCaller;
	if (authorization) {
		const match = /^Bearer\s+(\S+)$/i.exec(authorization);
		const key = match ? await authenticateApiKey(match[1]) : null;
		if (!key) throw new AppError('unauthenticated', 'The API key is missing, unknown or revoked.');
		if (!API_KEY_PERMISSIONS.includes(permission)) {
			throw new AppError('forbidden', 'API keys may not do this; sign in instead.');
		}
		caller = { shopId: key.shopId, userId: null, apiKeyId: key.id };
	} else if (event.locals.user) {
		if (!can(event.locals.user.role, permission)) {
			throw new AppError('forbidden', 'Your role may not do this.');
		}
		caller = { shopId: event.locals.user.shopId, userId: event.locals.user.id, apiKeyId: null };
	} else {
		throw new AppError('unauthenticated', 'Sign in or send an API key (Authorization: Bearer …).');
	}
	const bucket = caller.apiKeyId ? `api:key:${caller.apiKeyId}` : `api:user:${caller.userId}`;
	const limit = await hitRateLimit(bucket, config.API_RATE_LIMIT_PER_MINUTE, 60);
	if (!limit.allowed) {
		throw new AppError('rate_limited', 'Too many requests for this key; slow down.', {
			retryAfterS: limit.retryAfterS
		});
	}
	return caller;
}
