/** Rows of the role × route table: the game settings page and its default press profile. */
import type { Row } from '../role-table';
import { as, g, readers, designers } from '../role-table';
import { statusOf } from '../harness';
import * as settingsPage from '../../../src/routes/(app)/games/[gameId=id]/settings/+page.server';

export const rows: Row[] = [
	{
		route: 'load /games/{gameId}/settings',
		run: (w, who) => statusOf(() => settingsPage.load(as(w, who, { params: g(w) }))),
		// Printers print releases; the game's settings are for those who read the working game.
		expect: { ...readers, default: 200 }
	},
	{
		route: 'action /games/{gameId}/settings?/press (built-in)',
		run: (w, who) => statusOf(() => settingsPage.actions.press(as(w, who, { params: g(w), form: { profile: '' } }))),
		// The product brief: designers (and owners) keep print profiles and the game's print settings.
		expect: { ...designers, default: 200 }
	}
];
