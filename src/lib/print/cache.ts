/**
 * The print cache: what the engine has already made, kept by a hash of everything it was made
 * from, so a rebuild after one card changed re-renders only that card.
 *
 * Entries are laid-out faces (FaceLayout), their SVG text and PNG bytes, loaded art (SVG art
 * rasterised) and image pixels encoded for PDF. One LRU holds them all under one byte budget.
 * Keys are SHA-256 of a canonical JSON of the inputs plus `ENGINE_VERSION` and the built-in
 * layouts, so a new engine or a changed template never serves an old face. The LRU itself is
 * lru-cache, bounded by bytes.
 *
 * The cache lives in memory, one per process or worker thread (see ./pool.ts).
 */
import { createHash } from 'node:crypto';
import { LRUCache } from 'lru-cache';
import type { Card, CardKind, Game } from '../game/model';
import type { FaceLayout, ImageAsset } from './display-list';
import { TEMPLATES } from './layout/index';
import type { EncodedImageStore, EncodedPixels } from './pdf-image';

/** Bump when the engine draws differently from the same inputs. */
export const ENGINE_VERSION = 'paddock-print-1';

/** The built-in layouts are inputs too: a changed template file changes every key. */
export const ENGINE_SALT = hashOf([ENGINE_VERSION, [...TEMPLATES.entries()]]);

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
}

/**
 * A least-recently-used map capped by bytes (lru-cache's `maxSize`; each entry's size is
 * estimated by its owner), with hit, miss and byte figures per area.
 */
export class PrintCache implements EncodedImageStore {
	private lru: LRUCache<string, Entry>;
	/** Sizes of the entries kept, for the per-area figures (lru-cache keeps only the total). */
	private sizes = new Map<string, number>();
	private areaBytes = Object.fromEntries(AREAS.map((a) => [a, 0])) as Record<CacheArea, number>;
	private areaEntries = Object.fromEntries(AREAS.map((a) => [a, 0])) as Record<CacheArea, number>;
	private evictions = 0;
	private counters = Object.fromEntries(AREAS.map((a) => [a, { hits: 0, misses: 0 }])) as Record<
		CacheArea,
		{ hits: number; misses: number }
	>;

	constructor(private budget = DEFAULT_CACHE_BYTES) {
		this.lru = this.makeLru(budget);
	}

	private makeLru(maxSize: number): LRUCache<string, Entry> {
		return new LRUCache<string, Entry>({
			maxSize,
			// Sizes are given on each set.
			sizeCalculation: () => 1,
			dispose: (entry, key, reason) => {
				if (reason === 'evict') this.evictions++;
				const size = this.sizes.get(key) ?? 0;
				this.sizes.delete(key);
				this.areaBytes[entry.area] -= size;
				this.areaEntries[entry.area]--;
			}
		});
	}

	get maxBytes(): number {
		return this.budget;
	}

	/** A new budget; entries beyond it go, least recently used first. */
	resize(maxBytes: number): void {
		const old = this.lru;
		const kept = [...old.rkeys()].map((k) => [k, old.peek(k)!, this.sizes.get(k) ?? 0] as const);
		this.budget = maxBytes;
		this.lru = this.makeLru(maxBytes);
		this.sizes.clear();
		for (const a of AREAS) {
			this.areaBytes[a] = 0;
			this.areaEntries[a] = 0;
		}
		// Oldest first, so the most recent end up most recent again; the oldest go once over budget.
		for (const [k, e, size] of kept) this.put(k, e, size);
	}

	private put(full: string, entry: Entry, bytes: number): void {
		this.lru.delete(full);
		// An entry larger than the whole budget is not kept.
		if (bytes > this.budget || bytes <= 0) return;
		this.sizes.set(full, bytes);
		this.areaBytes[entry.area] += bytes;
		this.areaEntries[entry.area]++;
		this.lru.set(full, entry, { size: bytes });
	}

	lookup<T>(area: CacheArea, key: string): T | undefined {
		const entry = this.lru.get(`${area}:${key}`);
		if (!entry) {
			this.counters[area].misses++;
			return undefined;
		}
		this.counters[area].hits++;
		return entry.value as T;
	}

	store<T>(area: CacheArea, key: string, value: T, bytes: number): T {
		this.put(`${area}:${key}`, { area, value }, Math.max(1, Math.ceil(bytes)));
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
		const areas = Object.fromEntries(
			AREAS.map((a) => [a, { ...this.counters[a], entries: this.areaEntries[a], bytes: this.areaBytes[a] }])
		) as Record<CacheArea, AreaStats>;
		return { ...areas, bytes: this.lru.calculatedSize, maxBytes: this.maxBytes, evictions: this.evictions };
	}

	/** Zero the hit and miss counters (entries stay). */
	resetStats(): void {
		for (const a of AREAS) this.counters[a] = { hits: 0, misses: 0 };
		this.evictions = 0;
	}

	clear(): void {
		this.lru.clear();
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
