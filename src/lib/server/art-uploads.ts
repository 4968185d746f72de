/**
 * Artwork uploads: a new art asset from a file, or a new file for an existing asset (a replace
 * keeps every earlier file in art_versions). The page's form actions and the API route
 * ($lib/server/http/art-uploads.ts reads their requests) both end in `uploadArt`.
 *
 * Nothing is stored until everything has been checked: the file by inspectArt (type from its
 * bytes, size and pixel caps before any decode, SVG safety), the fields by their schemas, the
 * change against the whole game. The file is written last, inside the transaction that records
 * it, so a refusal leaves no file, no art_files row, no version and no art object behind.
 */
import { and, desc, eq, max } from 'drizzle-orm';
import type { z } from 'zod';
import type { Db } from './db';
import { artFiles, artVersions, users } from './db/schema';
import { applyChanges, loadGame, type Change } from './game-store';
import { Busy, Invalid, NotFound } from './refusals';
import { storeArtFile } from './art-files';
import type { GameActor } from './actor';
import { StorageUnavailableError } from './storage';
import { inspectArt, ArtRejected, type InspectedArt } from '$lib/art/inspect';
import { describeAssignment } from '$lib/art/placement';
import type { ArtPlacementSchema } from '$lib/schemas/art';
import { ART_EXTENSIONS, newId, type ArtAsset, type ArtAssignment, type ArtStatus, type Game } from '$lib/game/model';

/* ------------------------------------------------------------- uploads */

export interface UploadRequest {
	bytes: Uint8Array;
	fileName: string;
	/** New art: 'sketch' when not given. Replaced art: unchanged when not given. */
	status?: ArtStatus;
	/** New art only; absent or null leaves it unassigned. */
	assignment?: ArtAssignment | null;
	replaces?: { artId: string; version: number };
}

export interface UploadOutcome {
	art: ArtAsset;
	replaced: boolean;
	version: { number: number; sha256: string; fileName: string; createdAt: Date };
	/** Assets that held the slot before and are now unassigned (kept, not deleted). */
	displaced: ArtAsset[];
	/** The game after the change. */
	game: Game;
}

/** Inspects, checks and stores one upload; throws ArtRejected or a refusal when refused. */
export async function uploadArt(d: Db, by: GameActor, upload: UploadRequest): Promise<UploadOutcome> {
	const { gameId } = by;
	if (upload.bytes.byteLength === 0) throw new Invalid('The upload is empty: choose an art file (PNG, JPEG or SVG).');
	const inspected = await inspectArt(upload.bytes, upload.fileName);
	const fileName = cleanFileName(upload.fileName, inspected);
	const before = await loadGame(d, gameId);

	let object: ArtAsset;
	let displaced: ArtAsset[] = [];
	if (upload.replaces) {
		const current = before.art.find((a) => a.id === upload.replaces!.artId);
		if (!current) throw new NotFound(`No art piece with id ${upload.replaces.artId} in this game`);
		if (current.sha256 === inspected.sha256)
			throw new Invalid(`This is the very file “${current.fileName}” already has; nothing was replaced.`);
		const { version: _v, dpiX: _x, dpiY: _y, ...kept } = current;
		object = { ...kept, ...fileFacts(inspected), fileName, status: upload.status ?? current.status };
	} else {
		object = {
			id: newId(),
			...fileFacts(inspected),
			fileName,
			status: upload.status ?? 'sketch',
			assignment: upload.assignment ?? null
		};
		displaced = holdersOf(before, object.assignment, object.id);
	}
	const changes: Change[] = [
		{ collection: 'art', id: object.id, baseVersion: upload.replaces ? upload.replaces.version : null, object },
		...displaced.map(unassign)
	];

	return d.transaction(async (tx) => {
		const t = tx as unknown as Db;
		// Checks the versions and the whole game; throws (and writes nothing) when anything is wrong.
		const game = await applyChanges(t, by, { changes, action: upload.replaces ? 'art.replaced' : 'art.uploaded' });
		const [{ last }] = await tx
			.select({ last: max(artVersions.number) })
			.from(artVersions)
			.where(and(eq(artVersions.gameId, gameId), eq(artVersions.artId, object.id)));
		await storeArtFile(t, inspected).catch((e) => {
			// The transaction rolls back: no row points at a file the store does not have.
			if (e instanceof StorageUnavailableError) throw new Busy('The file store cannot be reached right now, so nothing was stored. Try again in a moment.');
			throw e;
		});
		const [version] = await tx
			.insert(artVersions)
			.values({ gameId, artId: object.id, number: (last ?? 0) + 1, sha256: inspected.sha256, fileName, uploadedBy: by.userId })
			.returning();
		return {
			art: game.art.find((a) => a.id === object.id)!,
			replaced: Boolean(upload.replaces),
			version: { number: version.number, sha256: version.sha256, fileName: version.fileName, createdAt: version.createdAt },
			displaced,
			game
		};
	});
}

