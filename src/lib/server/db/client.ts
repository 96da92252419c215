// Opening a libSQL database: connection pragmas and migrations.
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { createClient, type Client } from '@libsql/client';
import { ConnectionPool } from '@libsql/client/sqlite3';
import { drizzle, type LibSQLDatabase } from 'drizzle-orm/libsql';
import { migrate } from 'drizzle-orm/libsql/migrator';
import * as schema from './schema';

export type Database = LibSQLDatabase<typeof schema> & { $client: Client };

/**
 * Per-connection settings: SQLite forgets them when a connection closes. In WAL mode,
 * synchronous = NORMAL syncs at checkpoints instead of on every commit; the database stays
 * consistent after a crash and a power cut may lose the last commits (sqlite.org/pragma.html).
 * Left at this build's default, FULL, every write waits for an fsync.
 */
const SESSION_PRAGMAS = ['PRAGMA foreign_keys = ON', 'PRAGMA busy_timeout = 5000'];
const CONNECTION_PRAGMAS = [...SESSION_PRAGMAS, 'PRAGMA synchronous = NORMAL'];
/** Stored in the database file itself: set once. */
const FILE_PRAGMAS = ['PRAGMA journal_mode = WAL'];

async function applyPragmas(client: Client, pragmas: string[]) {
	for (const pragma of pragmas) await client.execute(pragma);
}

/**
 * For `file:` URLs @libsql/client keeps a pool of connections and opens another whenever every
 * one is borrowed: while a transaction holds one, and whenever two queries start in the same
 * tick (each waits a microtask for its connection). A pragma sent through `execute` reaches only
 * the connection that ran it, so the settings are applied here to each connection as the pool
 * hands it out for the first time. `tests/integration/database.spec.ts` checks that they hold on
 * connections the pool opens later.
 */
const configuredConnections = new WeakSet<object>();
const poolPrototype = ConnectionPool.prototype as ConnectionPool & { causewayConfigured?: true };
if (!poolPrototype.causewayConfigured) {
	const acquireSync = poolPrototype.acquireSync;
	poolPrototype.acquireSync = function (forTransaction) {
		const connection = acquireSync.call(this, forTransaction);
		if (!configuredConnections.has(connection)) {
			for (const pragma of CONNECTION_PRAGMAS) connection.exec(pragma);
			configuredConnections.add(connection);
		}
		return connection;
	};
	poolPrototype.causewayConfigured = true;
}

/**
 * Creates the client. For `file:` URLs the folder is created first (libSQL cannot open a file in
 * a missing folder).
 */
export function createDatabase(url: string, authToken?: string): Database {
	if (url.startsWith('file:')) {
		const path = url.slice('file:'.length).split('?')[0];
		if (path && path !== ':memory:') mkdirSync(dirname(resolve(path)), { recursive: true });
	}
	const client = createClient({ url, authToken });
	return drizzle(client, { schema }) as Database;
}

/** Sets the pragmas and applies pending migrations; run once before serving. */
export async function prepareDatabase(db: Database, migrationsFolder: string) {
	const isFile = db.$client.protocol === 'file';
	// A file's connections are configured as the pool opens them (above); a libSQL server gets the
	// session settings it accepts.
	await applyPragmas(db.$client, isFile ? FILE_PRAGMAS : SESSION_PRAGMAS);
	await migrate(db, { migrationsFolder: resolve(migrationsFolder) });
}
