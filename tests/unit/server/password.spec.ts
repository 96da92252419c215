import { describe, expect, it } from 'vitest';
import {
	checkPasswordStrength,
	hashPassword,
	verifyPassword
} from '../../../src/lib/server/auth/password';

describe('passwords', () => {
	it('are hashed with argon2id at the OWASP minimum: m=19456 KiB, t=2, p=1', async () => {
		// OWASP Password Storage Cheat Sheet, argon2id minimum configuration.
		const hash = await hashPassword('coolant-bleed-screw-4');
		expect(hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
		expect(await verifyPassword(hash, 'coolant-bleed-screw-4')).toBe(true);
		expect(await verifyPassword(hash, 'coolant-bleed-screw-5')).toBe(false);
	});

	it('treats a malformed stored hash as a failed check, not a crash', async () => {
		expect(await verifyPassword('not-a-hash', 'anything')).toBe(false);
	});

	it('follow ASVS 5.0 §6.2: 8 characters or more, no composition rules, common ones refused', () => {
		expect(checkPasswordStrength('short7!')).toMatch(/at least 8/);
		expect(checkPasswordStrength('password')).toMatch(/most common/);
		expect(checkPasswordStrength('qwerty123')).toMatch(/most common/);
		expect(checkPasswordStrength('aaaaaaaaaa')).toMatch(/most common/);
		expect(checkPasswordStrength('all lower case words here')).toBeNull();
		expect(checkPasswordStrength('x'.repeat(257))).toMatch(/at most 256/);
	});

	it('refuses a password built on the e-mail name', () => {
		expect(checkPasswordStrength('rowanhale2026', 'rowanhale@saltmarsh.example')).toMatch(/e-mail/);
	});
});
