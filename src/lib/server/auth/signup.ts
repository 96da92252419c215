// Opening a new shop by e-mail: the form answers alike for every address, the link creates the shop.
import { and, eq, gt, isNull } from 'drizzle-orm';
import { db } from '../db';
import { signupRequests } from '../db/schema';
import { AppError } from '../errors';
import { sendMail } from '../mail/mailer';
import { signupExistingAccountMessage, signupMessage } from '../mail/templates';
import { generateId, hashToken, randomToken } from './crypto';
import { checkPasswordStrength, hashPassword } from './password';
import { createShop, findUserByEmail, normaliseEmail } from './users';

export const SIGNUP_TTL_HOURS = 24;

export type SignUpInput = { shopName: string; name: string; email: string; password: string };

/**
 * Checks what can be checked without looking the address up (so the answer is the same for
 * every address), then returns at once; the look-up, the slow hash, the write and the mail happen
 * after the answer. A new address gets a link that creates the shop; an address that already has
 * an account gets a note saying so, and nothing is created.
 */
export function startSignUp(input: SignUpInput, baseUrl: string): void {
	const email = normaliseEmail(input.email);
	const weak = checkPasswordStrength(input.password, email);
	if (weak) throw new AppError('invalid_request', weak, { field: 'password' });
	requestSignUp({ ...input, email }, baseUrl).catch((error: unknown) =>
		console.error('sign-up request failed', error)
	);
}

async function requestSignUp(input: SignUpInput, baseUrl: string) {
	if (await findUserByEmail(input.email)) {
		await sendMail(signupExistingAccountMessage({ to: input.email, baseUrl }));
		return;
	}
	const token = randomToken(20);
	await db.insert(signupRequests).values({
		id: generateId(),
		email: input.email,
		shopName: input.shopName.trim(),
		name: input.name.trim(),
		passwordHash: await hashPassword(input.password),
		tokenHash: hashToken(token),
		expiresAt: new Date(Date.now() + SIGNUP_TTL_HOURS * 3_600_000)
	});
	await sendMail(
		signupMessage({
			to: input.email,
			shopName: input.shopName.trim(),
			link: `${baseUrl}/signup/${token}`,
			expiresHours: SIGNUP_TTL_HOURS
		})
	);
}

export async function findUsableSignUp(token: string) {
	const [row] = await db
		.select()
		.from(signupRequests)
		.where(
			and(
				eq(signupRequests.tokenHash, hashToken(token)),
				isNull(signupRequests.usedAt),
				gt(signupRequests.expiresAt, new Date())
			)
		);
	return row ?? null;
}

/** Creates the shop of an open link (once: the link is marked used first) and its admin. */
export async function completeSignUp(token: string) {
	const row = await findUsableSignUp(token);
	if (!row) throw new AppError('not_found', 'This link has expired or was already used.');
	const claimed = await db
		.update(signupRequests)
		.set({ usedAt: new Date() })
		.where(and(eq(signupRequests.id, row.id), isNull(signupRequests.usedAt)))
		.returning({ id: signupRequests.id });
	if (claimed.length === 0) throw new AppError('not_found', 'This link was already used.');
	return createShop({
		shopName: row.shopName,
		name: row.name,
		email: row.email,
		passwordHash: row.passwordHash
	});
}
