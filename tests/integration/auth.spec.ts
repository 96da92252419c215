import { describe, expect, it } from 'vitest';
import { readMail, waitForLink } from '../support/smtp-catcher';
import { createShop, mailDir, newClient, openServerDb, uniqueEmail } from './helpers';

describe('creating a shop', () => {
	it('opens a shop only from the e-mailed link, which works once', async () => {
		const client = newClient();
		const email = uniqueEmail('linked');
		const sent = await client.action('/signup', {
			shopName: 'Saltpan Motors',
			name: 'Link Owner',
			email,
			password: 'thermostat-housing-7'
		});
		expect(sent.type).toBe('success');
		expect(sent.data?.sentTo).toBe(email);
		const db = openServerDb();
		const users = async () =>
			Number(
				(
					await db.execute({
						sql: 'SELECT count(*) AS n FROM users WHERE email = ?',
						args: [email]
					})
				).rows[0].n
			);
		expect(await users()).toBe(0);
		const path = new URL(await waitForLink(mailDir(), email, '/signup/')).pathname;
		const page = await client.get(path);
		expect(page.status).toBe(200);
		expect(await page.text()).toContain('Saltpan Motors');
		expect((await client.action(path, {})).type).toBe('redirect');
		expect(await users()).toBe(1);
		const again = await newClient().action(path, {});
		expect(again.type).toBe('failure');
		expect((await newClient().get(path)).status).toBe(404);
		expect(await users()).toBe(1);
		db.close();
	});

	it('makes the first user an admin who lands signed in on the home page', async () => {
		const { client } = await createShop('Ferry Road Repairs');
		const home = await client.get('/');
		expect(home.status).toBe(200);
		const html = await home.text();
		expect(html).toContain('Ferry Road Repairs');
		expect(html).toContain('Shop admin');
	});

	it('gives the new shop the base rulebook as published edition 1', async () => {
		const { client } = await createShop('Quarry Lane Service');
		const res = await client.json('/api/v1/diagnose', { observations: {} });
		expect(res.status).toBe(200);
		expect(res.body.rulebook.edition).toBe(1);
	});

	it('refuses a duplicate e-mail without saying it has an account, a common password and a short one, and changes nothing', async () => {
		const { email } = await createShop();
		const db = openServerDb();
		const before = (await db.execute('SELECT count(*) AS n FROM shops')).rows[0].n;
		const client = newClient();
		const fields = { shopName: 'X', name: 'Y', password: 'another-long-pass-1' };
		const dup = await client.action('/signup', { ...fields, email });
		const fresh = await newClient().action('/signup', { ...fields, email: uniqueEmail('fresh') });
		// A taken address and a new one get the same answer; only the e-mail tells them apart.
		expect(dup.type).toBe('success');
		expect(fresh.type).toBe('success');
		expect(Object.keys(dup.data ?? {})).toEqual(Object.keys(fresh.data ?? {}));
		await expect
			.poll(() => readMail(mailDir(), email).some((m) => /already use Causeway/.test(m)))
			.toBe(true);
		// Only the link of the shop's own sign-up: none for the second try.
		expect(readMail(mailDir(), email).filter((m) => m.includes('/signup/'))).toHaveLength(1);
		const common = await client.action('/signup', {
			shopName: 'X',
			name: 'Y',
			email: uniqueEmail('x'),
			password: 'password1'
		});
		expect(common.status).toBe(400);
		expect(common.data?.message).toMatch(/most common/);
		const short = await client.action('/signup', {
			shopName: 'X',
			name: 'Y',
			email: uniqueEmail('x'),
			password: 'a1b2c3'
		});
		expect(short.status).toBe(400);
		expect(short.data?.message).toMatch(/at least 8/);
		const after = (await db.execute('SELECT count(*) AS n FROM shops')).rows[0].n;
		expect(after).toBe(before);
		db.close();
	});

	it('answers a malformed form post with field messages, not a crash', async () => {
		const client = newClient();
		const res = await client.action('/signup', { shopName: '', email: 'not-an-address' });
		expect(res.status).toBe(400);
		const errors = res.data?.errors as Record<string, string>;
		expect(errors.shopName).toBe('Enter the shop name.');
		expect(errors.email).toBe('Enter a valid e-mail address.');
		expect(errors.password).toBe('Enter a password.');
	});
});

