import type { RequestEvent } from '@sveltejs/kit';
import { AppError, type AppErrorCode, type Issue, STATUS_OF } from './errors';

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
	code: AppErrorCode,
	message: string,
	opts: { issues?: Issue[]; retryAfterS?: number; requestId?: string } = {}
) {
	const headers: Record<string, string> = {};
	if (opts.retryAfterS) headers['retry-after'] = String(opts.retryAfterS);
	const body: Record<string, unknown> = { code, message };
	if (opts.issues?.length) body.issues = opts.issues;
	if (opts.requestId) body.requestId = opts.requestId;
	return json({ error: body }, { status: STATUS_OF[code] ?? 400, headers });
}

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
			return json(
				{ error: { code: 'internal', message: 'Something went wrong on our side.', requestId } },
				{ status: 500 }
			);
		}
	};
}

/**
 * Reads a JSON body of at most `limitBytes`, counting the bytes actually received (a client may
 * omit or understate Content-Length).
 */
export async function readJsonBody(request: Request, limitBytes: number): Promise<unknown> {
	const declared = Number(request.headers.get('content-length') ?? '0');
	if (declared > limitBytes) throw tooLarge(limitBytes);
	const reader = request.body?.getReader();
	if (!reader) throw new AppError('invalid_request', 'The request body must be JSON.');
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		size += value.byteLength;
		if (size > limitBytes) {
			await reader.cancel();
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

/** zod issues → the contract's `issues` list with dotted paths. */
export function zodIssues(error: { issues: { path: PropertyKey[]; message: string }[] }): Issue[] {
	return error.issues.map((i) => ({
		path: i.path
			.map((p, n) => (typeof p === 'number' ? `[${p}]` : n === 0 ? String(p) : `.${String(p)}`))
			.join(''),
		message: i.message
	}));
}

export function clientIp(event: RequestEvent): string {
	try {
		return event.getClientAddress();
	} catch {
		return 'unknown';
	}
}
