// GET /api/v1/calculators: every calculator with the JSON input it takes.
import { listCalculators } from '$lib/server/calculators';
import { authenticateApi } from '$lib/server/guard';
import { apiHandler, json } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	await authenticateApi(event, 'calculators:use');
	return json({ calculators: listCalculators() });
});
