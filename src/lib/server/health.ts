/** Liveness (the database answers) and readiness (the database also takes writes). */
import { sql } from 'drizzle-orm';
import { db } from './db';
import type { Database } from './db/client';
import { probeDatabaseWrite } from './db/startup';

/** A read only: `/api/health` is the cheap baseline that load balancers and the bench poll. */
export async function pingDatabase(): Promise<boolean> {
	try {
		await db.run(sql`SELECT 1`);
		return true;
	} catch {
		return false;
	}
}

export async function databaseWritable(database: Database = db): Promise<boolean> {
	try {
		await probeDatabaseWrite(database);
		return true;
	} catch (error) {
		console.error('readiness: the database cannot be written:', (error as Error)?.message);
		return false;
	}
}
