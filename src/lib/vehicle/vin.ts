// Vehicle identification number check per 49 CFR Part 565 (17 characters, check digit in
// position 9 computed from transliterated values and position weights, modulus 11).

export const VIN_LENGTH = 17;
const CHECK_DIGIT_INDEX = 8;
const POSITION_WEIGHTS = [8, 7, 6, 5, 4, 3, 2, 10, 0, 9, 8, 7, 6, 5, 4, 3, 2];
const LETTER_VALUES: Record<string, number> = {
	A: 1,
	B: 2,
	C: 3,
	D: 4,
	E: 5,
	F: 6,
	G: 7,
	H: 8,
	J: 1,
	K: 2,
	L: 3,
	M: 4,
	N: 5,
	P: 7,
	R: 9,
	S: 2,
	T: 3,
	U: 4,
	V: 5,
	W: 6,
	X: 7,
	Y: 8,
	Z: 9
};

export type VinCheck = { ok: true } | { ok: false; reason: string };

/** Upper-case and trimmed, the form a VIN is checked and stored in. */
export function normaliseVin(vin: string): string {
	return vin.trim().toUpperCase();
}

function transliterate(character: string): number | null {
	if (character >= '0' && character <= '9') return Number(character);
	return LETTER_VALUES[character] ?? null;
}

/** The check digit ('0'–'9' or 'X') a 17-character VIN must carry, or null if it has a bad character. */
export function computeVinCheckDigit(vin: string): string | null {
	if (vin.length !== VIN_LENGTH) return null;
	let sum = 0;
	for (let index = 0; index < VIN_LENGTH; index++) {
		const value = transliterate(vin[index]);
		if (value === null) return null;
		sum += value * POSITION_WEIGHTS[index];
	}
	const remainder = sum % 11;
	return remainder === 10 ? 'X' : String(remainder);
}

/** Checks an upper-case VIN (see normaliseVin): length, characters, check digit. */
export function validateVin(vin: string): VinCheck {
	if (vin.length !== VIN_LENGTH) {
		return { ok: false, reason: `a VIN has ${VIN_LENGTH} characters; this one has ${vin.length}` };
	}
	const forbidden = vin.match(/[IOQ]/);
	if (forbidden) {
		return { ok: false, reason: `a VIN never contains I, O or Q (found "${forbidden[0]}")` };
	}
	const invalid = vin.match(/[^0-9A-HJ-NPR-Z]/);
	if (invalid) {
		return {
			ok: false,
			reason: `"${invalid[0]}" is not allowed in a VIN (digits and capital letters only)`
		};
	}
	const expected = computeVinCheckDigit(vin);
	if (expected === null) return { ok: false, reason: 'the VIN has a character without a value' };
	const actual = vin[CHECK_DIGIT_INDEX];
	if (actual !== expected) {
		return {
			ok: false,
			reason: `check digit (9th character) is "${actual}" but should be "${expected}"`
		};
	}
	return { ok: true };
}
