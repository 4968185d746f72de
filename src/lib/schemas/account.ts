/** Schemas of accounts, teams and invitations: shared by forms (server and browser) and the API. */
import { z } from 'zod';

export const ROLE_NAMES = ['owner', 'designer', 'artist', 'printer', 'reviewer'] as const;

const email = z.string().trim().toLowerCase().email('Enter a valid e-mail address').max(254);

/** Too common to be allowed, whatever their length. */
const COMMON = new Set(['password123', 'password1234', '1234567890', 'qwertyuiop', 'letmein123']);

export const newPassword = z
	.string()
	.min(10, 'Use at least 10 characters')
	.max(200, 'Use at most 200 characters')
	.refine((p) => !COMMON.has(p.toLowerCase()), 'This password is too common')
	.refine((p) => new Set(p).size >= 5, 'Use more different characters');

export const signInSchema = z.strictObject({
	email,
	password: z.string().min(1, 'Enter your password').max(200)
});

export const signUpSchema = z
	.strictObject({
		name: z.string().trim().min(1, 'Enter your name').max(80),
		email,
		password: newPassword
	})
	.refine((v) => !v.password.toLowerCase().includes(v.email.split('@')[0]), {
		message: 'The password must not contain your e-mail name',
		path: ['password']
	});

export const forgotSchema = z.strictObject({ email });

export const passwordChangeSchema = z.strictObject({
	current: z.string().min(1, 'Enter your current password').max(200),
	password: newPassword
});

export const resetSchema = z.strictObject({ token: z.string().min(10), password: newPassword });

export const teamSchema = z.strictObject({ name: z.string().trim().min(1, 'Name the team').max(80) });

export const inviteSchema = z.strictObject({
	email,
	role: z.enum(ROLE_NAMES)
});

export const roleChangeSchema = z.strictObject({ role: z.enum(ROLE_NAMES) });

export const tokenSchema = z.strictObject({
	name: z.string().trim().min(1, 'Name the token').max(60)
});

export const gameCreateSchema = z.strictObject({
	name: z.string().trim().min(1, 'Name the game').max(80),
	bleedStandard: z.enum(['metric', 'us']).default('metric'),
	defaultCardSize: z.enum(['poker', 'bridge', 'mini', 'tarot', 'square']).default('poker')
});
