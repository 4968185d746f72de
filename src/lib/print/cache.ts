/**
 * The print cache: what the engine has already made, kept by a hash of everything it was made
 * from, so a rebuild after one card changed re-renders only that card.
 *
 * Entries are laid-out faces (FaceLayout), their SVG text and PNG bytes, loaded art (SVG art
 * rasterised) and image pixels encoded for PDF. One LRU holds them all under one byte budget.
 * Keys are SHA-256 of a canonical JSON of the inputs plus `ENGINE_VERSION` and the built-in
 * layouts, so a new engine or a changed template never serves an old face.
 *
 * The cache lives in memory, one per process or worker thread (see ./pool.ts).
 */
import { createHash } from 'node:crypto';
import type { Card, CardKind, Game } from '../game/model';
import type { FaceLayout, ImageAsset } from './display-list';
import { TEMPLATES } from './layout/index';
import type { EncodedImageStore, EncodedPixels } from './pdf-image';

/** Bump when the engine draws differently from the same inputs. */
export const ENGINE_VERSION = 'paddock-print-1';

/** The built-in layouts are inputs too: a changed template file changes every key. */
const ENGINE_SALT = hashOf([ENGINE_VERSION, [...TEMPLATES.entries()]]);

/** Default budget: room for a large game's faces and art without crowding a 1 GB host. */
export const DEFAULT_CACHE_BYTES = 256 * 1024 * 1024;

export const CACHE_AREAS = ['layout', 'svg', 'png', 'image', 'pixels'] as const;
export type CacheArea = (typeof CACHE_AREAS)[number];
const AREAS = CACHE_AREAS;

export interface AreaStats {
	hits: number;
	misses: number;
	entries: number;
	bytes: number;
}

export interface CacheStats extends Record<CacheArea, AreaStats> {
	bytes: number;
	maxBytes: number;
	evictions: number;
}

interface Entry {
	area: CacheArea;
	value: unknown;
	bytes: number;
}

/**
 * A least-recently-used map capped by bytes (each entry's size is estimated by its owner).
 * Map iteration order is insertion order, so re-inserting on use keeps the oldest first.
 */
export class PrintCache implements EncodedImageStore {
	private entries = new Map<string, Entry>();
	private totalBytes = 0;
	private evictions = 0;
	private counters = Object.fromEntries(AREAS.map((a) => [a, { hits: 0, misses: 0 }])) as Record<
		CacheArea,
		{ hits: number; misses: number }
	>;

	constructor(private budget = DEFAULT_CACHE_BYTES) {}

	get maxBytes(): number {
		return this.budget;
	}

	/** A new budget; entries beyond it go, least recently used first. */
	resize(maxBytes: number): void {
		this.budget = maxBytes;
		this.trim();
	}

	private trim(): void {
		for (const [k, e] of this.entries) {
			if (this.totalBytes <= this.budget) break;
			this.entries.delete(k);
			this.totalBytes -= e.bytes;
			this.evictions++;
		}
	}

	lookup<T>(area: CacheArea, key: string): T | undefined {
		const full = `${area}:${key}`;
		const entry = this.entries.get(full);
		if (!entry) {
			this.counters[area].misses++;
			return undefined;
		}
		this.counters[area].hits++;
		this.entries.delete(full);
		this.entries.set(full, entry);
		return entry.value as T;
	}

	store<T>(area: CacheArea, key: string, value: T, bytes: number): T {
		const full = `${area}:${key}`;
		const old = this.entries.get(full);
		if (old) {
			this.totalBytes -= old.bytes;
			this.entries.delete(full);
		}
		// An entry larger than the whole budget is returned but not kept.
		if (bytes > this.budget) return value;
		this.entries.set(full, { area, value, bytes });
		this.totalBytes += bytes;
		this.trim();
		return value;
	}

	/** The cached value, or make it, keep it and return it. */
	async getOrMake<T>(area: CacheArea, key: string, make: () => Promise<T> | T, sizeOf: (value: T) => number): Promise<T> {
		const hit = this.lookup<T>(area, key);
		if (hit !== undefined) return hit;
		const value = await make();
		return this.store(area, key, value, sizeOf(value));
	}

	/* EncodedImageStore, for PdfImageCache: pixels are counted in the 'pixels' area. */
	get(key: string): EncodedPixels | undefined {
		return this.lookup<EncodedPixels>('pixels', key);
	}

	set(key: string, pixels: EncodedPixels): void {
		this.store('pixels', key, pixels, pixels.colour.length + (pixels.alpha?.length ?? 0) + 64);
	}