describe('signing in and out', () => {
	it('gives one generic message for a wrong password and for an unknown account', async () => {
		const { email } = await createShop();
		const client = newClient();
		const wrong = await client.action('/signin', { email, password: 'not-the-password' });
		const unknown = await client.action('/signin', {
			email: uniqueEmail('nobody'),
			password: 'whatever-pass'
		});
		expect(wrong.status).toBe(400);
		expect(unknown.status).toBe(400);
		expect(wrong.data?.message).toBe(unknown.data?.message);
		expect(wrong.data).not.toHaveProperty('values.password');
	});

	it('locks an account gradually after repeated failures, then lets the right password in later', async () => {
		const { email, password } = await createShop();
		const client = newClient();
		const statuses: number[] = [];
		for (let i = 0; i < 6; i++) {
			statuses.push(
				(await client.action('/signin', { email, password: 'wrong-guess-' + i })).status!
			);
		}
		expect(statuses.slice(0, 5)).toEqual([400, 400, 400, 400, 400]);
		expect(statuses[5]).toBe(429);
		const locked = await client.action('/signin', { email, password });
		expect(locked.status).toBe(429);
		// The lock is not permanent: once it has passed, the right password works again.
		const db = openServerDb();
		await db.execute({
			sql: 'UPDATE rate_limits SET locked_until = 0 WHERE key = ?',
			args: [`login:account:${email}`]
		});
		db.close();
		const ok = await client.action('/signin', { email, password });
		expect(ok.type).toBe('redirect');
	});

	it('sends a person only to a path of this site after signing in, whatever `next` holds', async () => {
		const { email, password } = await createShop();
		const cases: [string, string][] = [
			['/\t/evil.example', '/'], // the page decodes ?next=/%09/evil.example to this
			['/\n/evil.example', '/'],
			['//evil.example/x', '/'],
			['/\\evil.example', '/'],
			['/.//evil.example', '/'],
			['https://evil.example/', '/'],
			['/x\r\nSet-Cookie: a=b', '/'],
			['/calculators?unit=°C', '/calculators?unit=%C2%B0C'],
			['/settings/users', '/settings/users']
		];
		for (const [next, expected] of cases) {
			const res = await newClient().action('/signin', { email, password, next });
			expect(res.type, JSON.stringify(next)).toBe('redirect');
			expect(res.location, JSON.stringify(next)).toBe(expected);
		}
	});

	it('sets an httpOnly, SameSite session cookie whose token is not stored in the database', async () => {
		const { email, password } = await createShop();
		const res = await newClient().postForm('/signin', { email, password });
		expect(res.status).toBe(303);
		const cookie = res.headers.getSetCookie().find((c) => c.startsWith('causeway_session='))!;
		expect(cookie).toMatch(/HttpOnly/i);
		expect(cookie).toMatch(/SameSite=Lax/i);
		expect(cookie).toMatch(/Path=\//);
		const token = cookie.split(';')[0].split('=')[1];
		expect(token.length).toBeGreaterThanOrEqual(26); // 160 random bits in base32
		const db = openServerDb();
		const found = await db.execute({
			sql: 'SELECT count(*) AS n FROM sessions WHERE id = ?',
			args: [token]
		});
		expect(found.rows[0].n).toBe(0);
		db.close();
	});

	it('ends the session at sign-out', async () => {
		const { client } = await createShop();
		expect((await client.get('/')).status).toBe(200);
		const cookieBefore = client.cookies.get('causeway_session')!;
		const out = await client.action('/signout', {});
		expect(out.type).toBe('redirect');
		const replay = newClient();
		replay.cookies.set('causeway_session', cookieBefore);
		const res = await replay.get('/');
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toMatch(/^\/signin/);
	});

	it('refuses a cross-site form post', async () => {
		const { email, password } = await createShop();
		const res = await fetch(`${newClient().baseUrl}/signin`, {
			method: 'POST',
			redirect: 'manual',
			headers: {
				origin: 'https://elsewhere.example',
				'content-type': 'application/x-www-form-urlencoded'
			},
			body: new URLSearchParams({ email, password }).toString()
		});
		expect(res.status).toBe(403);
	});

	it.each([
		['multipart/form-data; boundary=x', 'https://elsewhere.example'],
		['text/plain', 'https://elsewhere.example'],
		['application/x-www-form-urlencoded', undefined]
	])('refuses a form post of type %s from origin %s, and signs nobody in', async (type, origin) => {
		const { email, password } = await createShop();
		const headers: Record<string, string> = { 'content-type': type };
		if (origin) headers.origin = origin;
		const res = await fetch(`${newClient().baseUrl}/signin`, {
			method: 'POST',
			redirect: 'manual',
			headers,
			body: new URLSearchParams({ email, password }).toString()
		});
		expect(res.status).toBe(403);
		expect(await res.text()).toMatch(/Cross-site POST form submissions are forbidden/);
		expect(res.headers.getSetCookie()).toEqual([]);
	});
});

describe('inviting a user', () => {
	it('sends a one-time link by e-mail that creates the account with the invited role', async () => {
		const { client } = await createShop('Marsh End Motors');
		const email = uniqueEmail('newtech');
		const invited = await client.action('/settings/users?/invite', { email, role: 'technician' });
		expect(invited.type).toBe('success');
		const link = await waitForLink(mailDir(), email, '/invite/');
		const path = new URL(link).pathname;

		const newcomer = newClient();
		const page = await newcomer.get(path);
		expect(page.status).toBe(200);
		expect(await page.text()).toContain('Marsh End Motors');
		const accepted = await newcomer.action(path, {
			name: 'New Tech',
			password: 'coolant-level-check-3'
		});
		expect(accepted.type).toBe('redirect');
		const home = await newcomer.get('/');
		expect(await home.text()).toContain('Technician');

		const again = await newClient().get(path);
		expect(again.status).toBe(404);
		const reuse = await newClient().action(path, {
			name: 'Someone',
			password: 'another-good-pass-4'
		});
		expect(reuse.type).toBe('failure');
		expect(reuse.status).toBe(404);
		expect(reuse.data?.message).toBe('This invitation link has expired or was already used.');
	});

	it('refuses an expired link', async () => {
		const { client } = await createShop();
		const email = uniqueEmail('late');
		await client.action('/settings/users?/invite', { email, role: 'lead' });
		const link = await waitForLink(mailDir(), email, '/invite/');
		const db = openServerDb();
		await db.execute({ sql: 'UPDATE invites SET expires_at = 1 WHERE email = ?', args: [email] });
		db.close();
		const res = await newClient().get(new URL(link).pathname);
		expect(res.status).toBe(404);
		expect(await res.text()).toContain('expired or was already used');
	});

	it("refuses to invite someone already in the caller's shop, and invites another shop's user like anyone", async () => {
		const { client, email } = await createShop();
		const own = await client.action('/settings/users?/invite', { email, role: 'technician' });
		expect(own.status).toBe(409);
		const other = await createShop();
		const elsewhere = await client.action('/settings/users?/invite', {
			email: other.email,
			role: 'technician'
		});
		const nobody = await client.action('/settings/users?/invite', {
			email: uniqueEmail('unknown'),
			role: 'technician'
		});
		expect(elsewhere.type).toBe('success');
		expect(nobody.type).toBe('success');
		expect(String(elsewhere.data?.notice)).toBe(`Invitation sent to ${other.email}.`);
		// The link goes to the address's owner, who learns there that one address holds one account.
		const path = new URL(await waitForLink(mailDir(), other.email, '/invite/')).pathname;
		const accepted = await newClient().action(path, {
			name: 'Two Shops',
			password: 'overflow-bottle-cap-6'
		});
		expect(accepted.status).toBe(409);
	});

	it('ends the invitations of a sender who is deactivated or may no longer invite', async () => {
		const { client } = await createShop();
		const managerEmail = uniqueEmail('mgr');
		await client.action('/settings/users?/invite', { email: managerEmail, role: 'manager' });
		const managerPath = new URL(await waitForLink(mailDir(), managerEmail, '/invite/')).pathname;
		const manager = newClient();
		await manager.action(managerPath, { name: 'Shop Manager', password: 'fan-clutch-spanner-2' });
		const first = uniqueEmail('first');
		const second = uniqueEmail('second');
		expect(
			(await manager.action('/settings/users?/invite', { email: first, role: 'lead' })).type
		).toBe('success');
		const firstPath = new URL(await waitForLink(mailDir(), first, '/invite/')).pathname;
		expect((await newClient().get(firstPath)).status).toBe(200);

		const db = openServerDb();
		const { rows } = await db.execute({
			sql: 'SELECT id FROM users WHERE email = ?',
			args: [managerEmail]
		});
		const managerId = String(rows[0].id);
		// Demoted: a technician may not invite, so the invitation stops working.
		await client.action('/settings/users?/changeRole', { userId: managerId, role: 'technician' });
		expect((await newClient().get(firstPath)).status).toBe(404);
		// Restored, invites again, then deactivated: that invitation ends too.
		await client.action('/settings/users?/changeRole', { userId: managerId, role: 'manager' });
		await manager.signIn(managerEmail, 'fan-clutch-spanner-2');
		await manager.action('/settings/users?/invite', { email: second, role: 'lead' });
		const secondPath = new URL(await waitForLink(mailDir(), second, '/invite/')).pathname;
		expect((await newClient().get(secondPath)).status).toBe(200);
		await client.action('/settings/users?/setActive', { userId: managerId, active: 'false' });
		expect((await newClient().get(secondPath)).status).toBe(404);
		const join = await newClient().action(secondPath, {
			name: 'Too Late',
			password: 'thermostat-seal-ring-4'
		});
		expect(join.status).toBe(404);
		await client.action('/settings/users?/setActive', { userId: managerId, active: 'true' });
		expect((await newClient().get(secondPath)).status).toBe(404);
		db.close();
	});

	it('lets a manager withdraw a pending invitation, audited, and nobody else', async () => {
		const { client } = await createShop();
		const email = uniqueEmail('withdrawn');
		await client.action('/settings/users?/invite', { email, role: 'technician' });
		const path = new URL(await waitForLink(mailDir(), email, '/invite/')).pathname;
		const db = openServerDb();
		const { rows } = await db.execute({
			sql: 'SELECT id FROM invites WHERE email = ?',
			args: [email]
		});
		const inviteId = String(rows[0].id);

		const stranger = await createShop();
		const foreign = await stranger.client.action('/settings/users?/withdrawInvite', { inviteId });
		expect(foreign.status).toBe(404);
		const techEmail = uniqueEmail('tech');
		await client.action('/settings/users?/invite', { email: techEmail, role: 'technician' });
		const techPath = new URL(await waitForLink(mailDir(), techEmail, '/invite/')).pathname;
		const tech = newClient();
		await tech.action(techPath, { name: 'Bay Tech', password: 'hose-clamp-pliers-8' });
		expect((await tech.action('/settings/users?/withdrawInvite', { inviteId })).status).toBe(403);
		expect((await newClient().get(path)).status).toBe(200);

		const done = await client.action('/settings/users?/withdrawInvite', { inviteId });
		expect(done.type).toBe('success');
		expect((await newClient().get(path)).status).toBe(404);
		expect(await (await client.get('/settings/users')).text()).not.toContain(email);
		const again = await client.action('/settings/users?/withdrawInvite', { inviteId });
		expect(again.status).toBe(404);
		const audit = await db.execute({
			sql: "SELECT count(*) AS n FROM audit_log WHERE action = 'user.invite_withdrawn' AND target = ?",
			args: [inviteId]
		});
		expect(audit.rows[0].n).toBe(1);
		db.close();
	});

	it('sends at most the hourly allowance of invitations when 30 arrive at once', async () => {
		const { client } = await createShop();
		const emails = Array.from({ length: 30 }, (_, i) => uniqueEmail(`probe${i}`));
		const answers = await Promise.all(
			emails.map((email) => client.action('/settings/users?/invite', { email, role: 'technician' }))
		);
		const sent = answers.filter((a) => a.type === 'success').length;
		expect(sent).toBe(20); // INVITES_PER_USER_PER_HOUR
		expect(answers.filter((a) => a.status === 429).length).toBe(10);
		await waitForLink(
			mailDir(),
			emails[answers.findIndex((a) => a.type === 'success')],
			'/invite/'
		);
		await new Promise((r) => setTimeout(r, 500));
		const mailed = emails.filter((email) => readMail(mailDir(), email).length > 0).length;
		expect(mailed).toBeLessThanOrEqual(20);
	});
});

describe('password reset', () => {
	it('mails a one-time link; the new password works and old sessions end', async () => {
		const { client, email } = await createShop();
		const anon = newClient();
		const asked = await anon.action('/reset', { email });
		expect(asked.type).toBe('success');
		const link = await waitForLink(mailDir(), email, '/reset/');
		const path = new URL(link).pathname;
		const weak = await anon.action(path, { password: 'qwerty123' });
		expect(weak.status).toBe(400);
		const done = await anon.action(path, { password: 'thermostat-housing-77' });
		expect(done.type).toBe('redirect');
		expect((await client.get('/')).status).toBe(303); // the old session is gone
		const fresh = newClient();
		await fresh.signIn(email, 'thermostat-housing-77');
		expect((await fresh.get('/')).status).toBe(200);
		expect((await newClient().get(path)).status).toBe(404);
	});

	it('cancels every other open link of the account when one is used', async () => {
		const { email } = await createShop();
		const anon = newClient();
		await anon.action('/reset', { email });
		await waitForLink(mailDir(), email, '/reset/');
		await anon.action('/reset', { email });
		const resets = () => readMail(mailDir(), email).filter((m) => m.includes('/reset/'));
		await expect.poll(() => resets().length, { timeout: 10_000 }).toBeGreaterThanOrEqual(2);
		const [older, newer] = resets().map(
			(m) => new URL(m.match(/https?:\/\/[^\s"<>]+\/reset\/[^\s"<>]+/)![0]).pathname
		);
		expect(older).not.toBe(newer);
		const used = await anon.action(newer, { password: 'coolant-reservoir-12' });
		expect(used.type).toBe('redirect');
		expect((await newClient().get(older)).status).toBe(404);
		const late = await newClient().action(older, { password: 'radiator-hose-clip-34' });
		expect(late.status).toBe(404);
		await newClient().signIn(email, 'coolant-reservoir-12');
	});

	it('answers the same for an unknown address and sends nothing', async () => {
		const email = uniqueEmail('ghost');
		const res = await newClient().action('/reset', { email });
		expect(res.type).toBe('success');
		expect(res.data?.sent).toBe(true);
	});
});

describe('managing users', () => {
	it('ends the sessions of a user whose role changes, and of one who is deactivated', async () => {
		const { client } = await createShop();
		const email = uniqueEmail('mover');
		await client.action('/settings/users?/invite', { email, role: 'technician' });
		const path = new URL(await waitForLink(mailDir(), email, '/invite/')).pathname;
		const member = newClient();
		await member.action(path, { name: 'Moving Person', password: 'hose-clamp-spanner-5' });
		expect((await member.get('/rulebook')).status).toBe(403);

		const db = openServerDb();
		const { rows } = await db.execute({
			sql: 'SELECT id FROM users WHERE email = ?',
			args: [email]
		});
		const userId = String(rows[0].id);
		const changed = await client.action('/settings/users?/changeRole', { userId, role: 'lead' });
		expect(changed.type).toBe('success');
		expect((await member.get('/')).status).toBe(303);
		await member.signIn(email, 'hose-clamp-spanner-5');
		expect((await member.get('/rulebook')).status).toBe(200);

		const off = await client.action('/settings/users?/setActive', { userId, active: 'false' });
		expect(off.type).toBe('success');
		expect((await member.get('/')).status).toBe(303);
		const again = await newClient().action('/signin', { email, password: 'hose-clamp-spanner-5' });
		expect(again.status).toBe(400);
		const audit = await db.execute({
			sql: 'SELECT action FROM audit_log WHERE target = ? ORDER BY id',
			args: [userId]
		});
		expect(audit.rows.map((r) => r.action)).toEqual([
			'user.joined',
			'user.role_changed',
			'user.deactivated'
		]);
		db.close();
	});

	it('will not let the last admin demote or deactivate themselves away', async () => {
		const { client } = await createShop();
		const db = openServerDb();
		const me = await client.get('/settings/users');
		expect(me.status).toBe(200);
		const { rows } = await db.execute(
			"SELECT u.id FROM users u JOIN audit_log a ON a.actor_user_id = u.id WHERE a.action = 'shop.created' ORDER BY a.id DESC LIMIT 1"
		);
		const res = await client.action('/settings/users?/setActive', {
			userId: String(rows[0].id),
			active: 'false'
		});
		expect(res.status).toBe(409);
		db.close();
	});
});
