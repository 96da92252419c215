/** The API contract's error codes with their HTTP statuses: the one list the handler and OpenAPI share. */

/** contract/api.md, "Errors": every error answer carries one of these codes. */
export const ERROR_STATUS = {
	invalid_request: 400,
	unauthenticated: 401,
	forbidden: 403,
	not_found: 404,
	method_not_allowed: 405,
	conflict: 409,
	too_large: 413,
	unsupported_media_type: 415,
	rate_limited: 429,
	internal_error: 500,
	/** Our extension: /api/health and /api/ready when the database cannot be read or written. */
	unavailable: 503
} as const;

export type ApiErrorCode = keyof typeof ERROR_STATUS;

export const ERROR_CODES = Object.keys(ERROR_STATUS) as [ApiErrorCode, ...ApiErrorCode[]];

/** The code for a status the framework answered by itself (a 405, a malformed path, …). */
export function errorCodeOfStatus(status: number): ApiErrorCode {
	const code = ERROR_CODES.find((candidate) => ERROR_STATUS[candidate] === status);
	if (code) return code;
	return status >= 500 ? 'internal_error' : 'invalid_request';
}
