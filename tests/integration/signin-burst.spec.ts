import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse } from 'devalue';
import { join } from 'node:path';
import { startServer, type RunningServer } from '../support/server';
import { waitForLink } from '../support/smtp-catcher';

/**
 * Parallel sign-ins against a server of their own, which takes the client address from
 * X-Forwarded-For so that each test chooses its addresses (and no other test's failures count).
 */
let server: RunningServer;
const MAX_ATTEMPTS = 5;
const PASSWORD = 'water-pump-impeller-8';

beforeAll(async () => {
	server = await startServer({
		name: 'signin-burst',
		env: {
			ADDRESS_HEADER: 'x-forwarded-for',
			LOGIN_MAX_ATTEMPTS: String(MAX_ATTEMPTS),
			SIGNUP_LIMIT_PER_HOUR: '1000'
		}
	});
});
afterAll(() => server?.stop());

let n = 0;
const address = () => `198.51.100.${++n}`;

async function post(path: string, fields: Record<string, string>, ip: string) {
	const res = await fetch(server.baseUrl + path, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin: server.baseUrl,
			accept: 'application/json',
			'x-sveltekit-action': 'true',
			'content-type': 'application/x-www-form-urlencoded',
			'x-forwarded-for': ip
		},
		body: new URLSearchParams(fields).toString()
	});
	const body = (await res.json()) as { type: string; status?: number; data?: string };
	return {
		type: body.type,
		status: body.status ?? res.status,
		data: body.data ? (parse(body.data) as Record<string, unknown>) : undefined,
		session: res.headers.getSetCookie().some((c) => /^causeway_session=[^;]+/.test(c))
	};
}

async function newAccount(name: string) {
	const email = `${name}.${process.pid}.${++n}@burst-tests.example`;
	const made = await post(
		'/signup',
		{ shopName: 'Tidewater Motors', name: 'Burst Owner', email, password: PASSWORD },
		address()
	);
	expect(made.type).toBe('success');
	const link = await waitForLink(join(server.dataDir, 'mail-out'), email, '/signup/');
	expect((await post(new URL(link).pathname, {}, address())).type).toBe('redirect');
	return email;
}

const signIn = (email: string, password: string, ip = address()) =>
	post('/signin', { email, password }, ip);

describe('sign-in lock-out under a burst', () => {
	it('locks the account when 50 wrong passwords arrive at once, and then refuses the right one', async () => {
		const email = await newAccount('burst50');
		const answers = await Promise.all(
			Array.from({ length: 50 }, (_, i) => signIn(email, `wrong-guess-${i}-xyz`))
		);
		const checked = answers.filter((a) => a.status === 400).length;
		const refused = answers.filter((a) => a.status === 429).length;
		expect(checked).toBeLessThanOrEqual(MAX_ATTEMPTS);
		expect(checked + refused).toBe(50);
		const right = await signIn(email, PASSWORD);
		expect(right.status).toBe(429);
		expect(right.session).toBe(false);
	});

	it('checks at most the allowance of 100 parallel attempts, and the right one past it does not sign in', async () => {
		const email = await newAccount('burst100');
		const passwords = Array.from({ length: 100 }, (_, i) => `wrong-guess-${i}-abc`);
		passwords[60] = PASSWORD;
		const answers = await Promise.all(passwords.map((p) => signIn(email, p)));
		const checked = answers.filter((a) => a.status !== 429);
		expect(checked.length).toBeLessThanOrEqual(MAX_ATTEMPTS);
		// Sent 61st: whichever order the server took them in, it may pass only within the first five.
		const rightAnswer = answers[60];
		if (rightAnswer.type === 'redirect') expect(checked).toContain(rightAnswer);
		expect(answers.filter((a) => a.session).length).toBeLessThanOrEqual(1);
		expect(answers.filter((a) => a.status === 429).length).toBeGreaterThanOrEqual(95);
	});

	it('locks an address that tries many accounts at once, without locking the accounts elsewhere', async () => {
		const email = await newAccount('victim');
		const ip = address();
		const answers = await Promise.all(
			Array.from({ length: 60 }, (_, i) =>
				signIn(`nobody.${i}.${n}@burst-tests.example`, 'some-guess-123', ip)
			)
		);
		const checked = answers.filter((a) => a.status === 400).length;
		expect(checked).toBeLessThanOrEqual(MAX_ATTEMPTS * 4);
		expect((await signIn(email, PASSWORD, ip)).status).toBe(429);
		const elsewhere = await signIn(email, PASSWORD);
		expect(elsewhere.type).toBe('redirect');
		expect(elsewhere.session).toBe(true);
	});

	it('lets a workshop of people sign in from one address without locking it', async () => {
		const emails = await Promise.all(
			Array.from({ length: MAX_ATTEMPTS * 4 + 5 }, (_, i) => newAccount(`crew${i}`))
		);
		const ip = address();
		const statuses: number[] = [];
		for (const email of emails) statuses.push((await signIn(email, PASSWORD, ip)).status);
		expect(statuses.every((s) => s === 303)).toBe(true);
	});
});
