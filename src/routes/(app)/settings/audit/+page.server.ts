// The audit log page: the shop's log, newest first, page by page.
import { z } from 'zod';
import { listAudit } from '$lib/server/audit';
import { requirePermission } from '$lib/server/guard';
import type { PageServerLoad } from './$types';

const PAGE_SIZE = 50;
const querySchema = z.object({ before: z.coerce.number().int().positive().optional() });

export const load: PageServerLoad = async (event) => {
	const user = requirePermission(event, 'audit:view');
	const query = querySchema.safeParse(Object.fromEntries(event.url.searchParams));
	const before = query.success ? query.data.before : undefined;
	const rows = await listAudit(user.shopId, { limit: PAGE_SIZE + 1, beforeId: before });
	return {
		entries: rows.slice(0, PAGE_SIZE),
		nextBefore: rows.length > PAGE_SIZE ? rows[PAGE_SIZE - 1].id : null
	};
};
