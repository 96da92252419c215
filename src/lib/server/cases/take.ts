// A technician takes a waiting case from the bay's queue: it opens, assigned to them.
import { and, eq } from 'drizzle-orm';
import { restoreCaseState, storeCaseState, type CaseState } from '../../cases/answers';
import { db } from '../db';
import { caseEvents, cases } from '../db/schema';
import { generateId } from '../auth/crypto';
import { AppError } from '../errors';
import { caseNotFound, eventInsert, isUniqueViolation, readCase, type Actor } from './store';

const storeState = (state: CaseState | null, seq: number) =>
	state ? storeCaseState(state, seq) : null;

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
