/** Rows of the role × route table: account sessions and password change. */
import { randomUUID } from 'node:crypto';
import type { Row } from '../role-table';
import { as, signedIn } from '../role-table';
import { statusOf } from '../harness';
import * as accountPage from '../../../src/routes/(app)/account/+page.server';

export const rows: Row[] = [
	{
		route: 'action /account?/endSession (someone else’s or unknown id)',
		run: (w, who) => statusOf(() => accountPage.actions.endSession(as(w, who, { form: { id: randomUUID() } }))),
		expect: { default: 404, ...signedIn }
	},
	{
		route: 'action /account?/endOtherSessions',
		run: (w, who) => statusOf(() => accountPage.actions.endOtherSessions(as(w, who, { form: {} }))),
		expect: { default: 200, ...signedIn }
	},
	{
		route: 'action /account?/changePassword (wrong current password)',
		run: (w, who) =>
			statusOf(() => accountPage.actions.changePassword(as(w, who, { form: { current: 'not-the-password', password: 'a-new-long-secret' } }))),
		expect: { default: 400, ...signedIn }
	}
];
