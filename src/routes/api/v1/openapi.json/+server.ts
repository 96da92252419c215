// GET /api/v1/openapi.json: the OpenAPI document of the v1 API.
import { json } from '$lib/server/http';
import { getOpenApiDocument } from '$lib/server/openapi';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = () =>
	json(getOpenApiDocument(), { headers: { 'cache-control': 'public, max-age=300' } });
