import { getConfig } from '../config';
import { createDatabase, prepareDatabase } from './client';

const config = getConfig();

/** The process-wide database. The app keeps no other state that matters. */
export const db = createDatabase(config.DATABASE_URL, config.DATABASE_AUTH_TOKEN);

export const prepare = () => prepareDatabase(db, config.MIGRATIONS_DIR);

export type { Database } from './client';
