import { describe, expect, it } from 'vitest';
import { PGlite } from '@electric-sql/pglite';
import { asBackground, backgroundTurn, FOREGROUND_RUN, isBackground, takeTurns, Turns } from './turns';

/** A call that records when it ran and finishes on the next macrotask (as a database call would). */
function recorder() {
	const ran: string[] = [];
	let inside = 0;
	let mostAtOnce = 0;
	const call = (name: string) => async () => {
		inside++;
		mostAtOnce = Math.max(mostAtOnce, inside);
		ran.push(name);
		await new Promise((ok) => setImmediate(ok));
		inside--;
		return name;
	};
	return { ran, call, mostAtOnce: () => mostAtOnce };
}

describe('turns at the embedded database', () => {
	it('runs one call at a time, each answering its own caller', async () => {
		const turns = new Turns();
		const r = recorder();
		const answers = await Promise.all(['a', 'b', 'c'].map((n) => turns.take(r.call(n))));
		expect(answers).toEqual(['a', 'b', 'c']);
		expect(r.mostAtOnce()).toBe(1);
	});

	it('lets a foreground call pass background calls already waiting', async () => {
		const turns = new Turns();
		const r = recorder();
		const all = [
			...['b1', 'b2', 'b3', 'b4'].map((n) => turns.take(r.call(n), true)),
			turns.take(r.call('f1'), false)
		];
		await Promise.all(all);
		// All were waiting at once (b1 in its pause); f1 goes first, ahead of b1..b4.
		expect(r.ran).toEqual(['f1', 'b1', 'b2', 'b3', 'b4']);
	});

	it('gives background work a turn after a run of foreground calls, so it is never starved', async () => {
		const turns = new Turns();
		const r = recorder();
		const calls = [turns.take(r.call('b1'), true), turns.take(r.call('b2'), true)];
		for (let i = 0; i < FOREGROUND_RUN * 2; i++) calls.push(turns.take(r.call(`f${i}`), false));
		await Promise.all(calls);
		// Each background call waits for at most FOREGROUND_RUN foreground calls.
		expect(r.ran.indexOf('b1')).toBe(FOREGROUND_RUN);
		expect(r.ran.indexOf('b2')).toBe(2 * FOREGROUND_RUN + 1);
	});

	it('lets the event loop go round before a background call (a request that arrived is read first)', async () => {
		const turns = new Turns();
		const ran: string[] = [];
		await Promise.all([
			turns.take(async () => {
				ran.push('b1');
				setImmediate(() => ran.push('arrived'));
			}, true),
			turns.take(async () => void ran.push('b2'), true)
		]);
		expect(ran).toEqual(['b1', 'arrived', 'b2']);
	});

	it('background turns without a database call: work that waits for them together goes on one per turn of the event loop', async () => {
		const ran: string[] = [];
		await Promise.all(
			[0, 1, 2].map(async (i) => {
				await backgroundTurn();
				ran.push(`start ${i}`);
				// Runs on the event loop's next round: before the next start, if that start waits for it.
				setImmediate(() => ran.push(`round after ${i}`));
			})
		);
		await new Promise((ok) => setImmediate(ok));
		expect(ran).toEqual(['start 0', 'round after 0', 'start 1', 'round after 1', 'start 2', 'round after 2']);
	});

	it('a call that throws before returning a promise frees the turn too', async () => {
		const turns = new Turns();
		const throwing = turns.take((() => {
			throw new Error('bad options');
		}) as () => Promise<never>);
		await expect(throwing).rejects.toThrow('bad options');
		await expect(turns.take(async () => 'ok')).resolves.toBe('ok');
	});

	it('a failed call frees the turn and fails only its caller', async () => {
		const turns = new Turns();
		const failing = turns.take(async () => {
			throw new Error('no such table');
		});
		const after = turns.take(async () => 'ok');
		await expect(failing).rejects.toThrow('no such table');
		await expect(after).resolves.toBe('ok');
		expect(turns.waiting).toBe(0);
	});

	it('background is known from inside asBackground and everything it awaits', async () => {
		expect(isBackground()).toBe(false);
		await asBackground(async () => {
			await new Promise((ok) => setTimeout(ok, 1));
			expect(isBackground()).toBe(true);
		});
		expect(isBackground()).toBe(false);
	});

	it('on a real PGlite, queries and transactions keep their answers and a foreground query goes first', async () => {
		const client = new PGlite();
		await client.waitReady;
		const turns = takeTurns(client);
		try {
			await client.exec('create table t (n int)');
			const order: string[] = [];
			const background = asBackground(() =>
				Promise.all(
					Array.from({ length: 6 }, (_, i) =>
						client.transaction(async (tx) => {
							await tx.query('insert into t values ($1)', [i]);
							order.push(`b${i}`);
						})
					)
				)
			);
			const foreground = client.query<{ n: number }>('select count(*)::int as n from t').then((r) => {
				order.push('f');
				return r.rows[0].n;
			});
			const [, seen] = await Promise.all([background, foreground]);
			expect(order[0]).toBe('f');
			expect(seen).toBe(0);
			expect((await client.query<{ n: number }>('select count(*)::int as n from t')).rows[0].n).toBe(6);
			expect(turns.waiting).toBe(0);
		} finally {
			await client.close();
		}
	});
});
