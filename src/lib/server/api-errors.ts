/** The JSON API's answers that the framework writes by itself (a 405, a malformed path), in the contract's shape. */
import type { Handle } from '@sveltejs/kit';
import { errorCodeOfStatus, type ApiErrorCode } from '../api/error-codes';
import { apiError, INTERNAL_ERROR_MESSAGE } from './http';

const MESSAGES: Partial<Record<ApiErrorCode, string>> = {
	invalid_request: 'The request could not be read: check the path and the body.',
	not_found: 'There is no such endpoint.',
	too_large: 'The request body is too large.',
	unsupported_media_type: 'Send the request body as JSON, with content-type: application/json.',
	internal_error: INTERNAL_ERROR_MESSAGE
};

/** An error answer already in the contract's shape: `{ error: { code, message } }`. */
async function isContractError(response: Response): Promise<boolean> {
	if (!(response.headers.get('content-type') ?? '').startsWith('application/json')) return false;
	try {
		const body = (await response.clone().json()) as { error?: { code?: unknown } } | null;
		return typeof body?.error?.code === 'string';
	} catch {
		return false;
	}
}

/**
 * Every error under `/api/` is JSON (contract/api.md, "Errors"). The endpoints answer their own
 * through `apiHandler`; what SvelteKit answers before an endpoint runs (a method the path does not
 * have, a path that is not valid percent-encoding, no such path) is rewritten here, keeping the
 * status and the `Allow` header.
 */
export const apiErrorsAsJson: Handle = async ({ event, resolve }) => {
	if (!event.url.pathname.startsWith('/api/')) return resolve(event);
	const response = await resolve(event);
	if (response.status < 400 || (await isContractError(response))) return response;
	const code = errorCodeOfStatus(response.status);
	const allow = response.headers.get('allow') ?? undefined;
	const message =
		code === 'method_not_allowed'
			? `${event.request.method} is not allowed here${allow ? `; use ${allow}` : ''}.`
			: (MESSAGES[code] ?? 'The request was refused.');
	const answer = apiError(code, message, {
		allow,
		requestId: code === 'internal_error' ? event.locals.requestId : undefined
	});
	if (answer.status === response.status) return answer;
	// A status the contract has no code for keeps its status, in the contract's shape.
	return new Response(answer.body, { status: response.status, headers: answer.headers });
};
