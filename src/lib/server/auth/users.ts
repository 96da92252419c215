/** People and their shops' accounts: sign-up, sign-in, roles and deactivation. */
import { and, asc, eq, gt, isNull } from 'drizzle-orm';
import { db } from '../db';
import { invites, shops, users, type Role, type User } from '../db/schema';
import { auditInsert } from '../audit';
import { AppError } from '../errors';
import { getConfig } from '../config';
import { baseEditionInsert } from '../editions';
import { generateId } from './crypto';
import { checkPasswordStrength, getDummyHash, hashPassword, verifyPassword } from './password';
import { countSignInAttempt, recordSignInSuccess, signInKeys } from './signin-throttle';
import { invalidateUserSessions } from './session';
import { assignableRoles } from './roles';

export const normaliseEmail = (email: string) => email.trim().toLowerCase();

export async function findUserByEmail(email: string): Promise<User | undefined> {
	const [user] = await db
		.select()
		.from(users)
		.where(eq(users.email, normaliseEmail(email)));
	return user;
}

export const SIGNUP_REFUSED =
	'A new shop cannot be opened with these details. If you already use Causeway, sign in or reset your password.';

/** Creates a shop and its first user, an admin. */
export async function createShop(
	input: { shopName: string; name: string; email: string; isDemo?: boolean } & (
		{ password: string } | { passwordHash: string }
	)
) {
	const email = normaliseEmail(input.email);
	if ('password' in input) {
		const weak = checkPasswordStrength(input.password, email);
		if (weak) throw new AppError('invalid_request', weak, { field: 'password' });
	}
	if (await findUserByEmail(email)) {
		// Worded so that it does not confirm that the address has an account.
		throw new AppError('conflict', SIGNUP_REFUSED);
	}
	const shopId = generateId();
	const userId = generateId();
	const passwordHash =
		'password' in input ? await hashPassword(input.password) : input.passwordHash;
	await db.batch([
		db.insert(shops).values({ id: shopId, name: input.shopName.trim(), isDemo: !!input.isDemo }),
		db.insert(users).values({
			id: userId,
			shopId,
			email,
			name: input.name.trim(),
			role: 'admin',
			passwordHash
		}),
		baseEditionInsert(shopId, userId),
		auditInsert({ shopId, actorUserId: userId, action: 'shop.created', target: shopId }),
		auditInsert({ shopId, actorUserId: userId, action: 'rulebook.published', target: 'edition 1' })
	]);
	return { shopId, userId };
}

/** Adds a user to a shop directly (seeding, accepted invites). */
export function insertUserStatement(input: {
	id: string;
	shopId: string;
	email: string;
	name: string;
	role: Role;
	passwordHash: string;
}) {
	return db.insert(users).values({ ...input, email: normaliseEmail(input.email) });
}

export type SignInResult =
	| { ok: true; user: User }
	| { ok: false; reason: 'invalid' }
	| { ok: false; reason: 'locked'; retryAfterS: number };

/**
 * One generic answer for a wrong e-mail, a wrong password or a deactivated account, and the same
 * argon2 cost in each case, so the form tells an attacker nothing about which accounts exist.
 * The attempt is counted before the hash, so a burst of parallel attempts cannot pass the lock.
 */
export async function signIn(
	emailInput: string,
	password: string,
	ip: string
): Promise<SignInResult> {
	const email = normaliseEmail(emailInput);
	const keys = signInKeys(email, ip);
	const maxAttempts = getConfig().LOGIN_MAX_ATTEMPTS;
	const attempt = await countSignInAttempt(keys, maxAttempts);
	if (!attempt.allowed) return { ok: false, reason: 'locked', retryAfterS: attempt.retryAfterS };

	const user = await findUserByEmail(email);
	const valid = user
		? await verifyPassword(user.passwordHash, password)
		: (await verifyPassword(await getDummyHash(), password), false);
	if (!user || !valid || !user.active) return { ok: false, reason: 'invalid' };
	await recordSignInSuccess(keys, maxAttempts);
	return { ok: true, user };
}

export async function listUsers(shopId: string) {
	return db
		.select({
			id: users.id,
			email: users.email,
			name: users.name,
			role: users.role,
			active: users.active,
			createdAt: users.createdAt
		})
		.from(users)
		.where(eq(users.shopId, shopId))
		.orderBy(asc(users.name));
}

/** Another shop's user is "not found", never "forbidden": ids of other shops are not revealed. */
async function getShopUser(shopId: string, userId: string): Promise<User> {
	const [user] = await db
		.select()
		.from(users)
		.where(and(eq(users.id, userId), eq(users.shopId, shopId)));
	if (!user) throw new AppError('not_found', 'No such user in this shop.');
	return user;
}

type Actor = { id: string; shopId: string; role: Role };

async function assertNotLastAdmin(shopId: string, target: User) {
	if (target.role !== 'admin' || !target.active) return;
	const admins = await db
		.select({ id: users.id })
		.from(users)
		.where(and(eq(users.shopId, shopId), eq(users.role, 'admin'), eq(users.active, true)));
	if (admins.length <= 1) {
		throw new AppError('conflict', 'A shop needs at least one active admin.');
	}
}

/** Changing a role ends the user's sessions, so the new role applies at once. */
export async function changeUserRole(actor: Actor, userId: string, role: Role, ip?: string) {
	const target = await getShopUser(actor.shopId, userId);
	if (
		!assignableRoles(actor.role).includes(role) ||
		(target.role === 'admin' && actor.role !== 'admin')
	) {
		throw new AppError('forbidden', 'Only an admin can give or take the admin role.');
	}
	if (target.role === role) return;
	if (role !== 'admin') await assertNotLastAdmin(actor.shopId, target);
	await db.batch([
		db.update(users).set({ role }).where(eq(users.id, target.id)),
		auditInsert({
			shopId: actor.shopId,
			actorUserId: actor.id,
			action: 'user.role_changed',
			target: target.id,
			detail: { email: target.email, from: target.role, to: role },
			ip
		})
	]);
	await invalidateUserSessions(target.id);
}

export async function setUserActive(actor: Actor, userId: string, active: boolean, ip?: string) {
	const target = await getShopUser(actor.shopId, userId);
	if (target.id === actor.id) {
		throw new AppError('conflict', 'You cannot deactivate your own account.');
	}
	if (target.role === 'admin' && actor.role !== 'admin') {
		throw new AppError('forbidden', 'Only an admin can deactivate an admin.');
	}
	if (target.active === active) return;
	if (!active) await assertNotLastAdmin(actor.shopId, target);
	const now = new Date();
	const change = db
		.update(users)
		.set({ active, deactivatedAt: active ? null : now })
		.where(eq(users.id, target.id));
	const audit = auditInsert({
		shopId: actor.shopId,
		actorUserId: actor.id,
		action: active ? 'user.reactivated' : 'user.deactivated',
		target: target.id,
		detail: { email: target.email },
		ip
	});
	// A deactivated person's pending invitations end with them (and stay ended).
	const endInvites = db
		.update(invites)
		.set({ expiresAt: now })
		.where(
			and(
				eq(invites.invitedBy, target.id),
				eq(invites.shopId, actor.shopId),
				isNull(invites.usedAt),
				gt(invites.expiresAt, now)
			)
		);
	await (active ? db.batch([change, audit]) : db.batch([change, endInvites, audit]));
	if (!active) await invalidateUserSessions(target.id);
}
