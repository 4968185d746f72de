/**
 * Sending e-mail: through nodemailer to SMTP_URL when set, otherwise to the local catcher.
 */
import nodemailer, { type Transporter } from 'nodemailer';
import { renderMail } from './templates';

let transport: Transporter | undefined;
let fromAddress = 'Paddock <no-reply@paddock.test>';

export function configureMail(opts: { smtpUrl: string; from: string }) {
	transport = nodemailer.createTransport(opts.smtpUrl);
	fromAddress = opts.from;
}

export async function sendMail(
	to: string | string[],
	template: string,
	values: Record<string, string>
): Promise<void> {
	if (!transport) throw new Error('Mail is not configured');
	const recipients = Array.isArray(to) ? to : [to];
	if (recipients.length === 0) return;
	const { subject, text } = renderMail(template, values);
	await transport.sendMail({ from: fromAddress, to: recipients, subject, text });
}
