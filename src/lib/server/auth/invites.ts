import { and, desc, eq, gt, isNull } from 'drizzle-orm';
import { db } from '../db';
import { invites, shops, users, type Role } from '../db/schema';
import { auditInsert } from '../audit';
import { AppError } from '../errors';
import { sendMail } from '../mail/mailer';
import { inviteMessage } from '../mail/templates';
import { generateId, hashToken, randomToken } from './crypto';
import { checkPasswordStrength, hashPassword } from './password';
import { assignableRoles, ROLE_LABELS } from './roles';
import { findUserByEmail, normaliseEmail } from './users';

export const INVITE_TTL_HOURS = 72;

type Actor = { id: string; shopId: string; role: Role; name: string };

/** Sends a one-time link; the token exists only in the e-mail, its hash in the database. */
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
	if (await findUserByEmail(email)) {
		throw new AppError('conflict', 'That e-mail address already has an account.', {
			field: 'email'
		});
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
	await sendMail(
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
		.where(
			and(eq(invites.shopId, shopId), isNull(invites.usedAt), gt(invites.expiresAt, new Date()))
		)
		.orderBy(desc(invites.createdAt));
}

/** The invite behind a link, or null when it is unknown, used or expired (one answer for all). */
export async function findUsableInvite(token: string) {
	const [row] = await db
		.select({ invite: invites, shopName: shops.name })
		.from(invites)
		.innerJoin(shops, eq(shops.id, invites.shopId))
		.where(eq(invites.tokenHash, hashToken(token)));
	if (!row || row.invite.usedAt || row.invite.expiresAt.getTime() <= Date.now()) return null;
	return row;
}

export async function acceptInvite(token: string, input: { name: string; password: string }) {
	const row = await findUsableInvite(token);
	if (!row) {
		throw new AppError('not_found', 'This invitation link has expired or was already used.');
	}
	const { invite } = row;
	const weak = checkPasswordStrength(input.password, invite.email);
	if (weak) throw new AppError('invalid_request', weak, { field: 'password' });
	if (await findUserByEmail(invite.email)) {
		throw new AppError('conflict', 'That e-mail address already has an account.');
	}
	const userId = generateId();
	const passwordHash = await hashPassword(input.password);
	// The usedAt guard makes a second, concurrent use of the same link change nothing.
	const [claimed] = await db
		.update(invites)
		.set({ usedAt: new Date() })
		.where(and(eq(invites.id, invite.id), isNull(invites.usedAt)))
		.returning({ id: invites.id });
	if (!claimed) {
		throw new AppError('not_found', 'This invitation link has expired or was already used.');
	}
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
