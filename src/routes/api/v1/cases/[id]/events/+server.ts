// GET and POST /api/v1/cases/:id/events: follow a case's timeline and append to it.
import { appendEventSchema, eventsQuerySchema } from '$lib/api/cases-schema';
import {
	appendEvent,
	appendResultJson,
	parseCaseRequest,
	queryOf,
	listEventsAfter
} from '$lib/server/cases';
import { authenticateApi } from '$lib/server/guard';
import { apiHandler, asciiJson, json, readJsonBody } from '$lib/server/http';
import type { RequestHandler } from './$types';

const BODY_LIMIT_BYTES = 16 * 1024;

/** The events after `?after=`: what a second device polls to follow the case. */
export const GET: RequestHandler = apiHandler(async (event) => {
	const caller = await authenticateApi(event, 'cases:read');
	const { after } = parseCaseRequest(eventsQuerySchema, queryOf(event.url));
	return json(await listEventsAfter(caller, event.params.id, after));
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
