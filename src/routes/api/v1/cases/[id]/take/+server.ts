// POST /api/v1/cases/:id/take: a technician takes a waiting case.
import { takeCaseSchema } from '$lib/api/cases-schema';
import { getCaseDetail, parseCaseRequest, takeCase } from '$lib/server/cases';
import { authenticateApi } from '$lib/server/guard';
import { AppError } from '$lib/server/errors';
import { apiHandler, json, readJsonBody } from '$lib/server/http';
import type { RequestHandler } from './$types';

const BODY_LIMIT_BYTES = 1024;

/** A technician takes a waiting case: it opens, assigned to them. The body ({ id }) is optional. */
export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = await authenticateApi(event, 'cases:work');
	if (!caller.userId) throw new AppError('forbidden', 'Only a person can take a case.');
	const body = event.request.body ? await readJsonBody(event.request, BODY_LIMIT_BYTES) : {};
	const { id } = parseCaseRequest(takeCaseSchema, body);
	await takeCase({ ...caller, userId: caller.userId }, event.params.id, id);
	return json(await getCaseDetail(caller, event.params.id));
});
