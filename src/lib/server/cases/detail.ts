// One case as the case page reads it: vehicle, people, answers, suggestions, timeline, diagnosis.
import { and, desc, eq, gt, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { CaseDetail } from '../../api/cases-schema';
import { deriveCaseState } from '../../cases/answers';
import { db } from '../db';
import { cases, rulebookEditions, users, vehicles } from '../db/schema';
import { getCaseEdition, publishedEditionsOf } from '../editions';
import { pendingSuggestions } from './events';
import { readEventViews } from './event-views';
import { scoreCase } from './scoring';
import { caseNotFound, readCase, readTimeline, type Actor } from './store';
import { vehicleColumns } from './vehicles';

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
	const edition = await getCaseEdition(actor.shopId, {
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
