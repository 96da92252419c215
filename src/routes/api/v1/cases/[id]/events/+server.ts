import { appendEventSchema, eventsQuerySchema } from '$lib/api/cases-schema';
import {
	appendEvent,
	appendResultJson,
	caseNotFound,
	parseCaseRequest,
	queryOf,
	readEventViews
} from '$lib/server/cases';
import { readCase } from '$lib/server/cases/store';
import { authenticateApi } from '$lib/server/guard';
import { apiHandler, asciiJson, json, readJsonBody } from '$lib/server/http';
import type { RequestHandler } from './$types';

const BODY_LIMIT_BYTES = 16 * 1024;

/** The events after `?after=`: what a second device polls to follow the case. */
export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = await authenticateApi(event, 'cases:read');
	const { after } = parseCaseRequest(eventsQuerySchema, queryOf(event.url));
	const row = await readCase(caller, event.params.id);
	if (!row) throw caseNotFound();
	const events = await readEventViews(row.id, after);
	return json({ events, lastSeq: row.lastSeq, status: row.status });
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = await authenticateApi(event, 'cases:work');
	const input = parseCaseRequest(
		appendEventSchema,
		await readJsonBody(event.request, BODY_LIMIT_BYTES)
	);
	const result = await appendEvent(caller, event.params.id, input);
	return asciiJson(appendResultJson(result), { status: result.replayed ? 200 : 201 });
});
