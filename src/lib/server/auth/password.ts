// Passwords: argon2id hashing and verifying, length limits and the strength check.
import { hash, verify } from '@node-rs/argon2';
import { dictionary } from '@zxcvbn-ts/language-common';

/** OWASP Password Storage Cheat Sheet minimum for argon2id: m = 19 MiB, t = 2, p = 1. */
const ARGON2_OPTIONS = {
	algorithm: 2, // argon2id (the const enum is not exported as a value under isolatedModules)
	memoryCost: 19456,
	timeCost: 2,
	parallelism: 1,
	outputLen: 32
} as const;

export const PASSWORD_MIN_LENGTH = 8;
export const PASSWORD_MAX_LENGTH = 256;

const commonPasswords = new Set<string>(dictionary['passwords-common'] as string[]);

export function hashPassword(password: string): Promise<string> {
	return hash(password, ARGON2_OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}

/**
 * ASVS 5.0 §6.2: at least 8 characters, no composition rules, reject the commonly used ones.
 * Returns a message for the person, or null when the password is acceptable.
 */
export function checkPasswordStrength(password: string, email?: string): string | null {
	if (password.length < PASSWORD_MIN_LENGTH) {
		return `Use at least ${PASSWORD_MIN_LENGTH} characters.`;
	}
	if (password.length > PASSWORD_MAX_LENGTH) {
		return `Use at most ${PASSWORD_MAX_LENGTH} characters.`;
	}
	const lower = password.toLowerCase();
	if (commonPasswords.has(lower) || /^(.)\1+$/.test(password)) {
		return 'That password is one of the most common ones. Choose another.';
	}
	const local = email?.split('@')[0]?.toLowerCase();
	if (local && local.length >= 4 && lower.includes(local)) {
		return 'The password must not contain your e-mail name.';
	}
	return null;
}

/** A dummy hash to verify against when the account does not exist: same time, same answer. */
let dummyHash: Promise<string> | undefined;
export function getDummyHash(): Promise<string> {
	dummyHash ??= hashPassword(crypto.randomUUID());
	return dummyHash;
}
