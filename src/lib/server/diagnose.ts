// Diagnose for a shop: parse the request and rank causes on the caller's published edition.
import { shapeDiagnosis } from '../api/diagnosis-response';
import { diagnoseRequestSchema, type DiagnoseRequest } from '../api/schema';
import { saveDiagnoseAsCase } from './cases/cases';
import { getPublishedEdition } from './editions';
import { AppError } from './errors';
import { zodIssues } from './http';
import { requireCallerPermission, type ApiCaller } from './guard';

export const NEXT_QUESTIONS_IN_RESPONSE = 10;

/** Parses a diagnose request; every problem is reported with its path, nothing is written. */
export function parseDiagnoseRequest(body: unknown): DiagnoseRequest {
	const parsed = diagnoseRequestSchema.safeParse(body);
	if (!parsed.success) {
		throw new AppError('invalid_request', 'The request does not match the diagnose schema.', {
			issues: zodIssues(parsed.error)
		});
	}
	return parsed.data;
}

/**
 * Ranks causes with the shop's published edition. Stateless unless `saveAsCase`, in which case
 * the case is stored with the edition it was scored with, so it can be replayed exactly.
 * Returns the response and the edition's serializer, which writes it as JSON.
 */
export async function diagnoseForShop(caller: ApiCaller, request: DiagnoseRequest) {
	// Opening a case is working cases: refused before anything runs. The contract lets an intake
	// key open one (its web form's enquiries become cases).
	if (request.saveAsCase) {
		requireCallerPermission(caller, 'cases:work', {
			keysMay: true,
			message: 'Your role may not open cases; send the request without saveAsCase.'
		});
	}
	const edition = await getPublishedEdition(caller.shopId, caller.publishedEdition);
	const issues = edition.diagnoser.validateObservations(request.observations, request.unknown);
	if (issues.length) {
		throw new AppError('invalid_request', 'Some observations are not understood.', { issues });
	}
	const analysis = await edition.diagnoser.analyse(
		{
			observations: request.observations,
			unknown: request.unknown,
			complaint: request.complaint
		},
		// The contract promises at least the best five questions; ten keep the answer small for
		// intake forms.
		{ questionLimit: NEXT_QUESTIONS_IN_RESPONSE }
	);
	// Test steps are for the bay, not for an intake form.
	const diagnosis = shapeDiagnosis(analysis, { testSteps: false });
	let caseId: string | null = null;
	if (request.saveAsCase) {
		caseId = await saveDiagnoseAsCase(caller, edition, request);
	}
	const response = {
		rulebook: { edition: edition.number, publishedAt: edition.publishedAt?.toISOString() ?? null },
		...diagnosis,
		caseId
	};
	return { response, serializer: edition.serializer };
}
