import { describe, expect, it, vi } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import { apiError, apiHandler, json, readJsonBody, zodIssues } from '../../../src/lib/server/http';
import { AppError } from '../../../src/lib/server/errors';
import { z } from 'zod';
import { ERROR_CODES } from '../../../src/lib/api/error-codes';
import { getOpenApiDocument } from '../../../src/lib/server/openapi';

const event = (requestId = 'req-123') =>
	({
		locals: { requestId },
		request: new Request('http://localhost/api/v1/x', { method: 'POST' }),
		url: new URL('http://localhost/api/v1/x')
	}) as unknown as RequestEvent;

describe('json responses', () => {
	it('counts the bytes of the encoded body, not the characters', async () => {
		const data = { reading: '92 °C', note: 'customer’s “sweet smell”' };
		const res = json(data, { status: 201, headers: { 'x-extra': '1' } });
		expect(res.status).toBe(201);
		expect(res.headers.get('content-type')).toBe('application/json');
		expect(res.headers.get('x-extra')).toBe('1');
		const bytes = new Uint8Array(await res.arrayBuffer());
		expect(Number(res.headers.get('content-length'))).toBe(bytes.byteLength);
		expect(bytes.byteLength).toBeGreaterThan(JSON.stringify(data).length);
		expect(JSON.parse(new TextDecoder().decode(bytes))).toEqual(data);
	});
});

describe('API error handling', () => {
	it('answers an unexpected failure with 500, the request id and no stack trace', async () => {
		const log = vi.spyOn(console, 'error').mockImplementation(() => {});
		const handler = apiHandler(async () => {
			throw new Error('database file is locked at /srv/secret/path.db');
		});
		const res = await handler(event('req-500'));
		expect(res.status).toBe(500);
		const body = await res.json();
		expect(body).toEqual({
			error: {
				code: 'internal_error',
				message: 'Something went wrong on our side.',
				requestId: 'req-500'
			}
		});
		expect(JSON.stringify(body)).not.toContain('/srv/secret');
		expect(log).toHaveBeenCalledWith(expect.stringContaining('[req-500]'), expect.any(Error));
		log.mockRestore();
	});

	it('turns an AppError into the contract shape with Retry-After for rate limits', async () => {
		const handler = apiHandler(async () => {
			throw new AppError('rate_limited', 'Slow down.', { retryAfterS: 42 });
		});
		const res = await handler(event());
		expect(res.status).toBe(429);
		expect(res.headers.get('retry-after')).toBe('42');
		expect(await res.json()).toEqual({ error: { code: 'rate_limited', message: 'Slow down.' } });
	});

	it('maps each contract code to its status, as the contract table lists them', () => {
		// contract/api.md, "Errors": the table of statuses and codes.
		const contractTable = {
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
			// Our extension, for /api/health and /api/ready only (not in the contract's table).
			unavailable: 503
		};
		expect(ERROR_CODES).toEqual(Object.keys(contractTable));
		for (const [code, status] of Object.entries(contractTable)) {
			expect(apiError(code as keyof typeof contractTable, 'x').status).toBe(status);
		}
	});

	it('publishes in OpenAPI the same codes the handler sends', () => {
		type ErrorSchema = {
			$defs: { Error: { properties: { error: { properties: { code: { enum: string[] } } } } } };
		};
		const doc = getOpenApiDocument() as { components: { schemas: { Error: ErrorSchema } } };
		const codeSchema = doc.components.schemas.Error.$defs.Error.properties.error.properties;
		expect(codeSchema.code.enum).toEqual([...ERROR_CODES]);
		expect(codeSchema.code.enum).toContain('internal_error');
		expect(codeSchema.code.enum).not.toContain('internal');
	});

	it('sets Allow on a 405', async () => {
		const res = apiError('method_not_allowed', 'GET is not allowed here.', { allow: 'POST' });
		expect(res.status).toBe(405);
		expect(res.headers.get('allow')).toBe('POST');
		expect((await res.json()).error.code).toBe('method_not_allowed');
	});

	it('writes zod paths the way the contract shows them', () => {
		const schema = z.object({
			observations: z.record(z.string(), z.boolean()),
			unknown: z.array(z.string())
		});
		const parsed = schema.safeParse({ observations: { fan_runs_when_hot: 'yes' }, unknown: [3] });
		expect(parsed.success).toBe(false);
		const paths = zodIssues(parsed.error!).map((i) => i.path);
		expect(paths).toEqual(['observations.fan_runs_when_hot', 'unknown[0]']);
	});
});

describe('reading a JSON body', () => {
	const post = (body: string, headers: Record<string, string> = {}) =>
		new Request('http://localhost/', {
			method: 'POST',
			body,
			headers: { 'content-type': 'application/json', ...headers }
		});

	/** A streamed body (no Content-Length) of `chunks` chunks of `chunkBytes`, and whether the
	 * server side cancelled it (which resets the connection instead of answering). */
	function streamed(chunks: number, chunkBytes: number, failWith?: unknown) {
		const state = { cancelled: false };
		let sent = 0;
		const body = new ReadableStream<Uint8Array>({
			pull(controller) {
				if (failWith && sent === 1) return controller.error(failWith);
				if (sent++ < chunks) controller.enqueue(new Uint8Array(chunkBytes).fill(0x20));
				else controller.close();
			},
			cancel() {
				state.cancelled = true;
			}
		});
		const request = new Request('http://localhost/', {
			method: 'POST',
			body,
			headers: { 'content-type': 'application/json' },
			duplex: 'half'
		} as RequestInit);
		return { request, state };
	}

	it('counts the bytes received, not the declared length', async () => {
		const body = JSON.stringify({ complaint: 'x'.repeat(2000) });
		await expect(readJsonBody(post(body), 1024)).rejects.toMatchObject({ code: 'too_large' });
		await expect(readJsonBody(post(body), 4096)).resolves.toEqual({ complaint: 'x'.repeat(2000) });
	});

	it('refuses a body that is not JSON', async () => {
		await expect(readJsonBody(post('{"a":'), 1024)).rejects.toMatchObject({
			code: 'invalid_request',
			message: 'The request body is not valid JSON.'
		});
	});

	it('answers a streamed body over the limit with too_large, leaving the stream uncancelled', async () => {
		const { request, state } = streamed(100, 1024);
		await expect(readJsonBody(request, 16 * 1024)).rejects.toMatchObject({ code: 'too_large' });
		expect(state.cancelled).toBe(false);
	});

	it('reports the server body limit (a 413 from the stream) as too_large, not a 500', async () => {
		const limit = Object.assign(new Error('request body size exceeded BODY_SIZE_LIMIT'), {
			status: 413
		});
		const { request } = streamed(10, 10, limit);
		await expect(readJsonBody(request, 64 * 1024)).rejects.toMatchObject({ code: 'too_large' });
	});

	it('reports a body cut off by the client as invalid_request', async () => {
		const { request } = streamed(10, 10, new Error('aborted'));
		await expect(readJsonBody(request, 64 * 1024)).rejects.toMatchObject({
			code: 'invalid_request'
		});
	});

	it('refuses a body not sent as JSON with unsupported_media_type', async () => {
		for (const type of ['text/plain', 'application/xml', 'multipart/form-data; boundary=x']) {
			await expect(readJsonBody(post('{}', { 'content-type': type }), 1024)).rejects.toMatchObject({
				code: 'unsupported_media_type',
				status: 415
			});
		}
		await expect(
			readJsonBody(post('{"a":1}', { 'content-type': 'application/json; charset=utf-8' }), 1024)
		).resolves.toEqual({ a: 1 });
	});
});
