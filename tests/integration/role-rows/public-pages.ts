/** Rows of the role × route table: sign-in pages, invitations and the signed-in layout. */
import type { Row } from '../role-table';
import { as } from '../role-table';
import { statusOf } from '../harness';
import * as appLayout from '../../../src/routes/(app)/+layout.server';
import * as rootLayout from '../../../src/routes/+layout.server';
import * as newTeamPage from '../../../src/routes/(app)/teams/new/+page.server';
import * as signinPage from '../../../src/routes/(auth)/signin/+page.server';
import * as signupPage from '../../../src/routes/(auth)/signup/+page.server';
import * as signoutPage from '../../../src/routes/(auth)/signout/+page.server';
import * as forgotPage from '../../../src/routes/(auth)/forgot/+page.server';
import * as resetPage from '../../../src/routes/(auth)/reset/[token]/+page.server';
import * as invitePage from '../../../src/routes/invite/[token]/+page.server';
import * as openApi from '../../../src/routes/api/v1/openapi.json/+server';

/** Pages for people who are not signed in: someone signed in is sent on (303). */
const signedOut = { default: 303, anonymous: 200 };
/** An empty form is refused the same for everyone. */
const emptyForm = { default: 400 };
const unknownToken = 'no-such-token-0000000000000000000000';

export const rows: Row[] = [
	// The API's description holds no data: anyone may read it.
	{ route: 'GET /api/v1/openapi.json', run: (w, who) => statusOf(() => openApi.GET(as(w, who))), expect: { default: 200 } },
	// Every page's outer layout says only whether someone is signed in and their language for dates.
	{ route: 'load / (layout of every page)', run: (w, who) => statusOf(() => rootLayout.load(as(w, who))), expect: { default: 200 } },
	{ route: 'load / (layout of every signed-in page)', run: (w, who) => statusOf(() => appLayout.load(as(w, who))), expect: { default: 200, anonymous: 303 } },
	{
		route: 'load /teams/new (behind the signed-in layout)',
		run: (w, who) =>
			statusOf(async () => {
				await appLayout.load(as(w, who, { path: '/teams/new' }));
				return newTeamPage.load();
			}),
		expect: { default: 200, anonymous: 303 }
	},
	{ route: 'load /signin', run: (w, who) => statusOf(() => signinPage.load(as(w, who, { path: '/signin' }))), expect: signedOut },
	{ route: 'action /signin (empty form)', run: (w, who) => statusOf(() => signinPage.actions.default(as(w, who, { path: '/signin', form: {} }))), expect: emptyForm },
	{ route: 'load /signup', run: (w, who) => statusOf(() => signupPage.load(as(w, who, { path: '/signup' }))), expect: signedOut },
	{ route: 'action /signup (empty form)', run: (w, who) => statusOf(() => signupPage.actions.default(as(w, who, { path: '/signup', form: {} }))), expect: emptyForm },
	{ route: 'load /signout', run: () => statusOf(() => signoutPage.load()), expect: { default: 303 } },
	{
		route: 'action /signout',
		run: (w, who) => statusOf(() => signoutPage.actions.default(as(w, who, { path: '/signout', form: {} }) as never)),
		// Auth.js answers its own sign-out with 302.
		expect: { default: 302 }
	},
	{ route: 'load /forgot', run: () => statusOf(() => forgotPage.load()), expect: { default: 200 } },
	{ route: 'action /forgot (empty form)', run: (w, who) => statusOf(() => forgotPage.actions.default(as(w, who, { form: {} }))), expect: emptyForm },
	{
		route: 'load /reset/{token}',
		run: (w, who) => statusOf(() => resetPage.load(as(w, who, { params: { token: unknownToken } }))),
		expect: { default: 200 }
	},
	{
		route: 'action /reset/{token} (empty form)',
		run: (w, who) => statusOf(() => resetPage.actions.default(as(w, who, { params: { token: unknownToken }, form: {} }))),
		expect: emptyForm
	},
	{
		route: 'load /invite/{token} (unknown invitation)',
		run: (w, who) => statusOf(() => invitePage.load(as(w, who, { params: { token: unknownToken } }))),
		expect: { default: 404 }
	},
	{
		route: 'action /invite/{token}?/accept (unknown invitation)',
		run: (w, who) => statusOf(() => invitePage.actions.accept(as(w, who, { params: { token: unknownToken } }))),
		expect: { default: 404, anonymous: 401 }
	}
];
