/**
 * Caught mail is read by its own recipient only. A self-registered person who makes a team,
 * invites someone and asks a reset for that address must never see the reset link.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, count } from 'drizzle-orm';
import { openWorld, fakeEvent, type World } from './harness';
import { caughtMail } from '$lib/server/db/schema';
import { recipientsOf } from '$lib/server/mail/inbox';
import * as invitationsApi from '../../src/routes/api/v1/teams/[teamId=id]/invitations/+server';
import * as forgotPage from '../../src/routes/(auth)/forgot/+page.server';
import * as mailPage from '../../src/routes/(app)/mail/+page.server';

let w: World;
beforeAll(async () => {
	w = await openWorld();
});
afterAll(async () => w?.close());

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const ev = (who: keyof World['callers'], call: Parameters<typeof fakeEvent>[1] = {}) => fakeEvent(w.callers[who], call) as any;

async function waitForMail(to: string, subject: RegExp) {
	for (let i = 0; i < 100; i++) {
		const n = (await w.db.select().from(caughtMail).where(eq(caughtMail.to, to))).filter((m) => subject.test(m.subject));
		if (n.length) return n;
		await new Promise((r) => setTimeout(r, 50));
	}
	throw new Error(`no mail to ${to}`);
}

type Page = { messages: { to: string; subject: string; text: string }[] };
const mailOf = async (who: keyof World['callers']) => (await mailPage.load(ev(who))) as Page;

describe('caught mail', () => {
	it('a team owner who invited an address never reads that address’s reset link', async () => {
		// The outsider owns a team of their own: they invite the designer, then ask a reset for them.
		const invited = await invitationsApi.POST(
			ev('outsider', { params: { teamId: w.outsiderTeamId }, json: { email: 'designer@paddock.test', role: 'artist' } })
		);
		expect(invited.status).toBe(201);
		await forgotPage.actions.default(ev('anonymous', { form: { email: 'designer@paddock.test' } }));
		const [reset] = await waitForMail('designer@paddock.test', /password/i);
		const link = reset.text.match(/\/reset\/\S+/)![0];

		const attacker = await mailOf('outsider');
		const seen = JSON.stringify(attacker);
		expect(seen).not.toContain(link);
		expect(seen).not.toContain('designer@paddock.test');
		expect(attacker.messages.every((m) => recipientsOf(m.to).includes('outsider@elsewhere.test'))).toBe(true);

		// The recipient reads both messages.
		const own = JSON.stringify(await mailOf('designer'));
		expect(own).toContain(link);
		expect(own).toContain('invites you');
	});

	it('an owner does not read the mail of their own team’s members', async () => {
		await forgotPage.actions.default(ev('anonymous', { form: { email: 'printer@paddock.test' } }));
		const [reset] = await waitForMail('printer@paddock.test', /password/i);
		const link = reset.text.match(/\/reset\/\S+/)![0];
		expect(JSON.stringify(await mailOf('owner'))).not.toContain(link);
		expect(JSON.stringify(await mailOf('printer'))).toContain(link);
	});

	it('addresses in the To header match exactly, not by substring', async () => {
		await w.db.insert(caughtMail).values([
			{ from: 'x', to: 'xowner@paddock.test', subject: 'look-alike', text: 'secret-a' },
			{ from: 'x', to: 'Owner <OWNER@paddock.test>, someone@else.test', subject: 'to both', text: 'secret-b' }
		]);
		const seen = JSON.stringify(await mailOf('owner'));
		expect(seen).not.toContain('secret-a');
		expect(seen).toContain('secret-b');
		expect((await w.db.select({ n: count() }).from(caughtMail))[0].n).toBeGreaterThan(2);
	});

	it('parses display names and lists', () => {
		expect(recipientsOf('Ann Lee <Ann@X.test>, bo@y.test')).toEqual(['ann@x.test', 'bo@y.test']);
	});
});
