/** Invitations into a shop: sending, listing, withdrawing and accepting one-time links. */
import { and, desc, eq, gt, inArray, isNull, or, type SQL } from 'drizzle-orm';
import { db } from '../db';
import { invites, shops, users, type Role } from '../db/schema';
import { auditInsert } from '../audit';
import { AppError } from '../errors';
import { sendMailInBackground } from '../mail/mailer';
import { inviteMessage } from '../mail/templates';
import { generateId, hashToken, randomToken } from './crypto';
import { hitRateLimits } from './form-rate-limit';
import { checkPasswordStrength, hashPassword } from './password';
import { assignableRoles, can, ROLE_LABELS, ROLES } from './roles';
import { findUserByEmail, normaliseEmail } from './users';

export const INVITE_TTL_HOURS = 72;
/** Each invitation sends an e-mail: common practice, no source; a team of 20 fits in an hour. */
export const INVITES_PER_USER_PER_HOUR = 20;
export const INVITES_PER_SHOP_PER_HOUR = 40;

type Actor = { id: string; shopId: string; role: Role; name: string };

const INVALID_LINK = 'This invitation link has expired or was already used.';

/** The roles that may hand out `role` by invitation (users:manage and allowed to assign it). */
const invitersOf = (role: Role) =>
	ROLES.filter((r) => can(r, 'users:manage') && assignableRoles(r).includes(role));

/**
 * An invite works only while it is unused and unexpired and its sender is still active and
 * still allowed to hand out its role: deactivating or demoting the sender ends it.
 */
function usableInvite(now: Date): SQL {
	return and(
		isNull(invites.usedAt),
		gt(invites.expiresAt, now),
		eq(users.active, true),
		eq(users.shopId, invites.shopId),
		or(...ROLES.map((role) => and(eq(invites.role, role), inArray(users.role, invitersOf(role)))))
	)!;
}

/**
 * Sends a one-time link; the token exists only in the e-mail, its hash in the database. Counted
 * per sender and per shop before anything else, so a burst cannot send more than the limit. An
 * address with an account in another shop is invited like any other (the link then says that
 * one address holds one account): answering otherwise would tell any shop who uses Causeway.
 */
export async function inviteUser(
	actor: Actor,
	input: { email: string; role: Role },
	baseUrl: string,
	ip?: string
) {
	const email = normaliseEmail(input.email);
	if (!assignableRoles(actor.role).includes(input.role)) {
		throw new AppError('forbidden', 'Only an admin can invite another admin.', { field: 'role' });
	}
	const limit = await hitRateLimits(
		[
			{ key: `invite:user:${actor.id}`, limit: INVITES_PER_USER_PER_HOUR },
			{ key: `invite:shop:${actor.shopId}`, limit: INVITES_PER_SHOP_PER_HOUR }
		],
		3600
	);
	if (!limit.allowed) {
		throw new AppError('rate_limited', 'Too many invitations in the last hour. Try again later.', {
			retryAfterS: limit.retryAfterS
		});
	}
	const existing = await findUserByEmail(email);
	if (existing?.shopId === actor.shopId) {
		throw new AppError('conflict', 'That person is already in your shop.', { field: 'email' });
	}
	const [shop] = await db.select().from(shops).where(eq(shops.id, actor.shopId));
	const token = randomToken(20);
	const id = generateId();
	await db.batch([
		db.insert(invites).values({
			id,
			shopId: actor.shopId,
			email,
			role: input.role,
			tokenHash: hashToken(token),
			invitedBy: actor.id,
			expiresAt: new Date(Date.now() + INVITE_TTL_HOURS * 3600_000)
		}),
		auditInsert({
			shopId: actor.shopId,
			actorUserId: actor.id,
			action: 'user.invited',
			target: id,
			detail: { email, role: input.role },
			ip
		})
	]);
	sendMailInBackground(
		inviteMessage({
			to: email,
			shopName: shop.name,
			invitedBy: actor.name,
			roleLabel: ROLE_LABELS[input.role],
			link: `${baseUrl}/invite/${token}`,
			expiresHours: INVITE_TTL_HOURS
		})
	);
	return { id };
}

