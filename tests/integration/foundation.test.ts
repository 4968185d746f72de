/**
 * Teams, invitations, sign-in throttling and bad input, through the real modules and routes
 * against an in-memory PGlite.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count, eq } from 'drizzle-orm';
import { openWorld, fakeEvent, statusOf, type World, actorIn } from './harness';
import { actorOf } from '$lib/server/actor';
import { acceptInvitation, changeRole, invite, removeMember } from '$lib/server/teams';
import { NotFound } from '$lib/server/refusals';
import { invitations, users, games, caughtMail, memberships } from '$lib/server/db/schema';
import { signInRefused, recordFailure, MAX_PER_ACCOUNT } from '$lib/server/auth/throttle';
import { createUser, EmailTakenError, startPasswordReset, finishPasswordReset } from '$lib/server/users';
import { verifyPassword } from '$lib/server/auth/passwords';
import * as gamesApi from '../../src/routes/api/v1/teams/[teamId=id]/games/+server';
import * as invitationsApi from '../../src/routes/api/v1/teams/[teamId=id]/invitations/+server';
import * as signupPage from '../../src/routes/(auth)/signup/+page.server';
import * as signinPage from '../../src/routes/(auth)/signin/+page.server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

const rows = async (table: typeof games | typeof users | typeof invitations) =>
	(await w.db.select({ n: count() }).from(table))[0].n;

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ev = (who: keyof World['callers'], call: Parameters<typeof fakeEvent>[1]) => fakeEvent(w.callers[who], call) as any;

async function waitForMail(to: string) {
	for (let i = 0; i < 50; i++) {
		const [m] = await w.db.select().from(caughtMail).where(eq(caughtMail.to, to));
		if (m) return m;
		await new Promise((r) => setTimeout(r, 50));
	}
	throw new Error(`no mail to ${to}`);
}

describe('invitations', () => {
	it('an invitation is mailed, accepted once, and a second use is refused', async () => {
		const res = await invitationsApi.POST(
			ev('owner', { params: { teamId: w.teamId }, json: { email: 'new.artist@studio.test', role: 'artist' } })
		);
		expect(res.status).toBe(201);
		const mail = await waitForMail('new.artist@studio.test');
		expect(mail.subject).toContain('Mossbank Games');
		const token = mail.text.match(/\/invite\/(\S+)/)![1];
		const joiner = await createUser(w.db, { email: 'new.artist@studio.test', name: 'New Artist', password: 'brushes-and-ink' });
		await acceptInvitation(w.db, actorOf(joiner), { token });
		const [m] = await w.db.select().from(memberships).where(eq(memberships.userId, joiner.id));
		expect(m.role).toBe('artist');
		await expect(acceptInvitation(w.db, actorOf(joiner), { token })).rejects.toThrow(/used already/);
	});

	it('an expired invitation is refused with a clear message', async () => {
		const { invitation, token } = await invite(w.db, actorIn(w, 'owner'), { email: 'late@x.test', role: 'reviewer' });
		await w.db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.id, invitation.id));
		const late = await createUser(w.db, { email: 'late@x.test', name: 'Late', password: 'too-late-again' });
		await expect(acceptInvitation(w.db, actorOf(late), { token })).rejects.toThrow(/expired/);
	});

	it('an unknown token and the wrong account are refused', async () => {
		await expect(acceptInvitation(w.db, actorOf(w.callers.artist!), { token: 'inv_nonsense' })).rejects.toBeInstanceOf(NotFound);
		const { token } = await invite(w.db, actorIn(w, 'owner'), { email: 'someone@x.test', role: 'reviewer' });
		await expect(acceptInvitation(w.db, actorOf(w.callers.outsider!), { token })).rejects.toThrow(/sent to someone@x.test/);
	});

	it('inviting a member again answers 409 and writes nothing', async () => {
		const before = await rows(invitations);
		const res = await invitationsApi.POST(
			ev('owner', { params: { teamId: w.teamId }, json: { email: 'designer@paddock.test', role: 'artist' } })
		);
		expect(res.status).toBe(409);
		expect(await rows(invitations)).toBe(before);
	});
});

describe('the last owner', () => {
	it('cannot be demoted or removed', async () => {
		await expect(changeRole(w.db, actorIn(w, 'owner'), { userId: w.callers.owner!.id, role: 'designer' })).rejects.toThrow(/at least one owner/);
		await expect(removeMember(w.db, actorIn(w, 'owner'), { userId: w.callers.owner!.id })).rejects.toThrow(/last owner/);
	});
});

describe('bad input writes nothing', () => {
	it('malformed JSON → 400', async () => {
		const before = await rows(games);
		const res = await gamesApi.POST(
			ev('designer', { params: { teamId: w.teamId }, body: '{"name": ', headers: { 'content-type': 'application/json' } })
		);
		expect(res.status).toBe(400);
		expect((await res.json()).error.code).toBe('malformed_json');
		expect(await rows(games)).toBe(before);
	});

	it('a body failing the schema → 400 with the field', async () => {
		const res = await gamesApi.POST(ev('designer', { params: { teamId: w.teamId }, json: { name: '' } }));
		expect(res.status).toBe(400);
		expect((await res.json()).error.message).toMatch(/name/);
	});

	it('an oversized body → 413', async () => {
		const before = await rows(games);
		const res = await gamesApi.POST(
			ev('designer', { params: { teamId: w.teamId }, json: { name: 'x'.repeat(2 * 1024 * 1024) } })
		);
		expect(res.status).toBe(413);
		expect(await rows(games)).toBe(before);
	});

	it('unknown team id → 404', async () => {
		const res = await gamesApi.GET(ev('designer', { params: { teamId: '00000000-0000-4000-8000-000000000000' } }));
		expect(res.status).toBe(404);
		expect((await res.json()).error.code).toBe('not_found');
	});

	it('duplicate sign-up → 409, no second account', async () => {
		const before = await rows(users);
		const status = await statusOf(() =>
			signupPage.actions.default(ev('anonymous', { form: { name: 'Again', email: 'Designer@Paddock.test', password: 'another-long-pass' } }))
		);
		expect(status).toBe(409);
		expect(await rows(users)).toBe(before);
		await expect(createUser(w.db, { email: 'designer@paddock.test', name: 'x', password: 'whatever-long' })).rejects.toBeInstanceOf(EmailTakenError);
	});

	it('weak password → 400, no account', async () => {
		const before = await rows(users);
		const status = await statusOf(() =>
			signupPage.actions.default(ev('anonymous', { form: { name: 'Weak', email: 'weak@x.test', password: 'short' } }))
		);
		expect(status).toBe(400);
		expect(await rows(users)).toBe(before);
	});
});

describe('sign-in', () => {
	it('a wrong password answers 400 with a message, not a 500', async () => {
		const status = await statusOf(() =>
			signinPage.actions.default(ev('anonymous', { form: { email: 'printer@paddock.test', password: 'not-the-password' } }))
		);
		expect(status).toBe(400);
	});

	it('repeated failures for one account are refused', async () => {
		const email = 'reviewer@paddock.test';
		for (let i = 0; i < MAX_PER_ACCOUNT; i++) await recordFailure(w.db, email, `10.0.0.${i}`);
		expect(await signInRefused(w.db, email, '10.9.9.9')).toBe(true);
		const status = await statusOf(() =>
			signinPage.actions.default(ev('anonymous', { form: { email, password: 'paddock-demo' } }))
		);
		expect(status).toBe(429);
		expect(await signInRefused(w.db, 'artist@paddock.test', '10.9.9.9')).toBe(false);
	});
});

describe('password reset', () => {
	it('works once with its token', async () => {
		const started = (await startPasswordReset(w.db, 'artist@paddock.test'))!;
		expect(await finishPasswordReset(w.db, started.token, 'a-brand-new-secret')).toBe(true);
		expect(await finishPasswordReset(w.db, started.token, 'and-once-more-please')).toBe(false);
		const [u] = await w.db.select().from(users).where(eq(users.email, 'artist@paddock.test'));
		expect(await verifyPassword(u.passwordHash, 'a-brand-new-secret')).toBe(true);
	});
});
