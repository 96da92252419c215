import { count } from 'drizzle-orm';
import { db } from './db';
import { shops, type Role } from './db/schema';
import { auditInsert } from './audit';
import { apiKeyInsert, generateApiKey } from './auth/api-keys';
import { generateId } from './auth/crypto';
import { hashPassword } from './auth/password';
import { insertUserStatement } from './auth/users';
import { DEMO_PASSWORD_LOCAL_DEFAULT, getConfig, isProduction } from './config';
import { baseEditionInsert } from './editions';

/** The invented demo shop: one user per role. */
export const DEMO_SHOP_NAME = 'Saltmarsh Lane Garage';
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
	{ email: 'tech@saltmarsh.example', name: 'Rowan Hale', role: 'technician' },
	{ email: 'lead@saltmarsh.example', name: 'Ines Marlow', role: 'lead' },
	{ email: 'manager@saltmarsh.example', name: 'Tomas Brenner', role: 'manager' },
	{ email: 'admin@saltmarsh.example', name: 'Petra Quill', role: 'admin' }
];

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
		db.insert(shops).values({ id: shopId, name: DEMO_SHOP_NAME, isDemo: true }),
		...DEMO_USERS.map((u, i) =>
			insertUserStatement({ ...u, id: userIds[i], shopId, passwordHash })
		),
		baseEditionInsert(shopId, userIds[3]),
		apiKeyInsert({ shopId, name: 'Demo intake form', key: apiKey, createdBy: userIds[3] }),
		auditInsert({ shopId, actorUserId: null, action: 'shop.seeded', target: shopId })
	]);
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
