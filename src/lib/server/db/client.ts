import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { createClient, type Client } from '@libsql/client';
import { drizzle, type LibSQLDatabase } from 'drizzle-orm/libsql';
import { migrate } from 'drizzle-orm/libsql/migrator';
import * as schema from './schema';

export type Database = LibSQLDatabase<typeof schema> & { $client: Client };

/** Per-connection settings; journal_mode is stored in the file, the others are not. */
const CONNECTION_PRAGMAS = ['PRAGMA foreign_keys = ON', 'PRAGMA busy_timeout = 5000'];
const FILE_PRAGMAS = ['PRAGMA journal_mode = WAL', 'PRAGMA synchronous = NORMAL'];

async function applyPragmas(client: Client, pragmas: string[]) {
	for (const pragma of pragmas) await client.execute(pragma);
}

/**
 * Creates the client. For `file:` URLs the folder is created first (libSQL cannot open a file in
 * a missing folder). `client.transaction()` hands its connection to the transaction and opens a
 * fresh one lazily, which would lose per-connection pragmas: the wrapper re-applies them there.
 */
export function createDatabase(url: string, authToken?: string): Database {
	if (url.startsWith('file:')) {
		const path = url.slice('file:'.length).split('?')[0];
		if (path && path !== ':memory:') mkdirSync(dirname(resolve(path)), { recursive: true });
	}
	const client = createClient({ url, authToken });
	const transaction = client.transaction.bind(client);
	client.transaction = (async (mode) => {
		const tx = await transaction(mode);
		await applyPragmas(client, CONNECTION_PRAGMAS);
		return tx;
	}) as Client['transaction'];
	return drizzle(client, { schema }) as Database;
}

/** Sets the pragmas and applies pending migrations; run once before serving. */
export async function prepareDatabase(db: Database, migrationsFolder: string) {
	const isFile = db.$client.protocol === 'file';
	await applyPragmas(db.$client, [...(isFile ? FILE_PRAGMAS : []), ...CONNECTION_PRAGMAS]);
	await migrate(db, { migrationsFolder: resolve(migrationsFolder) });
}
