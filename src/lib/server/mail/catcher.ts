/**
 * A local SMTP server that catches every message in development, demo and tests, so no mail
 * leaves the machine. The app sends to it through nodemailer exactly as it would to a real server.
 */
import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';
import type { AddressInfo } from 'node:net';

export interface CaughtMessage {
	from: string;
	to: string;
	subject: string;
	text: string;
}

function addresses(a: AddressObject | AddressObject[] | undefined): string {
	if (!a) return '';
	return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(', ');
}

export async function startCatcher(
	onMessage: (m: CaughtMessage) => Promise<void>
): Promise<{ port: number; stop: () => Promise<void> }> {
	const server = new SMTPServer({
		authOptional: true,
		disabledCommands: ['AUTH', 'STARTTLS'],
		logger: false,
		size: 5 * 1024 * 1024,
		onData(stream, _session, done) {
			simpleParser(stream)
				.then((parsed) =>
					onMessage({
						from: addresses(parsed.from),
						to: addresses(parsed.to),
						subject: parsed.subject ?? '',
						text: parsed.text ?? ''
					})
				)
				.then(() => done(), done);
		}
	});
	await new Promise<void>((ok, fail) => {
		server.once('error', fail);
		server.listen(0, '127.0.0.1', () => ok());
	});
	const port = (server.server.address() as AddressInfo).port;
	return { port, stop: () => new Promise<void>((ok) => server.close(() => ok())) };
}