export async function listPendingInvites(shopId: string) {
	return db
		.select({
			id: invites.id,
			email: invites.email,
			role: invites.role,
			expiresAt: invites.expiresAt,
			createdAt: invites.createdAt
		})
		.from(invites)
		.innerJoin(users, eq(users.id, invites.invitedBy))
		.where(and(eq(invites.shopId, shopId), usableInvite(new Date())))
		.orderBy(desc(invites.createdAt));
}

/**
 * Withdraws a pending invite of the caller's shop: its link stops working at once. Another
 * shop's invite is "not found"; a manager cannot withdraw an invitation to be admin.
 */
export async function withdrawInvite(actor: Actor, inviteId: string, ip?: string) {
	const [invite] = await db
		.select()
		.from(invites)
		.where(
			and(
				eq(invites.id, inviteId),
				eq(invites.shopId, actor.shopId),
				isNull(invites.usedAt),
				gt(invites.expiresAt, new Date())
			)
		);
	if (!invite) throw new AppError('not_found', 'No such pending invitation in this shop.');
	if (!assignableRoles(actor.role).includes(invite.role)) {
		throw new AppError('forbidden', 'Only an admin can withdraw an invitation to be admin.');
	}
	await db.batch([
		db
			.update(invites)
			.set({ expiresAt: new Date() })
			.where(and(eq(invites.id, invite.id), isNull(invites.usedAt))),
		auditInsert({
			shopId: actor.shopId,
			actorUserId: actor.id,
			action: 'user.invite_withdrawn',
			target: invite.id,
			detail: { email: invite.email, role: invite.role },
			ip
		})
	]);
}

/** The invite behind a link, or null when it is unknown, used, expired or its sender may no
 * longer invite (one answer for all). */
export async function findUsableInvite(token: string) {
	const [row] = await db
		.select({ invite: invites, shopName: shops.name })
		.from(invites)
		.innerJoin(shops, eq(shops.id, invites.shopId))
		.innerJoin(users, eq(users.id, invites.invitedBy))
		.where(and(eq(invites.tokenHash, hashToken(token)), usableInvite(new Date())));
	return row ?? null;
}

export async function acceptInvite(token: string, input: { name: string; password: string }) {
	const row = await findUsableInvite(token);
	if (!row) throw new AppError('not_found', INVALID_LINK);
	const { invite } = row;
	const weak = checkPasswordStrength(input.password, invite.email);
	if (weak) throw new AppError('invalid_request', weak, { field: 'password' });
	if (await findUserByEmail(invite.email)) {
		throw new AppError(
			'conflict',
			'This address already has a Causeway account, and one address holds one account. Sign in with it, or ask to be invited at another address.'
		);
	}
	const userId = generateId();
	const passwordHash = await hashPassword(input.password);
	// The usedAt guard makes a second, concurrent use of the same link change nothing.
	const [claimed] = await db
		.update(invites)
		.set({ usedAt: new Date() })
		.where(and(eq(invites.id, invite.id), isNull(invites.usedAt)))
		.returning({ id: invites.id });
	if (!claimed) throw new AppError('not_found', INVALID_LINK);
	await db.batch([
		db.insert(users).values({
			id: userId,
			shopId: invite.shopId,
			email: invite.email,
			name: input.name.trim(),
			role: invite.role,
			passwordHash
		}),
		auditInsert({
			shopId: invite.shopId,
			actorUserId: userId,
			action: 'user.joined',
			target: userId,
			detail: { email: invite.email, role: invite.role }
		})
	]);
	const [user] = await db.select().from(users).where(eq(users.id, userId));
	return user;
}
