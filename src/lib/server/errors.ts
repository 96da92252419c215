/**
 * An expected failure of a domain operation, with a message fit for the person who caused it.
 * Routes turn it into a form message (fail) or the API's JSON error shape.
 */
export type AppErrorCode =
	| 'invalid_request'
	| 'unauthenticated'
	| 'forbidden'
	| 'not_found'
	| 'conflict'
	| 'too_large'
	| 'unsupported_media_type'
	| 'rate_limited';

export const STATUS_OF: Record<AppErrorCode, number> = {
	invalid_request: 400,
	unauthenticated: 401,
	forbidden: 403,
	not_found: 404,
	conflict: 409,
	too_large: 413,
	unsupported_media_type: 415,
	rate_limited: 429
};

export type Issue = { path: string; message: string };

export class AppError extends Error {
	constructor(
		readonly code: AppErrorCode,
		message: string,
		readonly options: { field?: string; issues?: Issue[]; retryAfterS?: number } = {}
	) {
		super(message);
		this.name = 'AppError';
	}
	get status() {
		return STATUS_OF[this.code];
	}
}
