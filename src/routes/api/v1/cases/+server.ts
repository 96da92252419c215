// GET and POST /api/v1/cases: list the shop's cases and open a new one.
import { createCaseSchema, listCasesQuerySchema } from '$lib/api/cases-schema';
import { createCase, getCaseDetail, listCases, parseCaseRequest, queryOf } from '$lib/server/cases';
import { getPublishedEdition } from '$lib/server/editions';
import { authenticateApi } from '$lib/server/guard';
import { apiHandler, json, readJsonBody } from '$lib/server/http';
import type { RequestHandler } from './$types';

const BODY_LIMIT_BYTES = 64 * 1024;

export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = await authenticateApi(event, 'cases:read');
	const query = parseCaseRequest(listCasesQuerySchema, queryOf(event.url));
	return json(await listCases(caller, query));
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = await authenticateApi(event, 'cases:work');
	const input = parseCaseRequest(
		createCaseSchema,
		await readJsonBody(event.request, BODY_LIMIT_BYTES)
	);
	const edition = await getPublishedEdition(caller.shopId, caller.publishedEdition);
	const caseId = await createCase(caller, edition, input);
	return json(await getCaseDetail(caller, caseId), {
		status: 201,
		headers: { location: `/api/v1/cases/${caseId}` }
	});
});
