import { json } from '$lib/server/http';
import { getOpenApiDocument } from '$lib/server/openapi';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = () =>
	json(getOpenApiDocument(), { headers: { 'cache-control': 'public, max-age=300' } });
