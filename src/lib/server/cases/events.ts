// The case timeline: appending one event, idempotent by its client id, ordered by the server and
// re-ranked with the case's edition.
import { and, desc, eq, sql } from 'drizzle-orm';
import type { AppendEvent, CaseEventView } from '../../api/cases-schema';
import {
	applyEvent,
	deriveCaseState,
	restoreCaseState,
	settledKeys,
	storeCaseState,
	type CaseState
} from '../../cases/answers';
import { toAsciiJson, type ResponseSerializer } from '../../api/response-json';
import { db } from '../db';
import { cases, rulebookEditions } from '../db/schema';
import { getCaseEdition, publishedEditionsOf, type PublishedEdition } from '../editions';
import { AppError } from '../errors';
import { scoreCase, type CaseDiagnosis } from './scoring';
import {
	caseNotFound,
	eventInsert,
	isUniqueViolation,
	MAX_EVENTS_PER_CASE,
	readCase,
	readTimeline,
	TOP_CAUSES_ON_CASE,
	type Actor,
	type CaseRow,
	type NewEvent
} from './store';
import { checkEvent } from './validate-event';
import { readEventView } from './event-views';

/** Two devices appending to one case at the same moment: the loser re-reads and tries again. */
const MAX_APPEND_ATTEMPTS = 8;

/** For `rescored`: the shop's newest published edition, which must be the one asked for. */
async function rescoreTarget(row: CaseRow, toEdition: number): Promise<PublishedEdition> {
	const [newest] = await db
		.select({
			id: rulebookEditions.id,
			number: rulebookEditions.number,
			publishedAt: rulebookEditions.publishedAt
		})
		.from(rulebookEditions)
		.where(publishedEditionsOf(sql`${row.shopId}`))
		.orderBy(desc(rulebookEditions.number))
		.limit(1);
	if (!newest || newest.number !== toEdition) {
		throw new AppError(
			'conflict',
			`Edition ${toEdition} is not the shop's newest published edition (${newest?.number ?? 'none'}).`
		);
	}
	if (newest.id === row.editionId) {
		throw new AppError('conflict', `The case is already scored with edition ${toEdition}.`);
	}
	return getCaseEdition(row.shopId, newest);
}

type AppendResult = {
	event: CaseEventView;
	replayed: boolean;
	diagnosis: CaseDiagnosis;
	serializer: ResponseSerializer;
};

const editionOf = (row: CaseRow) =>
	getCaseEdition(row.shopId, {
		id: row.editionId,
		number: row.editionNumber,
		publishedAt: row.editionPublishedAt
	});

/** The case's answers: kept on the row, or derived from the timeline when the row's copy is stale. */
async function currentState(row: CaseRow) {
	return restoreCaseState(row.state, row.lastSeq) ?? deriveCaseState(await readTimeline(row.id));
}

/** A replayed append: the stored event and the case's current diagnosis; nothing is written. */
async function findReplay(row: CaseRow, clientEventId: string): Promise<AppendResult | null> {
	const event = await readEventView(row.id, clientEventId);
	if (!event) return null;
	const edition = await editionOf(row);
	const { diagnosis } = await scoreCase(edition, await currentState(row), { testSteps: false });
	return { event, replayed: true, diagnosis, serializer: edition.serializer };
}

/**
 * Appends one event to an open case of the caller's shop and answers it with the new diagnosis.
 * A client event id seen before is answered with the stored event and nothing is written: the
 * unique index on (case, client event id) finds it, so the common case costs no extra read.
 */
export async function appendEvent(
	actor: Actor,
	caseId: string,
	input: AppendEvent,
	now: () => Date = () => new Date()
): Promise<AppendResult> {
	for (let attempt = 0; attempt < MAX_APPEND_ATTEMPTS; attempt++) {
		const row = await readCase(actor, caseId);
		if (!row) throw caseNotFound();
		let written: AppendResult | null;
		try {
			written = await tryAppend(actor, row, input, now());
		} catch (error) {
			// A refused event may be the replay of one that was stored before the case changed.
			if (error instanceof AppError) throw (await findReplay(row, input.id)) ?? error;
			throw error;
		}
		if (written) return written;
		const replay = await findReplay(row, input.id);
		if (replay) return replay;
	}
	throw new AppError('conflict', 'The case is changing too fast just now; send the event again.');
}

