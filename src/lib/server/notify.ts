/** Who gets which e-mail, with links back to the exact page. */
import { config } from './config';
import { sendMail } from './mail';
import { formatMoment } from '$lib/dates';

const link = (path: string) => new URL(path, config.origin).toString();

export async function mailInvitation(input: {
	to: string;
	inviter: string;
	team: string;
	role: string;
	token: string;
	expiresAt: Date;
}) {
	await sendMail(input.to, 'invitation', {
		inviter: input.inviter,
		team: input.team,
		role: input.role,
		// The reader's zone is unknown in an e-mail: the moment in UTC, saying so.
		expires: formatMoment(input.expiresAt, { locale: 'en-GB', timeZone: 'UTC' }),
		link: link(`/invite/${input.token}`)
	});
}

/**
 * Sends after the answer has gone: the caller does not wait for the mail server, so an answer
 * takes as long whether or not a message was due (and a slow mail server slows no one).
 */
export function sendLater(sending: Promise<unknown>) {
	sending.catch((e) => console.error('Paddock could not send an e-mail:', e));
}

/** To the holder of an address someone tried to sign up with again. */
export async function mailAccountExists(input: { to: string; name: string }) {
	await sendMail(input.to, 'account-exists', { name: input.name, signin: link('/signin'), forgot: link('/forgot') });
}

export async function mailPasswordReset(input: { to: string; name: string; token: string }) {
	await sendMail(input.to, 'password-reset', {
		name: input.name,
		link: link(`/reset/${input.token}`)
	});
}