	stats(): CacheStats {
		const areas = Object.fromEntries(AREAS.map((a) => [a, { ...this.counters[a], entries: 0, bytes: 0 }])) as Record<
			CacheArea,
			AreaStats
		>;
		for (const e of this.entries.values()) {
			areas[e.area].entries++;
			areas[e.area].bytes += e.bytes;
		}
		return { ...areas, bytes: this.totalBytes, maxBytes: this.maxBytes, evictions: this.evictions };
	}

	/** Zero the hit and miss counters (entries stay). */
	resetStats(): void {
		for (const a of AREAS) this.counters[a] = { hits: 0, misses: 0 };
		this.evictions = 0;
	}

	clear(): void {
		this.entries.clear();
		this.totalBytes = 0;
		this.resetStats();
	}
}

/** The process's cache (each worker thread has its own). */
export const printCache = new PrintCache();

/* ------------------------------------------------------------------ keys */

/** JSON with object keys sorted, so equal data gives equal text whatever order it was built in. */
export function canonicalJson(value: unknown): string {
	if (value === undefined) return 'null';
	if (value === null || typeof value !== 'object') return JSON.stringify(value);
	if (value instanceof Map) return canonicalJson([...value.entries()]);
	if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
	const keys = Object.keys(value as Record<string, unknown>)
		.filter((k) => (value as Record<string, unknown>)[k] !== undefined)
		.sort();
	return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson((value as Record<string, unknown>)[k])}`).join(',')}}`;
}

export function hashOf(value: unknown): string {
	return createHash('sha256').update(canonicalJson(value)).digest('hex');
}

/** The object without its optimistic-lock `version`: saving unchanged data must not re-render. */
function unversioned<T extends { version?: number }>(o: T | undefined): Omit<T, 'version'> | undefined {
	if (!o) return undefined;
	const { version: _version, ...rest } = o;
	return rest;
}

/**
 * Everything of the game that one face's layout reads (see ./layout): the kind, the card, the
 * runner and money table its data names, the rogue runner for rogue cards, the game's name and
 * runner symbols on a shared back, and the art assigned to the card, its runner or its kind.
 * If a layout starts reading more of the game, add it here (cache.test.ts checks this list
 * against the layouts on the demo game).
 */
export function faceScope(game: Game, kind: CardKind, card: Card | undefined, side: 'front' | 'back') {
	const data = card?.data;
	const runnerId = data && (data.type === 'movement' || data.type === 'wager') ? data.runnerId : undefined;
	const rogue = data?.type === 'rogue' ? game.rogueRunner : undefined;
	const targets = new Set([kind.id, card?.id, runnerId, rogue?.id].filter(Boolean));
	const plainBack = side === 'back' && drawsPlainBack(kind);
	return {
		side,
		kind: unversioned(kind),
		card: unversioned(card),
		gameName: plainBack ? game.name : undefined,
		runner: unversioned(game.runners.find((r) => r.id === runnerId)),
		rogueRunner: unversioned(rogue),
		moneyTable: data?.type === 'wager' ? unversioned(game.moneyTables.find((t) => t.id === data.moneyTableId)) : undefined,
		// A shared back draws a lattice of all the runners' symbols.
		symbols: plainBack ? game.runners.map((r) => r.symbol) : undefined,
		// In the game's order: the layout takes the first match.
		art: game.art
			.filter((a) => a.assignment && targets.has(a.assignment.targetId))
			.map((a) => ({ id: a.id, sha256: a.sha256, mime: a.mime, widthPx: a.widthPx, heightPx: a.heightPx, fileName: a.fileName, assignment: a.assignment }))
	};
}

/** Whether a kind's back is drawn by the plain back module (game name, runner symbols), as ./layout picks it. */
function drawsPlainBack(kind: CardKind): boolean {
	const face = TEMPLATES.get(kind.back.template)?.face;
	return face ? face === 'back' : kind.back.mode === 'shared';
}

/** The key of one laid-out face: its scope, which images were loaded (and their size), the engine. */
export function faceKey(
	game: Game,
	kind: CardKind,
	card: Card | undefined,
	side: 'front' | 'back',
	images: ReadonlyMap<string, ImageAsset>
): string {
	const scope = faceScope(game, kind, card, side);
	const loaded = scope.art.map((a) => {
		const img = images.get(a.sha256) ?? images.get(a.id);
		return img ? [img.id, img.widthPx, img.heightPx, img.bytes.length] : null;
	});
	return hashOf([ENGINE_SALT, scope, loaded]);
}

/** A rough size of a face in memory: its JSON is a fair proxy for the objects behind it. */
export function faceBytes(face: FaceLayout): number {
	return JSON.stringify(face).length * 2;
}
