import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { startServer } from '../support/server';
import { startSmtpCatcher } from '../support/smtp-catcher';

export const DEMO_PASSWORD = 'integration-demo-pass-7';
export const DEMO_API_KEY = 'cw_integrationdemokey0000000001';

/** One real server (production build, real SQLite file, real SMTP catcher) for the whole run. */
export default async function setup(project: TestProject) {
	const mailDir = join(process.cwd(), 'tests/.tmp', `mail-integration-${process.pid}`);
	const smtp = await startSmtpCatcher(mailDir);
	const server = await startServer({
		name: 'integration',
		env: {
			SMTP_URL: `smtp://127.0.0.1:${smtp.port}`,
			CAUSEWAY_SEED_DEMO: '1',
			DEMO_PASSWORD,
			DEMO_API_KEY,
			LOGIN_MAX_ATTEMPTS: '5',
			SIGNUP_LIMIT_PER_HOUR: '1000'
		}
	});
	project.provide('baseUrl', server.baseUrl);
	project.provide('mailDir', mailDir);
	project.provide('dataDir', server.dataDir);
	return async () => {
		await server.stop();
		await smtp.close();
	};
}

declare module 'vitest' {
	export interface ProvidedContext {
		baseUrl: string;
		mailDir: string;
		dataDir: string;
	}
}
