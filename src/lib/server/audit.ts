// The audit log: rows written with the change they record, and the shop's log page by page.
import { and, desc, eq, lt } from 'drizzle-orm';
import { db } from './db';
import { auditLog, users } from './db/schema';

export type AuditEntry = {
	shopId: string;
	actorUserId: string | null;
	action: string;
	target?: string;
	detail?: Record<string, unknown>;
	ip?: string;
};

/** Audit rows are built here and written in the same batch as the change they record. */
export function auditInsert(entry: AuditEntry) {
	return db.insert(auditLog).values({
		shopId: entry.shopId,
		actorUserId: entry.actorUserId,
		action: entry.action,
		target: entry.target ?? null,
		detail: entry.detail ?? null,
		ip: entry.ip ?? null
	});
}

export async function listAudit(shopId: string, opts: { limit: number; beforeId?: number }) {
	return db
		.select({
			id: auditLog.id,
			action: auditLog.action,
			target: auditLog.target,
			detail: auditLog.detail,
			ip: auditLog.ip,
			createdAt: auditLog.createdAt,
			actorName: users.name,
			actorEmail: users.email
		})
		.from(auditLog)
		.leftJoin(users, eq(users.id, auditLog.actorUserId))
		.where(
			and(eq(auditLog.shopId, shopId), opts.beforeId ? lt(auditLog.id, opts.beforeId) : undefined)
		)
		.orderBy(desc(auditLog.id))
		.limit(opts.limit);
}