const fileFacts = (i: InspectedArt) => ({
	sha256: i.sha256,
	mime: i.mime,
	widthPx: i.widthPx,
	heightPx: i.heightPx,
	...(i.dpiX !== undefined && { dpiX: i.dpiX }),
	...(i.dpiY !== undefined && { dpiY: i.dpiY })
});

/** The name as people know the file: no folders, no control characters, at most 255 characters. */
function cleanFileName(raw: string, inspected: InspectedArt): string {
	const base = (raw.split(/[\\/]/).pop() ?? '').replace(/[\u0000-\u001f\u007f]/g, '').trim();
	return base ? base.slice(0, 255) : `art.${ART_EXTENSIONS[inspected.mime]}`;
}

/**
 * Other assets assigned to exactly this slot. The layout shows only the first one assigned, so
 * a new assignment takes the slot over and the earlier holders become unassigned (kept).
 */
function holdersOf(game: Game, assignment: ArtAssignment | null, exceptId: string): ArtAsset[] {
	if (!assignment) return [];
	return game.art.filter(
		(a) =>
			a.id !== exceptId &&
			a.assignment?.scope === assignment.scope &&
			a.assignment.targetId === assignment.targetId &&
			a.assignment.slot === assignment.slot
	);
}

const unassign = (a: ArtAsset): Change => ({
	collection: 'art',
	id: a.id,
	baseVersion: a.version ?? null,
	object: { ...a, version: undefined, assignment: null }
});

/** Status and assignment of an existing asset; its file is untouched. Takes the slot over like an upload. */
export async function placeArt(
	d: Db,
	by: GameActor,
	change: z.infer<typeof ArtPlacementSchema>
): Promise<{ art: ArtAsset; displaced: ArtAsset[]; game: Game }> {
	const before = await loadGame(d, by.gameId);
	const current = before.art.find((a) => a.id === change.id);
	if (!current) throw new NotFound(`No art piece with id ${change.id} in this game`);
	const { version: _v, ...kept } = current;
	const object: ArtAsset = { ...kept, status: change.status, assignment: change.assignment };
	const displaced = holdersOf(before, object.assignment, object.id);
	const after = await applyChanges(d, by, {
		changes: [{ collection: 'art', id: object.id, baseVersion: change.version ?? null, object }, ...displaced.map(unassign)],
		action: 'art.saved'
	});
	return { art: after.art.find((a) => a.id === object.id)!, displaced, game: after };
}

export interface ArtVersionRow {
	artId: string;
	number: number;
	sha256: string;
	fileName: string;
	createdAt: Date;
	uploadedBy: string | null;
	mime: string;
	bytes: number;
	widthPx: number;
	heightPx: number;
	dpiX: number | null;
	dpiY: number | null;
}

/** Every file each of the game's art assets has had, newest first, keyed by art id. */
export async function artVersionsByArt(d: Db, gameId: string): Promise<Map<string, ArtVersionRow[]>> {
	const rows = await d
		.select({
			artId: artVersions.artId,
			number: artVersions.number,
			sha256: artVersions.sha256,
			fileName: artVersions.fileName,
			createdAt: artVersions.createdAt,
			uploadedBy: users.name,
			mime: artFiles.mime,
			bytes: artFiles.bytes,
			widthPx: artFiles.widthPx,
			heightPx: artFiles.heightPx,
			dpiX: artFiles.dpiX,
			dpiY: artFiles.dpiY
		})
		.from(artVersions)
		.innerJoin(artFiles, eq(artFiles.sha256, artVersions.sha256))
		.leftJoin(users, eq(users.id, artVersions.uploadedBy))
		.where(eq(artVersions.gameId, gameId))
		.orderBy(desc(artVersions.number));
	const byArt = new Map<string, ArtVersionRow[]>();
	for (const r of rows) byArt.set(r.artId, [...(byArt.get(r.artId) ?? []), r]);
	return byArt;
}