/** An event only joins an open case, and a case holds a bounded number of them. */
function assertTakesEvents(row: CaseRow) {
	if (row.status !== 'open') {
		throw new AppError('conflict', `The case is ${row.status}; only an open case takes events.`);
	}
	if (row.lastSeq >= MAX_EVENTS_PER_CASE) {
		throw new AppError('conflict', `The case holds its limit of ${MAX_EVENTS_PER_CASE} events.`);
	}
}

/** The payload to store: checked against the edition's rulebook (a `rescored` names both). */
function checkedPayload(
	row: CaseRow,
	input: AppendEvent,
	edition: PublishedEdition
): Record<string, unknown> {
	const checked = checkEvent(input, {
		rulebook: edition.rulebook,
		complaintMatches: () =>
			row.complaint ? edition.diagnoser.matchComplaint(row.complaint, new Set()) : []
	});
	if (checked.issues.length) {
		throw new AppError('invalid_request', 'The event does not fit this case’s rulebook.', {
			issues: checked.issues
		});
	}
	return input.kind === 'rescored'
		? { fromEdition: row.editionNumber, toEdition: edition.number }
		: checked.payload;
}

/**
 * Writes the event and moves the case on in one batch. False when another device took this
 * sequence number, or this id was sent before: the caller looks.
 */
async function commitEvent(row: CaseRow, event: NewEvent, state: CaseState): Promise<boolean> {
	try {
		await db.batch([
			eventInsert(event),
			db
				.update(cases)
				.set({
					lastSeq: event.seq,
					topCauses: event.ranking.slice(0, TOP_CAUSES_ON_CASE),
					state: storeCaseState(state, event.seq),
					editionId: event.editionId,
					updatedAt: event.createdAt
				})
				.where(and(eq(cases.id, row.id), eq(cases.lastSeq, row.lastSeq)))
		]);
		return true;
	} catch (error) {
		if (isUniqueViolation(error)) return false;
		throw error;
	}
}

async function tryAppend(
	actor: Actor,
	row: CaseRow,
	input: AppendEvent,
	at: Date
): Promise<AppendResult | null> {
	assertTakesEvents(row);
	const edition =
		input.kind === 'rescored'
			? await rescoreTarget(row, input.payload.toEdition)
			: await editionOf(row);
	const payload = checkedPayload(row, input, edition);
	const seq = row.lastSeq + 1;
	const state = applyEvent(await currentState(row), { seq, kind: input.kind, payload });
	const { diagnosis, ranking } = await scoreCase(edition, state, { testSteps: false });
	const committed = await commitEvent(
		row,
		{
			shopId: row.shopId,
			caseId: row.id,
			seq,
			clientEventId: input.id,
			kind: input.kind,
			payload,
			ranking,
			editionId: edition.id,
			actorUserId: actor.userId,
			apiKeyId: actor.apiKeyId,
			createdAt: at
		},
		state
	);
	if (!committed) return null;
	const event: CaseEventView = {
		id: input.id,
		seq,
		kind: input.kind,
		payload,
		ranking,
		edition: edition.number,
		by: actor.userId ? { id: actor.userId, name: row.actorName ?? '' } : null,
		at: at.toISOString()
	};
	return { event, replayed: false, diagnosis, serializer: edition.serializer };
}

/** The append's answer as JSON: the diagnosis written by the edition's serializer. */
export function appendResultJson({ event, replayed, diagnosis, serializer }: AppendResult): string {
	return `{"event":${toAsciiJson(event)},"replayed":${replayed},"diagnosis":${serializer.stringify(diagnosis)}}`;
}

/** Suggestions from the complaint that the technician has not yet accepted or rejected. */
export function pendingSuggestions(
	edition: PublishedEdition,
	complaint: string | null,
	state: ReturnType<typeof deriveCaseState>
) {
	return complaint ? edition.diagnoser.matchComplaint(complaint, settledKeys(state)) : [];
}
