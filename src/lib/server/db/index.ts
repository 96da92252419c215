// The process-wide database and its preparation before the server answers.
import { getConfig } from '../config';
import { createDatabase, prepareDatabase } from './client';
import { redactQueryParameters } from './redact-errors';
import { exitIfUnwritable, probeDatabaseWrite } from './startup';

const config = getConfig();
redactQueryParameters();

/** The process-wide database. The app keeps no other state that matters. */
export const db = exitIfUnwritable(
	() => createDatabase(config.DATABASE_URL, config.DATABASE_AUTH_TOKEN),
	config.DATABASE_URL
);

/** Migrates, then proves the database takes a write, before the server answers anyone. */
export const prepare = () =>
	exitIfUnwritable(async () => {
		await prepareDatabase(db, config.MIGRATIONS_DIR);
		await probeDatabaseWrite(db);
	}, config.DATABASE_URL);

export type { Database } from './client';
