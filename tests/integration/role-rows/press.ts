/** Rows of the role × route table: a printer profile's press profile (ICC upload and reset). */
import type { Row } from '../role-table';
import { as, members } from '../role-table';
import { statusOf } from '../harness';
import * as printersPage from '../../../src/routes/(app)/teams/[teamId=id]/printers/+page.server';

/** Those who keep printer profiles reach the check (an unknown profile: 404); the rest are refused. */
const keepers = { owner: 404, designer: 404, printer: 404, default: 403, ...members };
const unknown = '00000000-0000-4000-8000-000000000000';

export const rows: Row[] = [
	{
		route: 'action /teams/{teamId}/printers?/icc (unknown profile)',
		run: (w, who) =>
			statusOf(() =>
				printersPage.actions.icc(
					as(w, who, {
						params: { teamId: w.teamId },
						form: { id: unknown, icc: new File([new Uint8Array(200)], 'shop.icc'), conditionIdentifier: 'FOGRA39' }
					})
				)
			),
		expect: keepers
	},
	{
		route: 'action /teams/{teamId}/printers?/iccReset (unknown profile)',
		run: (w, who) => statusOf(() => printersPage.actions.iccReset(as(w, who, { params: { teamId: w.teamId }, form: { id: unknown } }))),
		expect: keepers
	}
];
