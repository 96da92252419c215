// GET /api/v1/cases/:id: one case with its timeline.
import { getCaseDetail } from '$lib/server/cases';
import { authenticateApi } from '$lib/server/guard';
import { apiHandler, json } from '$lib/server/http';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = await authenticateApi(event, 'cases:read');
	return json(await getCaseDetail(caller, event.params.id));
});
