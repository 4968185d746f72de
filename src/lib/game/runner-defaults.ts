/**
 * What a new runner starts with: a symbol and an order number no other runner uses, and a screen
 * colour as far as possible from the colours already taken (also under simulated colour blindness).
 */
import { RUNNER_SYMBOLS, type Game, type RunnerSymbol } from './model';
import { closestVision } from './readiness';

/** Candidate screen colours, chosen here to be far apart from one another. */
export const CANDIDATE_COLOURS = ['#d1495b', '#edae49', '#00798c', '#30638e', '#66a182', '#8e5572', '#f4f1de', '#2e282a', '#e07a5f', '#3d405b', '#81b29a', '#f2cc8f'];

export function newRunnerDefaults(game: Pick<Game, 'runners' | 'rogueRunner'>): { symbol: RunnerSymbol; sortOrder: number; colourHex: string } {
	const others = [...game.runners, ...(game.rogueRunner ? [game.rogueRunner] : [])];
	const usedSymbols = new Set(others.map((r) => r.symbol));
	const symbol = RUNNER_SYMBOLS.find((s) => !usedSymbols.has(s)) ?? RUNNER_SYMBOLS[game.runners.length % RUNNER_SYMBOLS.length];
	const sortOrder = game.runners.reduce((m, r) => Math.max(m, r.sortOrder + 1), 0);
	let colourHex = CANDIDATE_COLOURS[0];
	let best = -1;
	for (const c of CANDIDATE_COLOURS) {
		const nearest = Math.min(Infinity, ...others.map((r) => closestVision(c, r.colourHex).deltaE));
		if (nearest > best) [best, colourHex] = [nearest, c];
	}
	return { symbol, sortOrder, colourHex };
}
