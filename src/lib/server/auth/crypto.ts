// Random tokens, row ids and token hashes.
import { createHash } from 'node:crypto';
import { encodeBase32LowerCaseNoPadding } from '@oslojs/encoding';

/** A random token with `bytes` × 8 bits of entropy, lower-case base32. */
export function randomToken(bytes = 20): string {
	return encodeBase32LowerCaseNoPadding(crypto.getRandomValues(new Uint8Array(bytes)));
}

/** Row ids: 120 random bits, short enough for URLs. */
export const generateId = () => randomToken(15);

/** Tokens are stored only as their SHA-256 (hex), so a copy of the database grants nothing.
 * Node's native hash: every API call and every page view hashes a token. */
export function hashToken(token: string): string {
	return createHash('sha256').update(token, 'utf8').digest('hex');
}
