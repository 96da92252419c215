import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { inspect } from 'node:util';
import { describe, expect, it } from 'vitest';
import { createDatabase, prepareDatabase } from '../../src/lib/server/db/client';
import { redactQueryParameters } from '../../src/lib/server/db/redact-errors';
import { sessions } from '../../src/lib/server/db/schema';

describe('database errors in logs', () => {
	it('carry the SQL but none of its values, in the message, the stack or the logged object', async () => {
		redactQueryParameters();
		const db = createDatabase(`file:${join(mkdtempSync(join(tmpdir(), 'causeway-err-')), 'e.db')}`);
		await prepareDatabase(db, 'drizzle');
		const secret = 'f00dfacecafe0123456789abcdef-session-hash';
		// No such user: the foreign key fails, as a real write with a session hash would.
		const error = await db
			.insert(sessions)
			.values({ id: secret, userId: 'no-such-user', expiresAt: 1, issuedAt: 1 })
			.then(
				() => null,
				(e: unknown) => e as Error
			);
		expect(error).toBeInstanceOf(Error);
		const logged = [error!.message, error!.stack, String(error), inspect(error, { depth: 5 })];
		for (const text of logged) {
			expect(text).not.toContain(secret);
			expect(text).not.toContain('no-such-user');
		}
		expect(error!.message).toContain('insert into "sessions"');
		expect(error!.message).toContain('4 value(s), left out of logs');
		db.$client.close();
	});
});
