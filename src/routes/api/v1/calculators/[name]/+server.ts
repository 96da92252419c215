// GET and POST /api/v1/calculators/:name: describe one calculator and run it.
import { findCalculator, listCalculators, runCalculatorForShop } from '$lib/server/calculators';
import { authenticateApi } from '$lib/server/guard';
import { apiHandler, json, readJsonBody } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** A calculator's input is a handful of numbers; anything near this size is not a real request. */
const BODY_LIMIT_BYTES = 16 * 1024;

export const GET: RequestHandler = apiHandler(async (event) => {
	await authenticateApi(event, 'calculators:use');
	const { name } = findCalculator(event.params.name);
	return json(listCalculators().find((summary) => summary.name === name));
});

export const POST: RequestHandler = apiHandler(async (event) => {
	const caller = await authenticateApi(event, 'calculators:use');
	const { name } = findCalculator(event.params.name);
	const input = await readJsonBody(event.request, BODY_LIMIT_BYTES);
	return json(await runCalculatorForShop(caller.shopId, name, input));
});
