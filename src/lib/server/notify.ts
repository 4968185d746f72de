/** Who gets which e-mail, with links back to the exact page. */
import { config } from './config';
import { sendMail } from './mail';

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
		expires: input.expiresAt.toISOString().slice(0, 10),
		link: link(`/invite/${input.token}`)
	});
}

export async function mailPasswordReset(input: { to: string; name: string; token: string }) {
	await sendMail(input.to, 'password-reset', {
		name: input.name,
		link: link(`/reset/${input.token}`)
	});
}
