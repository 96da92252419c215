import { SMTPServer } from 'smtp-server';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client } from '../support/client';
import { startServer, type RunningServer } from '../support/server';

/**
 * A mail server that takes each message and holds its reply until the test lets it go: an
 * answer that arrives while the message is still held did not wait for the mail.
 */
async function startHoldingSmtp() {
	const held: { to: string; text: string; release: () => void }[] = [];
	let accepted = 0;
	const smtp = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS'],
		logger: false,
		onData(stream, session, callback) {
			const chunks: Buffer[] = [];
			stream.on('data', (chunk: Buffer) => chunks.push(chunk));
			stream.on('end', () =>
				held.push({
					to: session.envelope.rcptTo.map((r) => r.address).join(','),
					text: Buffer.concat(chunks).toString('utf8'),
					release: () => {
						accepted++;
						callback();
					}
				})
			);
		}
	});
	await new Promise<void>((resolve) => smtp.listen(0, '127.0.0.1', resolve));
	const address = smtp.server.address();
	return {
		port: typeof address === 'object' && address ? address.port : 0,
		held,
		accepted: () => accepted,
		releaseAll: () => held.splice(0).forEach((m) => m.release()),
		close: () => new Promise<void>((resolve) => smtp.close(() => resolve()))
	};
}

type Holding = Awaited<ReturnType<typeof startHoldingSmtp>>;
let smtp: Holding;
let server: RunningServer;

beforeAll(async () => {
	smtp = await startHoldingSmtp();
	server = await startServer({
		name: 'mail-background',
		env: { SMTP_URL: `smtp://127.0.0.1:${smtp.port}`, SIGNUP_LIMIT_PER_HOUR: '100' }
	});
});
afterAll(async () => {
	smtp?.releaseAll();
	await server?.stop();
	await smtp?.close();
});

const waitUntil = async (ok: () => boolean) => {
	for (let i = 0; i < 100 && !ok(); i++) await new Promise((r) => setTimeout(r, 50));
	return ok();
};

async function openShop() {
	const client = new Client(server.baseUrl);
	const email = `owner.${process.pid}.${Date.now()}@held-mail.example`;
	const made = await client.action('/signup', {
		shopName: 'Breakwater Garage',
		name: 'Held Owner',
		email,
		password: 'heater-core-flush-5'
	});
	// The answer comes while the sign-up mail is still held; its link then creates the shop.
	expect(made.type).toBe('success');
	expect(await waitUntil(() => smtp.held.some((m) => m.to === email))).toBe(true);
	const message = smtp.held.find((m) => m.to === email)!;
	const path = message.text.replace(/=\r?\n/g, '').match(/\/signup\/[A-Za-z0-9_-]+/)![0];
	smtp.releaseAll();
	expect((await client.action(path, {})).type).toBe('redirect');
	return { client, email };
}

describe('answers never wait on the mail server', () => {
	it('answers a reset for a real account while its mail is still held, as for an unknown one', async () => {
		const { email } = await openShop();
		const before = smtp.accepted(); // the sign-up mail
		const real = await new Client(server.baseUrl).action('/reset', { email });
		const unknown = await new Client(server.baseUrl).action('/reset', {
			email: `nobody.${Date.now()}@held-mail.example`
		});
		expect(real.type).toBe('success');
		expect({ ...real.data, email: '' }).toEqual({ ...unknown.data, email: '' });
		// The message reached the mail server, which has not accepted it yet.
		expect(await waitUntil(() => smtp.held.some((m) => m.to === email))).toBe(true);
		expect(smtp.accepted()).toBe(before);
		smtp.releaseAll();
		expect(await waitUntil(() => smtp.accepted() === before + 1)).toBe(true);
	});

	it('answers an invitation while its mail is still held', async () => {
		const { client } = await openShop();
		const to = `invited.${Date.now()}@held-mail.example`;
		const before = smtp.accepted();
		const answer = await client.action('/settings/users?/invite', { email: to, role: 'lead' });
		expect(answer.type).toBe('success');
		expect(await waitUntil(() => smtp.held.some((m) => m.to === to))).toBe(true);
		expect(smtp.accepted()).toBe(before);
		smtp.releaseAll();
	});
});
