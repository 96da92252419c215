// Cases: opening one (at the bay, through the API or from intake), a technician taking one from
// the queue, and reading one with its vehicle, answers, timeline and diagnosis.
import { and, desc, eq, gt, sql, type SQL } from 'drizzle-orm';
import type { BatchItem } from 'drizzle-orm/batch';
import { alias } from 'drizzle-orm/sqlite-core';
import type { CaseDetail, CreateCase, VehicleInput } from '../../api/cases-schema';
import type { DiagnoseRequest } from '../../diagnosis/api-schema';
import {
	applyEvent,
	deriveCaseState,
	emptyCaseState,
	restoreCaseState,
	storeCaseState,
	type CaseState
} from '../../cases/answers';
import type { CaseContact, CaseSource, OdometerUnit } from '../../cases/model';
import { db } from '../db';
import { caseEvents, cases, rulebookEditions, users, vehicles } from '../db/schema';
import { generateId } from '../auth/crypto';
import { getCompiledEdition, publishedEditionsOf, type PublishedEdition } from '../editions';
import { AppError } from '../errors';
import { caseNotFound, pendingSuggestions, readEventViews } from './events';
import { scoreCase } from './scoring';
import {
	eventInsert,
	isUniqueViolation,
	readCase,
	readTimeline,
	TOP_CAUSES_ON_CASE,
	type Actor
} from './store';
import { findVehicle, vehicleColumns, vehicleStatements } from './vehicles';

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

	let vehicleId: SQL | string | null = null;
	const statements: BatchItem<'sqlite'>[] = [];
	if (spec.vehicleId) {
		if (!(await findVehicle(actor.shopId, spec.vehicleId))) {
			throw new AppError('invalid_request', 'There is no such vehicle in this shop.', {
				issues: [{ path: 'vehicleId', message: 'no such vehicle in this shop' }]
			});
		}
		vehicleId = spec.vehicleId;
	} else if (spec.vehicle) {
		const vehicle = vehicleStatements(actor.shopId, spec.vehicle);
		statements.push(vehicle.statement);
		vehicleId = vehicle.vehicleId;
	}
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

/** A technician takes a waiting case: it opens, assigned to them, with a `case_taken` event. */
export async function takeCase(
	actor: Actor & { userId: string },
	caseId: string,
	clientEventId = `taken-${generateId()}`,
	now = new Date()
): Promise<void> {
	const row = await readCase(actor, caseId);
	if (!row) throw caseNotFound();
	const [replay] = await db
		.select({ seq: caseEvents.seq })
		.from(caseEvents)
		.where(and(eq(caseEvents.caseId, caseId), eq(caseEvents.clientEventId, clientEventId)));
	if (replay) return;
	if (row.status !== 'waiting') {
		throw new AppError('conflict', `The case is ${row.status}, not waiting to be taken.`);
	}
	const [last] = await db
		.select({ ranking: caseEvents.ranking })
		.from(caseEvents)
		.where(and(eq(caseEvents.caseId, caseId), eq(caseEvents.seq, row.lastSeq)));
	const seq = row.lastSeq + 1;
	try {
		await db.batch([
			eventInsert({
				shopId: row.shopId,
				caseId,
				seq,
				clientEventId,
				kind: 'case_taken',
				payload: { assignee: actor.userId },
				ranking: last?.ranking ?? [],
				editionId: row.editionId,
				actorUserId: actor.userId,
				apiKeyId: null,
				createdAt: now
			}),
			db
				.update(cases)
				.set({
					status: 'open',
					assignedTo: actor.userId,
					lastSeq: seq,
					// Taking changes no answer: the kept state moves on to the new event, if it was current.
					state: storeState(restoreCaseState(row.state, row.lastSeq), seq),
					updatedAt: now
				})
				.where(and(eq(cases.id, caseId), eq(cases.lastSeq, row.lastSeq)))
		]);
	} catch (error) {
		if (isUniqueViolation(error)) {
			throw new AppError('conflict', 'Someone else changed the case at the same moment.');
		}
		throw error;
	}
}

const storeState = (state: CaseState | null, seq: number) =>
	state ? storeCaseState(state, seq) : null;

const person = (id: string | null, name: string | null) => (id ? { id, name: name ?? '' } : null);

async function readCaseRecord(shopId: string, caseId: string) {
	const assignee = alias(users, 'assignee');
	const [row] = await db
		.select({
			case: cases,
			vehicle: vehicleColumns,
			assigneeName: assignee.name,
			openerName: users.name
		})
		.from(cases)
		.leftJoin(vehicles, eq(vehicles.id, cases.vehicleId))
		.leftJoin(assignee, eq(assignee.id, cases.assignedTo))
		.leftJoin(users, eq(users.id, cases.createdBy))
		.where(and(eq(cases.id, caseId), eq(cases.shopId, shopId)));
	return row;
}

async function newerEditionNumber(shopId: string, number: number) {
	const [newest] = await db
		.select({ number: rulebookEditions.number })
		.from(rulebookEditions)
		.where(and(publishedEditionsOf(sql`${shopId}`), gt(rulebookEditions.number, number)))
		.orderBy(desc(rulebookEditions.number))
		.limit(1);
	return newest ? { number: newest.number } : null;
}

/** GET /api/v1/cases/{id}: everything the case page shows. */
export async function getCaseDetail(actor: Actor, caseId: string): Promise<CaseDetail> {
	const row = await readCase(actor, caseId);
	const record = row && (await readCaseRecord(actor.shopId, caseId));
	if (!row || !record) throw caseNotFound();
	const c = record.case;
	const edition = await getCompiledEdition(actor.shopId, {
		id: row.editionId,
		number: row.editionNumber,
		publishedAt: row.editionPublishedAt
	});
	const [timeline, events] = await Promise.all([readTimeline(caseId), readEventViews(caseId)]);
	const state = deriveCaseState(timeline);
	const { diagnosis } = await scoreCase(edition, state, { testSteps: true });
	return {
		case: {
			id: c.id,
			status: c.status,
			source: c.source,
			complaint: c.complaint,
			vehicle: record.vehicle?.id ? record.vehicle : null,
			assignee: person(c.assignedTo, record.assigneeName),
			openedBy: person(c.createdBy, record.openerName),
			topCauses: c.topCauses,
			lastSeq: c.lastSeq,
			odometer:
				c.odometerValue === null || !c.odometerUnit
					? null
					: { value: c.odometerValue, unit: c.odometerUnit },
			contact: c.contact,
			edition: {
				number: row.editionNumber,
				publishedAt: row.editionPublishedAt?.toISOString() ?? null
			},
			newerEdition: await newerEditionNumber(actor.shopId, row.editionNumber),
			createdAt: c.createdAt.toISOString(),
			updatedAt: c.updatedAt.toISOString()
		},
		answers: [...state.answers.values()],
		notSure: [...state.notSure],
		suggestions: pendingSuggestions(edition, c.complaint, state),
		ticks: Object.fromEntries(
			[...state.ticks].map(([test, steps]) => [test, [...steps].sort((a, b) => a - b)])
		),
		timeline: events,
		diagnosis
	};
}
