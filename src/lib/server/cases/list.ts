// The shop's cases as a list: filtered by status, assignee and search words, newest first,
// paginated by an opaque keyset cursor so every case appears exactly once.
import { and, desc, eq, inArray, isNull, lt, or, sql, type SQL } from 'drizzle-orm';
import { alias, type SQLiteColumn } from 'drizzle-orm/sqlite-core';
import type { CaseSummary, ListCasesQuery } from '../../api/cases-schema';
import { db } from '../db';
import { cases, users, vehicles } from '../db/schema';
import { AppError } from '../errors';
import type { Actor } from './store';
import { normalisePlate, vehicleColumns } from './vehicles';

/** Search words beyond this many are ignored (each adds a LIKE over the complaint). */
const MAX_SEARCH_WORDS = 8;

type Cursor = { createdAtS: number; id: string };

export function encodeCursor(cursor: Cursor): string {
	return Buffer.from(JSON.stringify([cursor.createdAtS, cursor.id])).toString('base64url');
}

export function decodeCursor(text: string): Cursor {
	try {
		const [createdAtS, id] = JSON.parse(Buffer.from(text, 'base64url').toString('utf8'));
		if (Number.isSafeInteger(createdAtS) && typeof id === 'string' && id.length <= 64) {
			return { createdAtS, id };
		}
	} catch {
		// reported below
	}
	throw new AppError('invalid_request', 'The cursor is not one this API gave out.', {
		issues: [{ path: 'cursor', message: 'not a cursor from a previous page' }]
	});
}

const escapeLike = (text: string) => text.replace(/[\\%_]/g, (c) => `\\${c}`);
const contains = (column: SQLiteColumn, text: string) =>
	sql`${column} LIKE ${`%${escapeLike(text)}%`} ESCAPE '\\'`;

function searchCondition(q: string): SQL | undefined {
	const words = q.split(/\s+/).filter(Boolean).slice(0, MAX_SEARCH_WORDS);
	const plate = normalisePlate(q);
	return or(
		contains(vehicles.vin, q.toUpperCase()),
		plate ? contains(vehicles.plate, plate) : undefined,
		and(...words.map((word) => contains(cases.complaint, word)))
	);
}

function assigneeCondition(actor: Actor, assignee: string | undefined): SQL | undefined {
	if (assignee === undefined) return undefined;
	if (assignee === 'none') return isNull(cases.assignedTo);
	if (assignee === 'me') return actor.userId ? eq(cases.assignedTo, actor.userId) : sql`0`;
	return eq(cases.assignedTo, assignee);
}

export async function listCases(
	actor: Actor,
	query: ListCasesQuery
): Promise<{ cases: CaseSummary[]; nextCursor: string | null }> {
	const cursor = query.cursor ? decodeCursor(query.cursor) : undefined;
	const after = cursor
		? or(
				lt(cases.createdAt, new Date(cursor.createdAtS * 1000)),
				and(eq(cases.createdAt, new Date(cursor.createdAtS * 1000)), lt(cases.id, cursor.id))
			)
		: undefined;
	const assignee = alias(users, 'assignee');
	const rows = await db
		.select({ case: cases, vehicle: vehicleColumns, assigneeName: assignee.name })
		.from(cases)
		.leftJoin(vehicles, eq(vehicles.id, cases.vehicleId))
		.leftJoin(assignee, eq(assignee.id, cases.assignedTo))
		.where(
			and(
				eq(cases.shopId, actor.shopId),
				query.status ? inArray(cases.status, query.status) : undefined,
				assigneeCondition(actor, query.assignee),
				query.q ? searchCondition(query.q) : undefined,
				after
			)
		)
		.orderBy(desc(cases.createdAt), desc(cases.id))
		.limit(query.limit + 1);
	const page = rows.slice(0, query.limit);
	const last = page.at(-1);
	return {
		cases: page.map(({ case: c, vehicle, assigneeName }) => ({
			id: c.id,
			status: c.status,
			source: c.source,
			complaint: c.complaint,
			vehicle: vehicle?.id ? vehicle : null,
			assignee: c.assignedTo ? { id: c.assignedTo, name: assigneeName ?? '' } : null,
			topCauses: c.topCauses,
			lastSeq: c.lastSeq,
			createdAt: c.createdAt.toISOString(),
			updatedAt: c.updatedAt.toISOString()
		})),
		nextCursor:
			rows.length > query.limit && last
				? encodeCursor({
						createdAtS: Math.floor(last.case.createdAt.getTime() / 1000),
						id: last.case.id
					})
				: null
	};
}
