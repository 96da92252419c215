// The case module's entry for routes: parsing requests with the case API's schemas, and the
// operations themselves.
import type { z } from 'zod';
import { AppError } from '../errors';
import { zodIssues } from '../http';

export { createCase, openCase, saveDiagnoseAsCase } from './cases';
export { getCaseDetail } from './detail';
export { takeCase } from './take';
export { appendEvent, appendResultJson } from './events';
export { listEventsAfter } from './event-views';
export { caseNotFound } from './store';
export { listCases } from './list';
export type { Actor } from './store';
export type { OpenCase } from './cases';

/** Parses a request part with a schema of the case API; every problem comes back with its path. */
export function parseCaseRequest<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
	const parsed = schema.safeParse(value);
	if (!parsed.success) {
		throw new AppError('invalid_request', 'The request does not match the schema.', {
			issues: zodIssues(parsed.error)
		});
	}
	return parsed.data;
}

/** A URL's query parameters as a plain object (the last of a repeated one). */
export const queryOf = (url: URL) => Object.fromEntries(url.searchParams);
