/** Whether the database takes a write, and one clear line at start-up when it does not. */
import { eq } from 'drizzle-orm';
import type { Database } from './client';
import { rateLimits } from './schema';

/** The row the readiness probe writes and removes again in the same commit. */
export const READY_PROBE_KEY = 'ready:probe';

/**
 * A tiny real write, committed: a full disk, a read-only file or folder, or a lost lock all
 * fail it, where a read still succeeds. The row is inserted and deleted in one transaction, so
 * the pages are written and nothing is left behind.
 */
export async function probeDatabaseWrite(database: Database): Promise<void> {
	await database.batch([
		database
			.insert(rateLimits)
			.values({ key: READY_PROBE_KEY, count: 1, windowStart: Math.floor(Date.now() / 1000) })
			.onConflictDoNothing(),
		database.delete(rateLimits).where(eq(rateLimits.key, READY_PROBE_KEY))
	]);
}

/** The URL without its query (a libSQL URL may carry a token there). */
const shownUrl = (url: string) => url.split('?')[0];

/** The file behind a `file:` URL, or null for a libSQL server. */
export function databaseFile(url: string): string | null {
	if (!url.startsWith('file:')) return null;
	return url.slice('file:'.length).split('?')[0] || null;
}

const CANNOT_WRITE =
	/SQLITE_(READONLY|CANTOPEN|FULL|IOERR|PERM|AUTH)|EACCES|EROFS|EPERM|ENOSPC|readonly|unable to open/i;

function describe(error: unknown): string {
	const parts: string[] = [];
	for (let e: unknown = error, depth = 0; e && depth < 4; e = (e as Error).cause, depth++) {
		const { code, message } = e as { code?: unknown; message?: unknown };
		parts.push(`${String(code ?? '')} ${String(message ?? '')}`);
	}
	return parts.join(' ');
}

/**
 * The line to print when `error` means the database folder or file cannot be written, or null
 * for any other failure (which keeps its stack: it is a bug, not a setting).
 */
export function unwritableDatabaseLine(error: unknown, url: string): string | null {
	const text = describe(error);
	const reason = CANNOT_WRITE.exec(text)?.[0];
	if (!reason) return null;
	const file = databaseFile(url);
	const where = file ? `the folder of ${file}` : 'the database server';
	return (
		`Causeway cannot start: ${where} cannot be written (${reason}; DATABASE_URL=${shownUrl(url)}). ` +
		'Point DATABASE_URL at a writable folder, or give this user write access and free disk space.'
	);
}

/** Runs a start-up step; a database that cannot be written ends the process with one line. */
export function exitIfUnwritable<T>(step: () => T, url: string): T {
	const fail = (error: unknown): never => {
		const line = unwritableDatabaseLine(error, url);
		if (!line) throw error;
		console.error(line);
		process.exit(1);
	};
	try {
		const result = step();
		return (result instanceof Promise ? result.catch(fail) : result) as T;
	} catch (error) {
		return fail(error);
	}
}
