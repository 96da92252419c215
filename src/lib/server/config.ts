// Server configuration: every environment setting, parsed and checked once.
import { z } from 'zod';

/**
 * Every setting the server reads, parsed once at start-up. A missing or malformed value stops
 * the server with a message that names the variable.
 */
const flag = z
	.enum(['0', '1', 'true', 'false', 'yes', 'no', ''])
	.optional()
	.transform((v) => v === '1' || v === 'true' || v === 'yes');

const positiveInt = (fallback: number) =>
	z.coerce
		.number({ error: 'must be a positive whole number' })
		.int('must be a positive whole number')
		.positive('must be a positive whole number')
		.optional()
		.default(fallback);

export const configSchema = z.object({
	NODE_ENV: z.string().optional().default('development'),
	DATABASE_URL: z
		.string()
		.regex(/^(file:|libsql:|https?:|wss?:)/, 'must start with file:, libsql:, http(s): or ws(s):')
		.optional()
		.default('file:data/causeway.db'),
	DATABASE_AUTH_TOKEN: z.string().optional(),
	MIGRATIONS_DIR: z.string().optional().default('drizzle'),
	RULES_DIR: z.string().optional().default('rules'),
	ORIGIN: z.url().optional(),
	SMTP_URL: z
		.string()
		.regex(/^smtps?:\/\//, 'must look like smtp://host:port')
		.optional(),
	MAIL_FROM: z.string().optional().default('Causeway <no-reply@causeway.invalid>'),
	MAIL_DIR: z.string().optional().default('data/mail'),
	CAUSEWAY_SEED_DEMO: flag,
	CAUSEWAY_ALLOW_DEMO_IN_PRODUCTION: flag,
	DEMO_PASSWORD: z.string().min(8, 'must be at least 8 characters').optional(),
	DEMO_API_KEY: z
		.string()
		.regex(/^cw_[A-Za-z0-9_-]{16,}$/, 'must look like cw_ followed by at least 16 characters')
		.optional(),
	API_RATE_LIMIT_PER_MINUTE: positiveInt(600),
	API_IP_RATE_LIMIT_PER_MINUTE: positiveInt(1200),
	/** How often each server adds its API hits to the shared counters in the database. */
	RATE_LIMIT_SYNC_MS: positiveInt(1000),
	LOGIN_MAX_ATTEMPTS: positiveInt(5),
	SIGNUP_LIMIT_PER_HOUR: positiveInt(10)
});

export type Config = z.infer<typeof configSchema>;

/** Documented local-only default for the demo users; never used when NODE_ENV=production. */
export const DEMO_PASSWORD_LOCAL_DEFAULT = 'causeway-demo-2026';

export function parseConfig(env: Record<string, string | undefined>): Config {
	const result = configSchema.safeParse(env);
	if (!result.success) {
		const lines = result.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
		throw new Error(`Causeway cannot start: bad setting\n${lines.join('\n')}`);
	}
	return result.data;
}

let current: Config | undefined;

/** The process-wide configuration (read from process.env on first use). */
export function getConfig(): Config {
	current ??= parseConfig(process.env);
	return current;
}

export const isProduction = () => getConfig().NODE_ENV === 'production';
