import { describe, expect, it, vi } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import { apiError, apiHandler, json, readJsonBody, zodIssues } from '../../../src/lib/server/http';
import { AppError } from '../../../src/lib/server/errors';
import { z } from 'zod';

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
				code: 'internal',
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

	it('maps each contract code to its status', async () => {
		const statuses = await Promise.all(
			(['invalid_request', 'unauthenticated', 'forbidden', 'not_found', 'too_large'] as const).map(
				(code) => apiError(code, 'x').status
			)
		);
		expect(statuses).toEqual([400, 401, 403, 404, 413]);
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
		new Request('http://localhost/', { method: 'POST', body, headers });

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
});
