import { describe, expect, it } from 'vitest';
import { createShop, newClient, openServerDb } from './helpers';

const DEMO_FORM = '/intake/saltmarsh-lane';

const validForm = (overrides: Record<string, string> = {}) => ({
	complaint: 'The gauge climbs in traffic and I top up the coolant every week.',
	gauge: 'idle',
	topping: 'yes',
	smell: '',
	name: 'Ada Fenwick',
	phone: '+44 1632 960 222',
	email: '',
	make: 'Tollard',
	model: 'Marsh Van',
	year: '2015',
	plate: 'sl15 mrv',
	vin: '',
	odometer: '88000',
	odometerUnit: 'mi',
	website: '',
	...overrides
});

async function intakeCases(shopFilter = 'is_demo = 1') {
	const db = openServerDb();
	const rows = (
		await db.execute(
			`SELECT c.id, c.status, c.source, c.complaint, c.contact, c.odometer_value, c.odometer_unit,
				c.created_by, v.plate, v.make, e.kind, e.payload, e.ranking
			FROM cases c JOIN shops s ON s.id = c.shop_id
			LEFT JOIN vehicles v ON v.id = c.vehicle_id
			LEFT JOIN case_events e ON e.case_id = c.id AND e.seq = 1
			WHERE s.${shopFilter} AND c.source = 'intake-form' ORDER BY c.rowid`
		)
	).rows;
	db.close();
	return rows;
}

describe('hosted intake form', () => {
	it('is a public page per shop, found by its slug; an unknown slug is 404', async () => {
		const page = await newClient().get(DEMO_FORM);
		expect(page.status).toBe(200);
		const html = await page.text();
		expect(html).toContain('Saltmarsh Lane Garage');
		expect(html).toContain('name="website"');
		expect((await newClient().get('/intake/no-such-shop')).status).toBe(404);
	});

	it('writes a waiting case with the customer’s words, contact, vehicle and answers, then thanks them', async () => {
		const before = (await intakeCases()).length;
		const res = await newClient().action(DEMO_FORM, validForm());
		expect(res.type).toBe('redirect');
		expect(res.location).toBe(`${DEMO_FORM}/thanks`);
		const rows = await intakeCases();
		expect(rows).toHaveLength(before + 1);
		const row = rows.at(-1)!;
		expect(row).toMatchObject({
			status: 'waiting',
			complaint: 'The gauge climbs in traffic and I top up the coolant every week.',
			odometer_value: 88000,
			odometer_unit: 'mi',
			created_by: null,
			plate: 'SL15MRV',
			make: 'Tollard',
			kind: 'case_opened'
		});
		expect(JSON.parse(String(row.contact))).toEqual({
			name: 'Ada Fenwick',
			phone: '+44 1632 960 222'
		});
		// "Not sure" (the empty choice) is left out; the others map to the rulebook's observations.
		expect(JSON.parse(String(row.payload)).observations).toEqual({
			temp_gauge: 'high_at_idle',
			level_drops_between_checks: true
		});
		expect(JSON.parse(String(row.ranking)).length).toBeGreaterThan(0);
		const thanks = await newClient().get(`${DEMO_FORM}/thanks`);
		expect(await thanks.text()).toContain('Thank you');
	});

	it('refuses a form without a way to reach the customer or with a bad VIN, writing nothing', async () => {
		const before = (await intakeCases()).length;
		const noContact = await newClient().action(DEMO_FORM, validForm({ phone: '', email: '' }));
		expect(noContact.status).toBe(400);
		expect(noContact.data?.errors).toHaveProperty('phone');
		expect(noContact.data?.values).toMatchObject({ complaint: validForm().complaint });
		// 49 CFR 565 worked example with its check digit changed from X to 1.
		const badVin = await newClient().action(DEMO_FORM, validForm({ vin: '1M8GDM9A1KP042788' }));
		expect(badVin.status).toBe(400);
		expect(String((badVin.data?.errors as Record<string, string>).vin)).toMatch(/check digit/);
		const badAnswer = await newClient().action(DEMO_FORM, validForm({ gauge: 'boiling' }));
		expect(badAnswer.status).toBe(400);
		expect((await intakeCases()).length).toBe(before);
	});

	it('thanks a robot that fills the honeypot and writes nothing', async () => {
		const before = (await intakeCases()).length;
		const res = await newClient().action(DEMO_FORM, validForm({ website: 'https://spam.example' }));
		expect(res.type).toBe('redirect');
		expect((await intakeCases()).length).toBe(before);
	});

	it('holds its per-address limit under a burst: ten cases an hour, the rest 429', async () => {
		const { email } = await createShop('Burst Hill Garage');
		const db = openServerDb();
		await db.execute({
			sql: "UPDATE shops SET slug = 'burst-hill' WHERE id = (SELECT shop_id FROM users WHERE email = ?)",
			args: [email]
		});
		db.close();
		const results = await Promise.all(
			Array.from({ length: 16 }, () => newClient().action('/intake/burst-hill', validForm()))
		);
		expect(results.filter((r) => r.type === 'redirect')).toHaveLength(10);
		expect(results.filter((r) => r.status === 429)).toHaveLength(6);
		expect(await intakeCases("slug = 'burst-hill'")).toHaveLength(10);
	});
});
