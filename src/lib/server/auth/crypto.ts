import { sha256 } from '@oslojs/crypto/sha2';
import { encodeBase32LowerCaseNoPadding, encodeHexLowerCase } from '@oslojs/encoding';

/** A random token with `bytes` × 8 bits of entropy, lower-case base32. */
export function randomToken(bytes = 20): string {
	return encodeBase32LowerCaseNoPadding(crypto.getRandomValues(new Uint8Array(bytes)));
}

/** Row ids: 120 random bits, short enough for URLs. */
export const generateId = () => randomToken(15);

/** Tokens are stored only as their SHA-256, so a copy of the database grants nothing. */
export function hashToken(token: string): string {
	return encodeHexLowerCase(sha256(new TextEncoder().encode(token)));
}
