/** Password reset: one-time links by e-mail, and setting the new password. */
import { and, eq, isNull } from 'drizzle-orm';
import { db } from '../db';
import { passwordResets, users } from '../db/schema';
import { auditInsert } from '../audit';
import { AppError } from '../errors';
import { sendMail } from '../mail/mailer';
import { passwordResetMessage } from '../mail/templates';
import { generateId, hashToken, randomToken } from './crypto';
import { checkPasswordStrength, hashPassword } from './password';
import { invalidateUserSessions } from './session';
import { findUserByEmail } from './users';

export const RESET_TTL_MINUTES = 60;

/**
 * Sends a reset link when the address belongs to an active account. The caller always shows the
 * same confirmation, so the form does not reveal which addresses have accounts.
 */
async function requestPasswordReset(email: string, baseUrl: string, ip?: string) {
	const user = await findUserByEmail(email);
	if (!user || !user.active) return;
	const token = randomToken(20);
	await db.batch([
		db.insert(passwordResets).values({
			id: generateId(),
			userId: user.id,
			tokenHash: hashToken(token),
			expiresAt: new Date(Date.now() + RESET_TTL_MINUTES * 60_000)
		}),
		auditInsert({
			shopId: user.shopId,
			actorUserId: user.id,
			action: 'user.password_reset_requested',
			target: user.id,
			ip
		})
	]);
	await sendMail(
		passwordResetMessage({
			to: user.email,
			link: `${baseUrl}/reset/${token}`,
			expiresMinutes: RESET_TTL_MINUTES
		})
	);
}

/**
 * Starts the request and returns at once: the look-up, the write and the mail happen after the
 * answer, so a real account and an unknown address answer alike and in the same time.
 * Failures are logged, never shown (the answer has gone).
 */
export function startPasswordReset(email: string, baseUrl: string, ip?: string): void {
	requestPasswordReset(email, baseUrl, ip).catch((error: unknown) =>
		console.error('password reset request failed', error)
	);
}

export async function findUsableReset(token: string) {
	const [row] = await db
		.select({ reset: passwordResets, email: users.email, active: users.active })
		.from(passwordResets)
		.innerJoin(users, eq(users.id, passwordResets.userId))
		.where(eq(passwordResets.tokenHash, hashToken(token)));
	if (!row || !row.active || row.reset.usedAt || row.reset.expiresAt.getTime() <= Date.now()) {
		return null;
	}
	return row;
}

/**
 * Sets the new password and ends every session of the account. Every other open link of the
 * account is cancelled in the same batch: an older link must not undo the new password.
 */
export async function resetPassword(token: string, password: string, ip?: string) {
	const row = await findUsableReset(token);
	if (!row) throw new AppError('not_found', 'This reset link has expired or was already used.');
	const weak = checkPasswordStrength(password, row.email);
	if (weak) throw new AppError('invalid_request', weak, { field: 'password' });
	const passwordHash = await hashPassword(password);
	const [claimed] = await db
		.update(passwordResets)
		.set({ usedAt: new Date() })
		.where(and(eq(passwordResets.id, row.reset.id), isNull(passwordResets.usedAt)))
		.returning({ id: passwordResets.id, userId: passwordResets.userId });
	if (!claimed) throw new AppError('not_found', 'This reset link has expired or was already used.');
	const [user] = await db.select().from(users).where(eq(users.id, claimed.userId));
	await db.batch([
		db.update(users).set({ passwordHash }).where(eq(users.id, user.id)),
		db
			.update(passwordResets)
			.set({ usedAt: new Date() })
			.where(and(eq(passwordResets.userId, user.id), isNull(passwordResets.usedAt))),
		auditInsert({
			shopId: user.shopId,
			actorUserId: user.id,
			action: 'user.password_reset',
			target: user.id,
			ip
		})
	]);
	await invalidateUserSessions(user.id);
	return user;
}
