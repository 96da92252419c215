import { sql } from 'drizzle-orm';
import { db } from './db';

export async function pingDatabase(): Promise<boolean> {
	try {
		await db.run(sql`SELECT 1`);
		return true;
	} catch {
		return false;
	}
}
