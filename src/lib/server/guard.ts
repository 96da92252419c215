// Who may do what: the checks pages, form actions and API endpoints call before doing anything.
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { authenticateApiKey } from './auth/api-keys';
import type { PublishedEditionRow } from './editions';
import { apiRateCounter } from './auth/api-rate-limit';
import { can, type Permission, type Role } from './auth/roles';
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
	/** The signed-in person's role; null for an API key, whose rights are the key's own. */
	role: Role | null;
	apiKeyId: string | null;
	/** The shop's published edition when it was read with the key (null: none); left out for a
	 * session, whose edition is looked up when needed. */
	publishedEdition?: PublishedEditionRow | null;
};

/** Who is calling: an API key of a shop, or a signed-in person; an AppError when neither may. */
async function identifyCaller(
	event: RequestEvent,
	permission: Permission
): Promise<ApiCaller | AppError> {
	const authorization = event.request.headers.get('authorization');
	if (authorization) {
		const match = /^Bearer\s+(\S+)$/i.exec(authorization);
		const key = match ? await authenticateApiKey(match[1]) : null;
		if (!key) return new AppError('unauthenticated', 'The API key is missing, unknown or revoked.');
		if (!API_KEY_PERMISSIONS.includes(permission)) {
			return new AppError('forbidden', 'API keys may not do this; sign in instead.');
		}
		return {
			shopId: key.shopId,
			userId: null,
			role: null,
			apiKeyId: key.id,
			publishedEdition: key.publishedEdition
		};
	}
	const user = event.locals.user;
	if (!user) {
		return new AppError('unauthenticated', 'Sign in or send an API key (Authorization: Bearer …).');
	}
	if (!can(user.role, permission)) return new AppError('forbidden', 'Your role may not do this.');
	return { shopId: user.shopId, userId: user.id, role: user.role, apiKeyId: null };
}

/**
 * A further right an already authenticated caller needs for part of a request (opening a case
 * from a diagnosis): a person needs it in their role; an intake key has it when the contract
 * gives it to keys (`keysMay`).
 */
export function requireCallerPermission(
	caller: ApiCaller,
	permission: Permission,
	opts: { keysMay: boolean; message: string }
): void {
	const allowed = caller.role === null ? opts.keysMay : can(caller.role, permission);
	if (!allowed) throw new AppError('forbidden', opts.message);
}

/**
 * For JSON endpoints: a Bearer key of the shop or a session cookie, rate-limited per address and
 * per key (or user). Failures are AppErrors that apiHandler turns into the contract's shape.
 */
export async function authenticateApi(
	event: RequestEvent,
	permission: Permission
): Promise<ApiCaller> {
	const config = getConfig();
	const caller = await identifyCaller(event, permission);
	// Refused requests count against their address too (that is what slows key guessing);
	// accepted ones also against their key or user.
	const buckets = [
		{ key: `api:ip:${clientIp(event)}`, limit: config.API_IP_RATE_LIMIT_PER_MINUTE }
	];
	if (!(caller instanceof AppError)) {
		const key = caller.apiKeyId ? `api:key:${caller.apiKeyId}` : `api:user:${caller.userId}`;
		buckets.push({ key, limit: config.API_RATE_LIMIT_PER_MINUTE });
	}
	const limit = apiRateCounter().hit(buckets);
	if (!limit.allowed) {
		throw new AppError('rate_limited', 'Too many requests; slow down.', {
			retryAfterS: limit.retryAfterS
		});
	}
	if (caller instanceof AppError) throw caller;
	return caller;
}
