import { inject } from 'vitest';
import { createClient } from '@libsql/client';
import { join } from 'node:path';
import { Client } from '../support/client';
import { waitForLink } from '../support/smtp-catcher';
import { DEMO_API_KEY, DEMO_PASSWORD } from './global-setup';

export { DEMO_API_KEY, DEMO_PASSWORD };

export const baseUrl = () => inject('baseUrl');
export const mailDir = () => inject('mailDir');
export const newClient = () => new Client(inject('baseUrl'));

/** Direct read access to the server's SQLite file, to check what was (not) written. */
export function openServerDb() {
	return createClient({ url: `file:${join(inject('dataDir'), 'causeway.db')}` });
}

export const DEMO = {
	technician: 'tech@saltmarsh.example',
	lead: 'lead@saltmarsh.example',
	manager: 'manager@saltmarsh.example',
	admin: 'admin@saltmarsh.example'
} as const;

let n = 0;
/** A unique invented address per call, so tests never collide. */
export const uniqueEmail = (who: string) =>
	`${who}.${process.pid}.${Date.now()}.${++n}@bay-tests.example`;

/**
 * Creates a new shop through the sign-up form and the e-mailed link, and returns its signed-in
 * admin client.
 */
export async function createShop(shopName = 'Cinder Hill Auto') {
	const client = newClient();
	const email = uniqueEmail('owner');
	const password = 'radiator-cap-tester-9';
	const result = await client.action('/signup', {
		shopName,
		name: 'Owner Person',
		email,
		password
	});
	if (result.type !== 'success') throw new Error(`sign-up failed: ${JSON.stringify(result)}`);
	const link = await waitForLink(mailDir(), email, '/signup/');
	const confirmed = await client.action(new URL(link).pathname, {});
	if (confirmed.type !== 'redirect')
		throw new Error(`confirming failed: ${JSON.stringify(confirmed)}`);
	return { client, email, password };
}
