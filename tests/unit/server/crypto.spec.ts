import { describe, expect, it } from 'vitest';
import { hashToken, randomToken } from '../../../src/lib/server/auth/crypto';

describe('token hashing', () => {
	it('is SHA-256 in lower-case hex', () => {
		// FIPS 180-2, Appendix B.1: SHA-256("abc").
		expect(hashToken('abc')).toBe(
			'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'
		);
		// FIPS 180-2, Appendix B.2: the 448-bit message.
		expect(hashToken('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe(
			'248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1'
		);
	});

	it('makes tokens of the asked entropy that differ every time', () => {
		const tokens = new Set(Array.from({ length: 100 }, () => randomToken(20)));
		expect(tokens.size).toBe(100);
		// 160 bits in base32 without padding: 32 characters.
		for (const token of tokens) expect(token).toMatch(/^[a-z2-7]{32}$/);
	});
});
