import { join } from 'node:path';
import { startServer } from '../support/server';
import { startSmtpCatcher } from '../support/smtp-catcher';

export const E2E_DEMO_PASSWORD = 'e2e-demo-password-42';

/** Starts a real SMTP catcher and the production server; tests read mail from E2E_MAIL_DIR. */
export default async function globalSetup() {
	const port = Number(process.env.E2E_PORT ?? 4391);
	const mailDir = join(process.cwd(), 'tests/.tmp', `mail-e2e-${process.pid}`);
	const smtp = await startSmtpCatcher(mailDir);
	const server = await startServer({
		name: 'e2e',
		port,
		env: {
			SMTP_URL: `smtp://127.0.0.1:${smtp.port}`,
			CAUSEWAY_SEED_DEMO: '1',
			DEMO_PASSWORD: E2E_DEMO_PASSWORD,
			SIGNUP_LIMIT_PER_HOUR: '1000'
		}
	});
	process.env.E2E_MAIL_DIR = mailDir;
	process.env.E2E_DEMO_PASSWORD = E2E_DEMO_PASSWORD;
	return async () => {
		await server.stop();
		await smtp.close();
	};
}
