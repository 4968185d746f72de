/** Rows of the role × route table: the Art page, its form actions and the upload route. */
import { Jimp } from 'jimp';
import type { Row } from '../role-table';
import { as, g, game, readers, artEditors, editors } from '../role-table';
import { statusOf, superformJson, type Who } from '../harness';
import * as artPage from '../../../src/routes/(app)/games/[gameId=id]/art/+page.server';
import * as uploadApi from '../../../src/routes/api/v1/games/[gameId=id]/art/upload/+server';

/** A tiny PNG of its own colour per call, so every upload is a new file. */
let made = 0;
async function pngFor(who: Who): Promise<File> {
	made += 1;
	const color = ((made * 2654435761) >>> 8) * 256 + 0xff;
	const bytes = await new Jimp({ width: 8, height: 8, color: color >>> 0 }).getBuffer('image/png');
	return new File([new Uint8Array(bytes)], `${who}-${made}.png`);
}

function form(fields: Record<string, string | File>) {
	const fd = new FormData();
	for (const [k, v] of Object.entries(fields)) fd.set(k, v);
	return fd;
}

/** New art arrives with the upload form and opens (303) for those who may change art. */
const uploads = { ...editors, artist: 303 };

export const rows: Row[] = [
	{
		route: 'load /games/{gameId}/art',
		run: (w, who) => statusOf(() => artPage.load(as(w, who, { params: g(w) }))),
		expect: { ...readers, default: 200 }
	},
	{
		route: 'action /games/{gameId}/art?/upload',
		run: async (w, who) =>
			statusOf(async () =>
				artPage.actions.upload(as(w, who, { params: g(w), body: form({ file: await pngFor(who), status: 'sketch', place: '' }) }))
			),
		expect: { ...uploads, default: 403 }
	},
	{
		route: 'action /games/{gameId}/art?/replace',
		run: async (w, who) => {
			const art = (await game(w)).art.find((a) => a.id === 'art-tile-soil')!;
			return statusOf(async () =>
				artPage.actions.replace(
					as(w, who, { params: g(w), body: form({ file: await pngFor(who), artId: art.id, version: String(art.version), status: 'keep' }) })
				)
			);
		},
		expect: { ...artEditors, default: 403 }
	},
	{
		route: 'action /games/{gameId}/art?/save (status, slot)',
		run: async (w, who) => {
			const art = (await game(w)).art.find((a) => a.id === 'art-icon-hz-bootprint')!;
			const data = { id: art.id, status: who === 'artist' ? 'sketch' : 'final', assignment: art.assignment, version: art.version };
			return statusOf(() => artPage.actions.save(as(w, who, { params: g(w), form: { __superform_id: 'placement', ...superformJson(data) } })));
		},
		expect: { ...artEditors, default: 403 }
	},
	{
		route: 'POST /api/v1/games/{gameId}/art/upload',
		run: async (w, who) =>
			statusOf(async () => uploadApi.POST(as(w, who, { method: 'POST', params: g(w), body: form({ file: await pngFor(who) }) }))),
		expect: { ...artEditors, owner: 201, designer: 201, artist: 201, default: 403 }
	}
];
