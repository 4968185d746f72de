import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireGame } from '$lib/server/http/guard';
import { artVersionsByArt } from '$lib/server/art-uploads';
import { placeAction, replaceAction, uploadAction } from '$lib/server/http/art-uploads';
import { ArtPlacementSchema, ReplaceFormSchema, UploadFormSchema } from '$lib/schemas/art';
import { artPlaces, artPrintChecks, describeAssignment, placeKey } from '$lib/art/placement';
import { MAX_ART_BYTES } from '$lib/art/inspect';
import { MIN_PRINT_DPI } from '$lib/game/art-check';
import type { ArtAssignment, Game } from '$lib/game/model';
import { loadFonts } from '$lib/print/fonts';
import { db } from '$lib/server/runtime';

/** What the page shows of each piece and of each place, from the game (the load's and a placement's answer). */
async function artView(game: Game) {
	const checks = artPrintChecks(game, await loadFonts());
	const art = game.art.map((a) => {
		const check = checks.get(a.id)!;
		const worst = check.worst;
		return {
			...a,
			version: a.version ?? 1,
			place: a.assignment ? describeAssignment(game, a.assignment) : null,
			print: {
				basis: check.basis,
				faces: check.faces,
				note: check.note ?? null,
				vector: a.mime === 'image/svg+xml',
				where: worst ? `${worst.kindName}${worst.cardName ? ` “${worst.cardName}”` : ''}, ${worst.side}` : null,
				slotMm: worst?.slotMm ?? null,
				dpi: worst ? Math.floor(worst.resolution.dpi) : null,
				ok: worst ? worst.resolution.ok : true,
				neededPx: worst?.resolution.neededPx ?? null,
				warnings: worst?.resolution.warnings ?? []
			}
		};
	});

	// The slot picker, grouped; each place says which art holds it now (the first assigned).
	const places: { group: string; options: { key: string; label: string; assignment: ArtAssignment; holder: { id: string; fileName: string } | null }[] }[] = [];
	for (const p of artPlaces(game)) {
		const holder = game.art.find((a) => a.assignment && placeKey(a.assignment) === p.key);
		let group = places.find((g) => g.group === p.group);
		if (!group) places.push((group = { group: p.group, options: [] }));
		group.options.push({ key: p.key, label: p.label, assignment: p.assignment, holder: holder ? { id: holder.id, fileName: holder.fileName } : null });
	}
	return { art, places };
}
export type ArtView = Awaited<ReturnType<typeof artView>>;

/** The game's art, where each piece prints and how sharp, its files over time, and the forms. */
export const load = async ({ locals, params, url }) => {
	const d = await db();
	const { doc: game } = await requireGame(d, locals, params.gameId, 'game.read');
	const versions = await artVersionsByArt(d, params.gameId);
	const view = await artView(game);
	const art = view.art.map((a) => ({
		...a,
		versions: (versions.get(a.id) ?? []).map((v) => ({
			number: v.number,
			sha256: v.sha256,
			fileName: v.fileName,
			createdAt: v.createdAt,
			uploadedBy: v.uploadedBy,
			widthPx: v.widthPx,
			heightPx: v.heightPx,
			dpiX: v.dpiX,
			bytes: v.bytes
		}))
	}));
	const groups = view.places;

	const selected = art.find((a) => a.id === url.searchParams.get('art')) ?? art[0] ?? null;
	const took = url.searchParams.getAll('took').map((id) => game.art.find((a) => a.id === id)?.fileName).filter(Boolean);
	const uploaded =
		selected && url.searchParams.has('uploaded')
			? `Uploaded “${selected.fileName}”.` +
				(took.length ? ` It takes over the slot; ${took.map((n) => `“${n}”`).join(', ')} ${took.length > 1 ? 'are' : 'is'} kept, not assigned.` : '')
			: null;

	return {
		art,
		places: groups,
		selectedId: selected?.id ?? null,
		uploaded,
		maxArtBytes: MAX_ART_BYTES,
		minDpi: MIN_PRINT_DPI,
		upload: await superValidate(zod4(UploadFormSchema), { id: 'upload' }),
		replace: await superValidate(
			{ artId: selected?.id ?? '', version: selected?.version ?? 1, status: 'keep' as const },
			zod4(ReplaceFormSchema),
			{ id: 'replace', errors: false }
		),
		placement: await superValidate(
			selected
				? { id: selected.id, status: selected.status, assignment: selected.assignment, version: selected.version }
				: {},
			zod4(ArtPlacementSchema),
			{ id: 'placement', errors: false }
		)
	};
};

export const actions = {
	upload: uploadAction,
	replace: replaceAction,
	/** A placement changes where pieces print and which places they hold: the answer carries both. */
	save: async (event) => {
		const answer = await placeAction(event);
		return 'game' in answer ? { form: answer.form, saved: await artView(answer.game) } : answer;
	}
};
