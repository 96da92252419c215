import { describe, expect, it } from 'vitest';
import { unwritableDatabaseLine } from '../../../src/lib/server/db/startup';

const readonly = Object.assign(new Error('SQLITE_READONLY: attempt to write a readonly database'), {
	code: 'SQLITE_READONLY'
});

describe('unwritableDatabaseLine', () => {
	it('names the folder, the setting and the reason in one line', () => {
		const line = unwritableDatabaseLine(
			new Error('Failed query', { cause: readonly }),
			'file:/srv/causeway/data/causeway.db'
		);
		expect(line).not.toBeNull();
		expect(line).not.toContain('\n');
		expect(line).toContain('/srv/causeway/data/causeway.db');
		expect(line).toContain('DATABASE_URL=file:/srv/causeway/data/causeway.db');
		expect(line).toContain('SQLITE_READONLY');
	});

	it('never prints a token from a libSQL URL', () => {
		const line = unwritableDatabaseLine(readonly, 'libsql://db.example?authToken=secret123');
		expect(line).not.toContain('secret123');
	});

	it('leaves other failures to their stack', () => {
		expect(unwritableDatabaseLine(new TypeError('x is undefined'), 'file:a.db')).toBeNull();
	});
});
