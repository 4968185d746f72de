/** Rows of the role × route table: the card-kind pages, their form actions and the CSV download. */
import { randomUUID, createHash } from 'node:crypto';
import type { Row } from '../role-table';
import { as, g, game, readers, designers, editors } from '../role-table';
import { statusOf, superformJson, type World, actorIn } from '../harness';
import { applyChanges } from '$lib/server/game-store';
import { newKind } from '$lib/game/kind-defaults';
import { cardSize, type Card, type CardKindType } from '$lib/game/model';
import { importBasis } from '../../../src/routes/(app)/games/[gameId=id]/kinds/[kindId]/csv/import-plan';
import * as kindsPage from '../../../src/routes/(app)/games/[gameId=id]/kinds/+page.server';
import * as kindPage from '../../../src/routes/(app)/games/[gameId=id]/kinds/[kindId]/+page.server';
import * as csvPage from '../../../src/routes/(app)/games/[gameId=id]/kinds/[kindId]/csv/+page.server';
import * as galleryPage from '../../../src/routes/(app)/games/[gameId=id]/kinds/[kindId]/gallery/+page.server';
import * as csvRoute from '../../../src/routes/(app)/games/[gameId=id]/kinds/[kindId]/cards.csv/+server';


/** A throw-away movement kind with one card, made by the designer, for a caller to change. */
export async function scratchKind(w: World, type: CardKindType = 'movement') {
	const kind = newKind(
		{ name: `Scratch ${randomUUID().slice(0, 8)}`, type, size: cardSize('poker'), bleed: 'metric', template: type === 'tile' ? 'tile-front' : type },
		`scratch-${randomUUID()}`
	);
	const runner = (await game(w)).runners[0];
	const card: Card = { id: `${kind.id}.c1`, kindId: kind.id, name: 'First', data: { type: 'movement', runnerId: runner.id, steps: 1 }, copies: 1 };
	await applyChanges(w.db, actorIn(w, 'designer'), { changes: [
			{ collection: 'kind', id: kind.id, baseVersion: null, object: kind },
			...(type === 'movement' ? [{ collection: 'card' as const, id: card.id, baseVersion: null, object: card }] : [])
		], action: 'test' });
	const after = await game(w);
	return { kind: after.kinds.find((k) => k.id === kind.id)!, card: after.cards.find((c) => c.id === card.id), runner };
}

/** A `dataType: 'json'` superform as the browser posts it; the page's forms tell theirs apart by id. */
const json = (id: string, data: unknown) => ({ ...superformJson(data), ...(id ? { __superform_id: id } : {}) });
const k = (w: World, kindId: string) => g(w, { kindId });

export const rows: Row[] = [
	{
		route: 'load /games/{gameId}/kinds',
		run: (w, who) => statusOf(() => kindsPage.load(as(w, who, { params: g(w) }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'action /games/{gameId}/kinds?/create',
		run: (w, who) =>
			statusOf(() =>
				kindsPage.actions.create(
					as(w, who, {
						params: g(w),
						form: json('', { name: `Kind by ${who}`, type: 'rogue', size: cardSize('mini'), bleed: 'us', template: 'rogue' })
					})
				)
			),
		expect: { ...editors, default: 403 }
	},
	{
		route: 'load /games/{gameId}/kinds/{kindId}',
		run: (w, who) => statusOf(() => kindPage.load(as(w, who, { params: k(w, 'kd-movement'), path: '/?view=settings' }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'action /games/{gameId}/kinds/{kindId}?/saveKind',
		run: async (w, who) => {
			const { kind } = await scratchKind(w);
			return statusOf(() =>
				kindPage.actions.saveKind(as(w, who, { params: k(w, kind.id), form: json('kind', { ...kind, name: `Renamed by ${who}` }) }))
			);
		},
		expect: { ...designers, default: 403 }
	},
	{
		route: 'action /games/{gameId}/kinds/{kindId}?/deleteKind (with its cards)',
		run: async (w, who) => {
			const { kind } = await scratchKind(w);
			return statusOf(() =>
				kindPage.actions.deleteKind(as(w, who, { params: k(w, kind.id), form: { version: String(kind.version), confirm: 'yes' } }))
			);
		},
		expect: { ...editors, default: 403 }
	},
	{
		route: 'action /games/{gameId}/kinds/{kindId}?/saveCard',
		run: async (w, who) => {
			const { kind, card } = await scratchKind(w);
			return statusOf(() =>
				kindPage.actions.saveCard(as(w, who, { params: k(w, kind.id), form: json('card', { ...card!, copies: 3 }) }))
			);
		},
		expect: { ...designers, default: 403 }
	},
	{
		route: 'action /games/{gameId}/kinds/{kindId}?/deleteCard',
		run: async (w, who) => {
			const { kind, card } = await scratchKind(w);
			return statusOf(() =>
				kindPage.actions.deleteCard(as(w, who, { params: k(w, kind.id), form: { id: card!.id, version: String(card!.version) } }))
			);
		},
		expect: { ...designers, default: 403 }
	},
	{
		route: 'action /games/{gameId}/kinds/{kindId}?/generate',
		run: async (w, who) => {
			const { kind, runner } = await scratchKind(w);
			return statusOf(() =>
				kindPage.actions.generate(
					as(w, who, {
						params: k(w, kind.id),
						form: json('generate', { type: 'movement', runnerIds: [runner.id], steps: [1, 2], copies: 2, replace: true })
					})
				)
			);
		},
		expect: { ...designers, default: 403 }
	},
	{
		route: 'load /games/{gameId}/kinds/{kindId}/csv',
		run: (w, who) => statusOf(() => csvPage.load(as(w, who, { params: k(w, 'kd-wager') }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'action /games/{gameId}/kinds/{kindId}/csv?/preview (writes nothing)',
		run: async (w, who) => {
			const { kind, runner } = await scratchKind(w);
			const csv = `name,copies,runner,steps\nFirst,2,${runner.name},1\n`;
			return statusOf(() => csvPage.actions.preview(as(w, who, { params: k(w, kind.id), form: { csv, removeMissing: 'on' } })));
		},
		expect: { ...designers, default: 403 }
	},
	{
		route: 'action /games/{gameId}/kinds/{kindId}/csv?/apply',
		run: async (w, who) => {
			const { kind, runner } = await scratchKind(w);
			const csv = `name,copies,runner,steps\nFirst,2,${runner.name},1\nSecond,1,${runner.name},2\n`;
			const basis = createHash('sha256').update(importBasis(await game(w), kind)).digest('hex');
			return statusOf(() => csvPage.actions.apply(as(w, who, { params: k(w, kind.id), form: { csv, basis, removeMissing: 'on' } })));
		},
		expect: { ...designers, default: 403 }
	},
	{
		route: 'GET /games/{gameId}/kinds/{kindId}/cards.csv',
		run: (w, who) => statusOf(() => csvRoute.GET(as(w, who, { params: k(w, 'kd-movement') }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'load /games/{gameId}/kinds/{kindId}/gallery',
		run: (w, who) => statusOf(() => galleryPage.load(as(w, who, { params: k(w, 'kd-tile') }))),
		expect: { ...readers, default: 200 }
	}
];
