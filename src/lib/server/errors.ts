/**
 * An expected failure of a domain operation, with a message fit for the person who caused it.
 * Routes turn it into a form message (fail) or the API's JSON error shape.
 */
import { ERROR_STATUS, type ApiErrorCode } from '../api/error-codes';

/** Every contract code but `internal_error`, which only the unexpected produces. */
export type AppErrorCode = Exclude<ApiErrorCode, 'internal_error'>;

export const STATUS_OF: Record<ApiErrorCode, number> = ERROR_STATUS;

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
