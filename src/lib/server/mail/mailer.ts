/** Outgoing mail: SMTP, or .eml files in MAIL_DIR when no SMTP server is set. */
import { mkdir, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import nodemailer, { type Transporter } from 'nodemailer';
import { getConfig } from '../config';

export type MailMessage = { to: string; subject: string; text: string; html?: string };

let transporter: Transporter | undefined;

/**
 * With SMTP_URL, mail goes out over SMTP (a local catcher in tests). Without it, each message is
 * rendered by nodemailer and written to MAIL_DIR as an .eml file that any mail client opens.
 */
function getTransporter(): Transporter {
	const { SMTP_URL } = getConfig();
	transporter ??= SMTP_URL
		? nodemailer.createTransport(SMTP_URL)
		: nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'unix' });
	return transporter;
}

export async function sendMail(message: MailMessage): Promise<void> {
	const config = getConfig();
	const info = await getTransporter().sendMail({ from: config.MAIL_FROM, ...message });
	if (!config.SMTP_URL) {
		const dir = resolve(config.MAIL_DIR);
		await mkdir(dir, { recursive: true });
		const stamp = new Date().toISOString().replace(/[:.]/g, '-');
		const safeTo = message.to.replace(/[^a-z0-9@._-]/gi, '_');
		await writeFile(join(dir, `${stamp}-${safeTo}.eml`), info.message as Buffer);
	}
}

/**
 * Sends after the caller has answered: a person never waits on the mail server, and an answer
 * takes the same time whether or not a message goes out. A failure is logged with the subject
 * only (the text holds one-time links).
 */
export function sendMailInBackground(message: MailMessage): void {
	sendMail(message).catch((error: unknown) =>
		console.error(`sending mail "${message.subject}" failed:`, (error as Error)?.message ?? error)
	);
}
