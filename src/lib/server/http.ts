/** The contract's JSON answers and errors, and reading a JSON body within its limit. */
import type { RequestEvent } from '@sveltejs/kit';
import type { ApiErrorCode } from '../api/error-codes';
import { formatIssuePath } from '../calculators/format';
import { AppError, type Issue, STATUS_OF } from './errors';

/**
 * A JSON response, like SvelteKit's `json()` but encoding the body once: `json()` encodes the
 * text a second time only to count its bytes, which costs as much as the encoding itself on a
 * diagnosis (about 20 KB).
 */
export function json(data: unknown, init: ResponseInit = {}): Response {
	return jsonBytes(Buffer.from(JSON.stringify(data), 'utf8'), init);
}

/** A response of JSON text that is plain ASCII (an edition's response serializer writes it so):
 * its bytes are its characters, so it needs no UTF-8 encoder. */
export function asciiJson(text: string, init: ResponseInit = {}): Response {
	return jsonBytes(Buffer.from(text, 'latin1'), init);
}

function jsonBytes(body: Buffer<ArrayBuffer>, init: ResponseInit): Response {
	const headers = new Headers(init.headers);
	headers.set('content-length', String(body.byteLength));
	if (!headers.has('content-type')) headers.set('content-type', 'application/json');
	return new Response(body, { ...init, headers });
}

/** The contract's error shape: { error: { code, message, issues? } } (contract/api.md). */
export function apiError(
	code: ApiErrorCode,
	message: string,
	opts: { issues?: Issue[]; retryAfterS?: number; requestId?: string; allow?: string } = {}
) {
	const headers: Record<string, string> = {};
	if (opts.retryAfterS) headers['retry-after'] = String(opts.retryAfterS);
	if (opts.allow) headers.allow = opts.allow;
	const body: Record<string, unknown> = { code, message };
	if (opts.issues?.length) body.issues = opts.issues;
	if (opts.requestId) body.requestId = opts.requestId;
	return json({ error: body }, { status: STATUS_OF[code], headers });
}

export const INTERNAL_ERROR_MESSAGE = 'Something went wrong on our side.';

/**
 * Wraps a JSON endpoint: expected failures (AppError) become the contract's error shape; anything
 * else is logged with the request id and answered 500 without details.
 */
export function apiHandler<E extends RequestEvent>(fn: (event: E) => Promise<Response>) {
	return async (event: E): Promise<Response> => {
		try {
			return await fn(event);
		} catch (err) {
			if (err instanceof AppError) {
				return apiError(err.code, err.message, {
					issues: err.options.issues,
					retryAfterS: err.options.retryAfterS
				});
			}
			const requestId = event.locals.requestId;
			console.error(`[${requestId}] ${event.request.method} ${event.url.pathname}`, err);
			return apiError('internal_error', INTERNAL_ERROR_MESSAGE, { requestId });
		}
	};
}

/** The media type of a request body, without parameters: `application/json`. */
export const mediaType = (request: Request) =>
	(request.headers.get('content-type') ?? '').split(';')[0].trim().toLowerCase();

const isJsonType = (type: string) => type === 'application/json' || type.endsWith('+json');

/**
 * Reads a JSON body of at most `limitBytes`, counting the bytes actually received (a client may
 * omit or understate Content-Length). A body over the limit is answered 413 without reading the
 * rest, and the connection is left open for that answer: cancelling the stream would reset it.
 */
export async function readJsonBody(request: Request, limitBytes: number): Promise<unknown> {
	if (!isJsonType(mediaType(request))) {
		throw new AppError(
			'unsupported_media_type',
			'Send the request body as JSON, with the header content-type: application/json.'
		);
	}
	const declared = Number(request.headers.get('content-length') ?? '0');
	if (declared > limitBytes) throw tooLarge(limitBytes);
	const reader = request.body?.getReader();
	if (!reader) throw new AppError('invalid_request', 'The request body must be JSON.');
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read().catch((error: unknown) => {
			throw unreadable(error, limitBytes);
		});
		if (done) break;
		size += value.byteLength;
		if (size > limitBytes) {
			reader.releaseLock();
			throw tooLarge(limitBytes);
		}
		chunks.push(value);
	}
	const text = Buffer.concat(chunks).toString('utf8');
	try {
		return JSON.parse(text);
	} catch {
		throw new AppError('invalid_request', 'The request body is not valid JSON.');
	}
}

const tooLarge = (limitBytes: number) =>
	new AppError(
		'too_large',
		`The request body is larger than ${Math.round(limitBytes / 1024)} KiB.`
	);

/** The server's own body limit (a 413 from the stream) or a body cut off by the client. */
function unreadable(error: unknown, limitBytes: number): AppError {
	const status = (error as { status?: unknown } | null)?.status;
	if (status === 413) return tooLarge(limitBytes);
	return new AppError('invalid_request', 'The request body could not be read to its end.');
}

/** zod issues → the contract's `issues` list with dotted paths (`observations.temp_gauge`). */
export function zodIssues(error: { issues: { path: PropertyKey[]; message: string }[] }): Issue[] {
	return error.issues.map((i) => ({ path: formatIssuePath(i.path), message: i.message }));
}

export function clientIp(event: RequestEvent): string {
	try {
		return event.getClientAddress();
	} catch {
		return 'unknown';
	}
}
