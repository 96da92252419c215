// The invented demo shop, its users and vehicles, seeded on start where the database is empty.
import { count } from 'drizzle-orm';
import { db } from './db';
import { shops, type Role } from './db/schema';
import { auditInsert } from './audit';
import { apiKeyInsert, generateApiKey } from './auth/api-keys';
import { generateId } from './auth/crypto';
import { hashPassword } from './auth/password';
import { insertUserStatement } from './auth/users';
import { DEMO_PASSWORD_LOCAL_DEFAULT, getConfig, isProduction } from './config';
import { baseEditionInsert, getPublishedEdition } from './editions';
import { appendEvent, openCase, type OpenCase } from './cases';

/** The invented demo shop: one user per role. */
export const DEMO_SHOP_NAME = 'Saltmarsh Lane Garage';
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
	{ email: 'tech@saltmarsh.example', name: 'Rowan Hale', role: 'technician' },
	{ email: 'lead@saltmarsh.example', name: 'Ines Marlow', role: 'lead' },
	{ email: 'manager@saltmarsh.example', name: 'Tomas Brenner', role: 'manager' },
	{ email: 'admin@saltmarsh.example', name: 'Petra Quill', role: 'admin' }
];

/** The demo shop's hosted intake form is at /intake/saltmarsh-lane. */
export const DEMO_SHOP_SLUG = 'saltmarsh-lane';

/** Invented vehicles and complaints (VIN check digits computed per 49 CFR 565). */
const DEMO_CASES: (OpenCase & { by: number | null })[] = [
	{
		by: null,
		status: 'waiting',
		source: 'intake-form',
		vehicle: {
			vin: 'SLG4MRV14FL000731',
			plate: 'SL15 MRV',
			year: 2015,
			make: 'Tollard',
			model: 'Marsh Van'
		},
		odometer: { value: 148200, unit: 'km' },
		complaint: 'The needle climbs when I sit in traffic and the fan never seems to come on.',
		contact: { name: 'Ada Fenwick', email: 'ada.fenwick@mail.example' },
		observations: { temp_gauge: 'high_at_idle' },
		unknown: []
	},
	{
		by: null,
		status: 'waiting',
		source: 'api',
		vehicle: { vin: 'SLG2EST26BL004412', year: 2011, make: 'Corvane', model: 'Estuary' },
		odometer: { value: 121400, unit: 'mi' },
		complaint:
			'I keep topping up the coolant, there is a sweet smell inside and the windows fog up.',
		contact: { name: 'Milo Strand', phone: '+44 1632 960 118' },
		observations: {},
		unknown: []
	},
	{
		by: 0,
		status: 'open',
		source: 'bay',
		vehicle: {
			vin: 'SLG7HFN37JL010986',
			plate: 'HF18 FEN',
			year: 2018,
			make: 'Harrow',
			model: 'Fen 1.4'
		},
		odometer: { value: 96300, unit: 'km' },
		complaint: 'White smoke after a cold start and the tank is low every morning.',
		observations: { coolant_level: 'low', level_drops_between_checks: true },
		unknown: []
	},
	{
		by: 1,
		status: 'open',
		source: 'bay',
		vehicle: { plate: 'FLEET 27', year: 2016, make: 'Tollard', model: 'Marsh Van' },
		odometer: { value: 203900, unit: 'km' },
		complaint: 'Heater blows cold at idle since the coolant was changed last week.',
		observations: { recent_coolant_service: true, heater_output: 'cold_at_idle' },
		unknown: []
	}
];

async function seedDemoCases(shopId: string, userIds: string[]) {
	const edition = await getPublishedEdition(shopId);
	for (const { by, ...spec } of DEMO_CASES) {
		const actor = { shopId, userId: by === null ? null : userIds[by], apiKeyId: null };
		const caseId = await openCase(actor, edition, spec);
		if (spec.status === 'open' && actor.userId) {
			await appendEvent(actor, caseId, {
				id: `demo-${caseId}`,
				kind: 'note',
				payload: { text: 'Customer waiting in reception.' }
			});
		}
	}
}

/**
 * Seeds the demo shop into an empty database when CAUSEWAY_SEED_DEMO is set (npm start sets it).
 * Refuses under NODE_ENV=production unless CAUSEWAY_ALLOW_DEMO_IN_PRODUCTION is set as well.
 */
export async function seedOnStart(log: (line: string) => void = console.log) {
	const config = getConfig();
	if (!config.CAUSEWAY_SEED_DEMO) return { seeded: false as const };
	const [{ shopCount }] = await db.select({ shopCount: count() }).from(shops);
	if (shopCount > 0) return { seeded: false as const };
	if (isProduction() && !config.CAUSEWAY_ALLOW_DEMO_IN_PRODUCTION) {
		log(
			'Causeway: not seeding demo users because NODE_ENV=production. ' +
				'Set CAUSEWAY_ALLOW_DEMO_IN_PRODUCTION=1 to seed them anyway.'
		);
		return { seeded: false as const };
	}
	const password =
		config.DEMO_PASSWORD ?? (isProduction() ? undefined : DEMO_PASSWORD_LOCAL_DEFAULT);
	if (!password) {
		throw new Error(
			'Causeway cannot start: DEMO_PASSWORD must be set to seed demo users in production'
		);
	}
	const apiKey = config.DEMO_API_KEY ?? generateApiKey();
	const shopId = generateId();
	const passwordHash = await hashPassword(password);
	const userIds = DEMO_USERS.map(() => generateId());
	await db.batch([
		db
			.insert(shops)
			.values({ id: shopId, name: DEMO_SHOP_NAME, slug: DEMO_SHOP_SLUG, isDemo: true }),
		...DEMO_USERS.map((u, i) =>
			insertUserStatement({ ...u, id: userIds[i], shopId, passwordHash })
		),
		baseEditionInsert(shopId, userIds[3]),
		apiKeyInsert({ shopId, name: 'Demo intake form', key: apiKey, createdBy: userIds[3] }),
		auditInsert({ shopId, actorUserId: null, action: 'shop.seeded', target: shopId })
	]);
	await seedDemoCases(shopId, userIds);
	log(`Causeway: seeded the demo shop "${DEMO_SHOP_NAME}".`);
	log(
		`  Sign in as ${DEMO_USERS.map((u) => u.email).join(', ')} with ` +
			(config.DEMO_PASSWORD
				? 'the password in DEMO_PASSWORD.'
				: `the local-only password "${password}".`)
	);
	log(
		config.DEMO_API_KEY
			? '  Intake API key: the value of DEMO_API_KEY.'
			: `  Intake API key (shown once): ${apiKey}`
	);
	return { seeded: true as const, shopId };
}
