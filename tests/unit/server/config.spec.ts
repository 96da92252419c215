import { describe, expect, it } from 'vitest';
import { parseConfig } from '../../../src/lib/server/config';

describe('configuration', () => {
	it('has working defaults for a fresh machine', () => {
		const config = parseConfig({});
		expect(config.DATABASE_URL).toBe('file:data/causeway.db');
		expect(config.API_RATE_LIMIT_PER_MINUTE).toBe(600);
		expect(config.RATE_LIMIT_SYNC_MS).toBe(1000);
		expect(config.CAUSEWAY_SEED_DEMO).toBe(false);
	});

	it('stops with a message that names each bad setting', () => {
		let message = '';
		try {
			parseConfig({
				DATABASE_URL: 'postgres://x',
				API_RATE_LIMIT_PER_MINUTE: 'lots',
				DEMO_API_KEY: 'abc'
			});
		} catch (err) {
			message = (err as Error).message;
		}
		expect(message).toContain('DATABASE_URL: must start with file:');
		expect(message).toContain('API_RATE_LIMIT_PER_MINUTE: must be a positive whole number');
		expect(message).toContain('DEMO_API_KEY: must look like cw_');
	});
});
