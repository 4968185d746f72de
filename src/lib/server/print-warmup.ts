/**
 * At start, the print workers build the most recently edited games once and throw the files
 * away: their caches then hold those games' faces and decoded art, and the build's code is
 * compiled, so the first sheet someone asks for after a start is not the slow one.
 */
import { desc } from 'drizzle-orm';
import type { Db } from './db';
import { games } from './db/schema';
import { loadGame } from './game-store';
import { artBytes } from './printing';
import { parsePrintOptions } from '$lib/print/options';
import type { PrintPool } from '$lib/print/pool';

/** Duplex, so the backs' art is decoded too. */
const WARM_OPTIONS = parsePrintOptions({ duplex: 'long' });

/** Builds the `count` most recently edited games once each; returns how many built. */
export async function warmRecentGames(db: Db, pool: PrintPool, count = pool.idleSize): Promise<number> {
	const recent = await db.select().from(games).orderBy(desc(games.updatedAt)).limit(count);
	let warmed = 0;
	for (const row of recent) {
		try {
			const game = await loadGame(db, row.id, row);
			await pool.run({ type: 'sheets', game, art: await artBytes(game), options: WARM_OPTIONS }, { affinity: game.slug });
			warmed++;
		} catch {
			// A game that cannot be printed as it stands is simply not warmed.
		}
	}
	return warmed;
}
