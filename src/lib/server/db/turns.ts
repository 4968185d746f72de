/**
 * Turns at the embedded database. PGlite answers one call at a time, on the server's own thread,
 * in the order the calls came. Eight print requests arriving together make a hundred or so calls
 * (their sessions, the game, the job rows, the builds' progress), and a person's next click would
 * wait behind every one of them. So calls made for background work (print and odds jobs, the
 * requests that start and follow them, the sweep) wait while calls for anything else are
 * waiting; and so background work still moves under steady traffic, it takes a turn after at
 * most `FOREGROUND_RUN` foreground calls in a row.
 *
 * A transaction is one call here: its statements run inside it, on its own handle, with no turn
 * of their own. A PostgreSQL server answers many calls at once and needs none of this; the
 * turns without a call that background requests start on (`backgroundTurn`) apply to it too.
 */
import { AsyncLocalStorage } from 'node:async_hooks';
import type { PGlite } from '@electric-sql/pglite';

/** Foreground calls that may pass waiting background calls before one background call runs. */
export const FOREGROUND_RUN = 8;

const background = new AsyncLocalStorage<true>();

/** Runs `work` (and everything it starts) as background work: its database calls wait their turn. */
export function asBackground<T>(work: () => T): T {
	return background.run(true, work);
}

export function isBackground(): boolean {
	return background.getStore() === true;
}

type Call = () => void;

/** Calls one at a time, foreground first (see the top of the file). */
export class Turns {
	private busy = false;
	private pausing = false;
	private foregroundInARow = 0;
	private readonly foreground: Call[] = [];
	private readonly waitingBackground: Call[] = [];

	take<T>(call: () => Promise<T>, asBackgroundCall = isBackground()): Promise<T> {
		return new Promise<T>((ok, fail) => {
			const run = () => {
				// A call that throws before it returns a promise still frees the turn.
				let running: Promise<T>;
				try {
					running = call();
				} catch (e) {
					running = Promise.reject(e);
				}
				running
					.then(ok, fail)
					.finally(() => {
						this.busy = false;
						this.next();
					});
			};
			(asBackgroundCall ? this.waitingBackground : this.foreground).push(run);
			this.next();
		});
	}

	/** Calls waiting for a turn. */
	get waiting(): number {
		return this.foreground.length + this.waitingBackground.length;
	}

	/**
	 * Starts the next call. A background call first lets the event loop go round once (a
	 * setImmediate): the calls of a print request run as one chain of promises, and without the
	 * pause a request that has just arrived would not even be read until the chain ended.
	 */
	private next(afterPause = false) {
		if (this.busy) return;
		const backgroundsTurn = this.waitingBackground.length > 0 && (this.foreground.length === 0 || this.foregroundInARow >= FOREGROUND_RUN);
		if (backgroundsTurn && !afterPause) {
			if (!this.pausing) {
				this.pausing = true;
				setImmediate(() => {
					this.pausing = false;
					this.next(true);
				});
			}
			return;
		}
		const run = backgroundsTurn ? this.waitingBackground.shift() : this.foreground.shift();
		if (!run) return;
		// Counted only while background calls wait: a quiet spell owes them nothing.
		this.foregroundInARow = backgroundsTurn || this.waitingBackground.length === 0 ? 0 : this.foregroundInARow + 1;
		this.busy = true;
		run();
	}
}

/** The turns of the database opened last; a database without turns (PostgreSQL) leaves one of their own. */
let current = new Turns();

/**
 * Waits for a background turn without a database call: a request that belongs to background work
 * (../http/request-hooks.ts) takes one before it starts, so eight that arrive together start
 * one per turn of the event loop instead of all in the turn that read them.
 */
export function backgroundTurn(): Promise<void> {
	return current.take(async () => {}, true);
}

/**
 * Routes a PGlite client's calls (query, exec, transaction: what drizzle and our own code use)
 * through turns. Patched on the client itself so drizzle keeps a real PGlite.
 */
export function takeTurns(client: PGlite, turns = new Turns()): Turns {
	const query = client.query.bind(client);
	const exec = client.exec.bind(client);
	const transaction = client.transaction.bind(client);
	client.query = ((...args: Parameters<typeof query>) => turns.take(() => query(...args))) as typeof client.query;
	client.exec = ((...args: Parameters<typeof exec>) => turns.take(() => exec(...args))) as typeof client.exec;
	client.transaction = ((...args: Parameters<typeof transaction>) => turns.take(() => transaction(...args))) as typeof client.transaction;
	current = turns;
	return turns;
}
