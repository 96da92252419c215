import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';

/**
 * A real SMTP server on loopback that accepts every message and writes it to `dir` as .eml, so
 * tests in other processes can read what the app sent.
 */
export async function startSmtpCatcher(
	dir: string
): Promise<{ port: number; close: () => Promise<void> }> {
	mkdirSync(dir, { recursive: true });
	let n = 0;
	const server = new SMTPServer({
		authOptional: true,
		disabledCommands: ['STARTTLS'],
		logger: false,
		onData(stream, session, callback) {
			const chunks: Buffer[] = [];
			stream.on('data', (c: Buffer) => chunks.push(c));
			stream.on('end', () => {
				const to = session.envelope.rcptTo.map((r) => r.address).join(',');
				writeFileSync(join(dir, `${Date.now()}-${++n}-${to}.eml`), Buffer.concat(chunks));
				callback();
			});
		}
	});
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	const address = server.server.address();
	const port = typeof address === 'object' && address ? address.port : 0;
	return { port, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}

/** Undoes quoted-printable soft breaks and escapes so links read whole. */
function decodeQuotedPrintable(text: string): string {
	return text
		.replace(/=\r?\n/g, '')
		.replace(/=([0-9A-F]{2})/g, (_, hex: string) => String.fromCharCode(parseInt(hex, 16)));
}

export function readMail(dir: string, to: string): string[] {
	// Mail goes out after the answer: the folder may not exist yet.
	if (!existsSync(dir)) return [];
	return readdirSync(dir)
		.filter((f) => f.endsWith(`-${to.toLowerCase()}.eml`))
		.sort()
		.map((f) => decodeQuotedPrintable(readFileSync(join(dir, f), 'utf8')));
}

/** Waits for the newest message to `to` that contains a link under `path`, and returns the link. */
export async function waitForLink(dir: string, to: string, path: string, timeoutMs = 10_000) {
	const pattern = new RegExp(`https?://[^\\s"<>]+${path}[^\\s"<>]+`);
	const started = Date.now();
	while (Date.now() - started < timeoutMs) {
		const messages = readMail(dir, to);
		const link = messages.at(-1)?.match(pattern)?.[0];
		if (link) return link;
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no mail to ${to} with a ${path} link within ${timeoutMs} ms`);
}
