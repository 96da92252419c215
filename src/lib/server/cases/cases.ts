// Opening a case: at the bay, through the diagnose API (saveAsCase) or from the intake form.
import type { SQL } from 'drizzle-orm';
import type { BatchItem } from 'drizzle-orm/batch';
import type { CreateCase, VehicleInput } from '../../api/cases-schema';
import type { DiagnoseRequest } from '../../api/schema';
import { applyEvent, emptyCaseState, storeCaseState } from '../../cases/answers';
import type { CaseContact, CaseSource, OdometerUnit } from '../../cases/model';
import { db } from '../db';
import { cases } from '../db/schema';
import { generateId } from '../auth/crypto';
import type { PublishedEdition } from '../editions';
import { AppError } from '../errors';
import { scoreCase } from './scoring';
import { eventInsert, TOP_CAUSES_ON_CASE, type Actor } from './store';
import { findVehicle, vehicleStatements } from './vehicles';

export type OpenCase = {
	status: 'waiting' | 'open';
	source: CaseSource;
	vehicle?: VehicleInput;
	vehicleId?: string;
	odometer?: { value: number; unit: OdometerUnit };
	complaint?: string;
	contact?: CaseContact;
	observations: Record<string, boolean | string | number | null>;
	unknown: string[];
};

function checkObservations(edition: PublishedEdition, spec: OpenCase) {
	const issues = edition.diagnoser.validateObservations(spec.observations, spec.unknown);
	if (issues.length) {
		throw new AppError('invalid_request', 'Some observations are not understood.', { issues });
	}
}

/** The case's vehicle: an existing one of the shop (checked), a new one to insert, or none. */
async function resolveVehicle(
	shopId: string,
	spec: OpenCase
): Promise<{ vehicleId: SQL | string | null; statements: BatchItem<'sqlite'>[] }> {
	if (spec.vehicleId) {
		if (!(await findVehicle(shopId, spec.vehicleId))) {
			throw new AppError('invalid_request', 'There is no such vehicle in this shop.', {
				issues: [{ path: 'vehicleId', message: 'no such vehicle in this shop' }]
			});
		}
		return { vehicleId: spec.vehicleId, statements: [] };
	}
	if (spec.vehicle) {
		const vehicle = vehicleStatements(shopId, spec.vehicle);
		return { vehicleId: vehicle.vehicleId, statements: [vehicle.statement] };
	}
	return { vehicleId: null, statements: [] };
}

/**
 * Opens a case scored with `edition`: its vehicle (reused by VIN), the case row and its first
 * event (the answers it arrived with and the first ranking), in one batch. Returns the case id.
 */
export async function openCase(
	actor: Actor,
	edition: PublishedEdition,
	spec: OpenCase,
	now = new Date()
): Promise<string> {
	checkObservations(edition, spec);
	const observations = Object.fromEntries(
		Object.entries(spec.observations).filter(([, value]) => value !== null)
	);
	const payload = { observations, unknown: spec.unknown, complaint: spec.complaint ?? null };
	const state = applyEvent(emptyCaseState(), { seq: 1, kind: 'case_opened', payload });
	const { ranking } = await scoreCase(edition, state, { testSteps: false });

	const { vehicleId, statements } = await resolveVehicle(actor.shopId, spec);
	const caseId = generateId();
	const createdAt = new Date(Math.floor(now.getTime() / 1000) * 1000);
	statements.push(
		db.insert(cases).values({
			id: caseId,
			shopId: actor.shopId,
			editionId: edition.id,
			status: spec.status,
			source: spec.source,
			createdBy: actor.userId,
			apiKeyId: actor.apiKeyId,
			vehicleId,
			odometerValue: spec.odometer?.value ?? null,
			odometerUnit: spec.odometer?.unit ?? null,
			complaint: spec.complaint ?? null,
			contact: spec.contact ?? null,
			assignedTo: spec.status === 'open' ? actor.userId : null,
			lastSeq: 1,
			topCauses: ranking.slice(0, TOP_CAUSES_ON_CASE),
			state: storeCaseState(state, 1),
			createdAt,
			updatedAt: createdAt
		}),
		eventInsert({
			shopId: actor.shopId,
			caseId,
			seq: 1,
			clientEventId: `opened-${caseId}`,
			kind: 'case_opened',
			payload,
			ranking,
			editionId: edition.id,
			actorUserId: actor.userId,
			apiKeyId: actor.apiKeyId,
			createdAt: now
		})
	);
	await db.batch(statements as [BatchItem<'sqlite'>, ...BatchItem<'sqlite'>[]]);
	return caseId;
}

/** POST /api/v1/cases: a case opened at the bay, or put in the queue, with the shop's edition. */
export function createCase(actor: Actor, edition: PublishedEdition, input: CreateCase, now?: Date) {
	return openCase(actor, edition, { ...input, source: actor.apiKeyId ? 'api' : 'bay' }, now);
}

/** `saveAsCase` of POST /api/v1/diagnose: a waiting case with the request's answers and words. */
export function saveDiagnoseAsCase(
	actor: Actor,
	edition: PublishedEdition,
	request: DiagnoseRequest
) {
	const { odometerKm, ...details } = request.vehicle ?? {};
	const hasVehicle = Boolean(details.vin || (details.make && details.model));
	return openCase(actor, edition, {
		status: 'waiting',
		source: actor.apiKeyId ? 'api' : 'bay',
		vehicle: hasVehicle ? details : undefined,
		odometer: odometerKm === undefined ? undefined : { value: odometerKm, unit: 'km' },
		complaint: request.complaint,
		observations: request.observations,
		unknown: request.unknown
	});
}
