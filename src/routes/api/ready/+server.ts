// GET /api/ready: readiness, the database takes a write.
import { databaseWritable } from '$lib/server/health';
import { apiHandler, json } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** Readiness: the database takes a write (a full disk or a read-only file answer 503). No auth,
 * nothing about the deployment revealed. Poll it less often than /api/health: each call writes. */
export const GET: RequestHandler = apiHandler(async () => {
	if (!(await databaseWritable())) {
		return json(
			{ ok: false, error: { code: 'unavailable', message: 'The database cannot be written.' } },
			{ status: 503, headers: { 'cache-control': 'no-store' } }
		);
	}
	return json({ ok: true }, { headers: { 'cache-control': 'no-store' } });
});
