// GET /api/health: liveness, the database answers.
import { pingDatabase } from '$lib/server/health';
import { apiHandler, json } from '$lib/server/http';
import type { RequestHandler } from './$types';

/** Liveness with the database reachable; no auth, nothing about the deployment revealed. */
export const GET: RequestHandler = apiHandler(async () => {
	if (!(await pingDatabase())) {
		return json(
			{ ok: false, error: { code: 'unavailable', message: 'Database unreachable.' } },
			{ status: 503 }
		);
	}
	return json({ ok: true });
});
