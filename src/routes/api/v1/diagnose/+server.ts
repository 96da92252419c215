// POST /api/v1/diagnose: rank causes, next questions and tests for a set of answers.
import { parseDiagnoseRequest, diagnoseForShop } from '$lib/server/diagnose';
import { authenticateApi } from '$lib/server/guard';
import { apiHandler, asciiJson, readJsonBody } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** contract/api.md: request bodies over 64 KiB are refused with 413. */
const BODY_LIMIT_BYTES = 64 * 1024;

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = await authenticateApi(event, 'diagnose:use');
	const request = parseDiagnoseRequest(await readJsonBody(event.request, BODY_LIMIT_BYTES));
	const { response, serializer } = await diagnoseForShop(caller, request);
	return asciiJson(serializer.stringify(response));
});
