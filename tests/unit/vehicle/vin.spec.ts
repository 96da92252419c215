import { describe, expect, it } from 'vitest';
import { computeVinCheckDigit, normaliseVin, validateVin } from '../../../src/lib/vehicle/vin';

describe('validateVin', () => {
	it('accepts the worked example of 49 CFR 565, whose check digit is X', () => {
		// 49 CFR Part 565 worked example: 1M8GDM9AXKP042788, check digit X.
		// Products computed here: 8+28+48+35+16+12+18+10+0+18+56+0+24+10+28+24+16 = 351; 351 mod 11 = 10 → X.
		expect(computeVinCheckDigit('1M8GDM9AXKP042788')).toBe('X');
		expect(validateVin('1M8GDM9AXKP042788')).toEqual({ ok: true });
	});

	it.each([
		// Invented VINs; check digits worked by hand with the 49 CFR 565 values and weights.
		['11111111111111111', '1'], // 1 × (8+7+6+5+4+3+2+10+0+9+8+7+6+5+4+3+2) = 89; 89 mod 11 = 1
		['2CWAB12C6DX123456', '6'], // 16+21+36+5+8+3+4+30+0+36+56+7+12+15+16+15+12 = 292; mod 11 = 6
		['5TEST00Y0RZ987654', '0'], // 40+21+30+10+12+0+0+80+0+81+72+63+48+35+24+15+8 = 539; mod 11 = 0
		['4BAYW52KXLM000008', 'X'] // 32+14+6+40+24+15+4+20+0+27+32+0+0+0+0+0+16 = 230; mod 11 = 10 → X
	])('accepts the invented VIN %s with check digit %s', (vin, digit) => {
		expect(computeVinCheckDigit(vin)).toBe(digit);
		expect(validateVin(vin)).toEqual({ ok: true });
	});

	it('rejects a VIN whose check digit is wrong and says which digit it should be', () => {
		const result = validateVin('1M8GDM9A1KP042788');
		expect(result.ok).toBe(false);
		expect(!result.ok && result.reason).toContain('should be "X"');
	});

	it('accepts a change of position 10 in the worked example only to a character of the same value', () => {
		// Position 10 has weight 9, coprime with 11, so only K's equals keep the sum: K, B and S
		// transliterate to 2 (49 CFR 565 table), and the digit 2 is 2.
		const sameValue = new Set(['2', 'B', 'K', 'S']);
		for (const replacement of '0123456789ABCDEFGHJKLMNPRSTUVWXYZ') {
			const vin = `1M8GDM9AX${replacement}P042788`;
			expect(validateVin(vin).ok, vin).toBe(sameValue.has(replacement));
		}
	});

	it('rejects the letters I, O and Q', () => {
		for (const letter of ['I', 'O', 'Q']) {
			const result = validateVin(`1M8GDM9AXKP0427${letter}8`);
			expect(result).toMatchObject({ ok: false });
			expect(!result.ok && result.reason).toContain('I, O or Q');
		}
	});

	it('rejects a VIN that is not 17 characters long', () => {
		expect(validateVin('1M8GDM9AXKP04278')).toMatchObject({ ok: false });
		expect(validateVin('1M8GDM9AXKP0427888')).toMatchObject({ ok: false });
		expect(validateVin('')).toMatchObject({ ok: false });
	});

	it('rejects lower-case letters and punctuation until normalised', () => {
		expect(validateVin('1m8gdm9axkp042788')).toMatchObject({ ok: false });
		expect(validateVin('1M8GDM9AXKP04278-')).toMatchObject({ ok: false });
		expect(validateVin(normaliseVin(' 1m8gdm9axkp042788 '))).toEqual({ ok: true });
	});
});
