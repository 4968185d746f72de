/**
 * CSV import of a card kind through its page actions, against the real store: a file with one
 * bad row imports nothing and says which line is wrong; the fixed file imports every row in one
 * write; the confirm step reads the text again instead of trusting the preview.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import Papa from 'papaparse';
import { isActionFailure } from '@sveltejs/kit';
import { openWorld, fakeEvent, type World, actorIn } from './harness';
import { applyChanges, loadGame } from '$lib/server/game-store';
import { newKind } from '$lib/game/kind-defaults';
import { cardSize, type CardKind } from '$lib/game/model';
import { importBasis } from '../../src/routes/(app)/games/[gameId=id]/kinds/[kindId]/csv/import-plan';
import * as csvPage from '../../src/routes/(app)/games/[gameId=id]/kinds/[kindId]/csv/+page.server';
import * as csvRoute from '../../src/routes/(app)/games/[gameId=id]/kinds/[kindId]/cards.csv/+server';

let w: World;
let kind: CardKind;

beforeAll(async () => {
	w = await openWorld();
	kind = newKind({ name: 'Sprint cards', type: 'movement', size: cardSize('poker'), bleed: 'metric', template: 'movement' }, 'kd-sprint');
	await applyChanges(w.db, actorIn(w, 'designer'), { changes: [{ collection: 'kind', id: kind.id, baseVersion: null, object: kind }], action: 'test' });
});
afterAll(async () => w?.close());

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const designer = (form: Record<string, string>) => fakeEvent(w.callers.designer, { params: { gameId: w.gameId, kindId: kind.id }, form }) as any;
const sprintCards = async () => (await loadGame(w.db, w.gameId)).cards.filter((c) => c.kindId === kind.id);
const basis = async () => createHash('sha256').update(importBasis(await loadGame(w.db, w.gameId), kind)).digest('hex');

/** Line 1 is the header, so the third data row sits on line 4. */
const BAD = ['name,copies,runner,steps', 'Rosehip dash,2,Rosehip,2', 'Saffron dash,1,Saffron,3', 'Sorrel dash,1,Sorrel,12', 'Pebble dash,3,Pebble,1'].join('\n');
const FIXED = BAD.replace('Sorrel,12', 'Sorrel,4');

describe('CSV import of a card kind', () => {
	it('previews a file with one bad row: the error names line 4 and the column, and nothing is written', async () => {
		const result = await csvPage.actions.preview(designer({ csv: BAD, removeMissing: 'on' }));
		expect(isActionFailure(result)).toBe(true);
		const data = (result as unknown as { status: number; data: { preview: { ok: boolean; errors: { line: number; column?: string }[] } } }).data;
		expect(data.preview.ok).toBe(false);
		expect(data.preview.errors).toEqual([expect.objectContaining({ line: 4, column: 'steps' })]);
		expect(await sprintCards()).toEqual([]);
	});

	it('refuses to confirm the bad file even when the confirm step is sent straight away: all or nothing', async () => {
		const result = await csvPage.actions.apply(designer({ csv: BAD, removeMissing: 'on', basis: await basis() }));
		expect(isActionFailure(result)).toBe(true);
		const failure = result as unknown as { status: number; data: { problem: string; preview: { errors: { line: number }[] } } };
		expect(failure.status).toBe(400);
		expect(failure.data.problem).toMatch(/Nothing was imported/);
		expect(failure.data.preview.errors.map((e) => e.line)).toEqual([4]);
		expect(await sprintCards()).toEqual([]);
	});

	it('imports every row of the fixed file in one go', async () => {
		const preview = (await csvPage.actions.preview(designer({ csv: FIXED, removeMissing: 'on' }))) as unknown as {
			preview: { ok: boolean; added: { name: string; line?: number }[] };
			basis: string;
		};
		expect(preview.preview.ok).toBe(true);
		expect(preview.preview.added.map((a) => [a.name, a.line])).toEqual([
			['Rosehip dash', 2],
			['Saffron dash', 3],
			['Sorrel dash', 4],
			['Pebble dash', 5]
		]);
		// Previewing wrote nothing.
		expect(await sprintCards()).toEqual([]);

		const applied = (await csvPage.actions.apply(designer({ csv: FIXED, removeMissing: 'on', basis: preview.basis }))) as unknown as {
			applied: { added: number; changed: number; removed: number };
		};
		expect(applied.applied).toEqual({ added: 4, changed: 0, removed: 0 });
		const cards = await sprintCards();
		const game = await loadGame(w.db, w.gameId);
		const runnerName = (id: string) => game.runners.find((r) => r.id === id)?.name;
		expect(cards.map((c) => [c.name, c.copies, c.data.type === 'movement' ? [runnerName(c.data.runnerId), c.data.steps] : null])).toEqual([
			['Rosehip dash', 2, ['Rosehip', 2]],
			['Saffron dash', 1, ['Saffron', 3]],
			['Sorrel dash', 1, ['Sorrel', 4]],
			['Pebble dash', 3, ['Pebble', 1]]
		]);
	});

	it('reads the text again on confirm: a preview made against other cards is not applied', async () => {
		const before = await sprintCards();
		const stale = await csvPage.actions.apply(designer({ csv: FIXED.replace('Pebble,1', 'Pebble,2'), removeMissing: 'on', basis: 'from-an-old-preview' }));
		expect(isActionFailure(stale)).toBe(true);
		expect((stale as unknown as { status: number }).status).toBe(409);
		expect(await sprintCards()).toEqual(before);
	});

	it('writes nothing when the store refuses one change: a removed card whose art would be left behind', async () => {
		// The demo's hazard cards each carry their own icon art; dropping one from the file would
		// leave that art assigned to nothing, so the whole import is refused, new card included.
		const hazard = (form: Record<string, string>) =>
			// eslint-disable-next-line @typescript-eslint/no-explicit-any
			fakeEvent(w.callers.designer, { params: { gameId: w.gameId, kindId: 'kd-hazard' }, form }) as any;
		const before = (await loadGame(w.db, w.gameId)).cards.filter((c) => c.kindId === 'kd-hazard');
		const csv = ['name,copies,modifierName,effectText,steps', 'Dew Trail,3,Dew Trail,"The snails that stop here glide two spaces on, onto the top of any stack. Then lift the token.",2', 'Moss Bed,1,Moss Bed,Soft going.,1'].join('\n');
		const preview = (await csvPage.actions.preview(hazard({ csv, removeMissing: 'on' }))) as unknown as { preview: { ok: boolean; missing: unknown[] }; basis: string };
		expect(preview.preview.ok).toBe(true);
		expect(preview.preview.missing).toHaveLength(3);
		const result = await csvPage.actions.apply(hazard({ csv, removeMissing: 'on', confirmRemove: '3', basis: preview.basis }));
		expect(isActionFailure(result)).toBe(true);
		expect((result as unknown as { data: { problem: string } }).data.problem).toMatch(/^Nothing was imported: .*assigned to a missing card/);
		expect((await loadGame(w.db, w.gameId)).cards.filter((c) => c.kindId === 'kd-hazard')).toEqual(before);
	});

	it('exports the kind as CSV that an independent reader parses back to the same rows, and that re-imports as unchanged', async () => {
		const response = await csvRoute.GET(designer({}));
		// The media type registered for CSV (RFC 4180 §3), sent as a download (RFC 6266).
		expect(response.headers.get('content-type')).toMatch(/^text\/csv/);
		expect(response.headers.get('content-disposition')).toMatch(/^attachment; filename=".+\.csv"$/);
		const text = (await response.text()).replace(/^\uFEFF/, '');
		// RFC 4180 §2: records end with CRLF.
		expect(text.split('\r\n')[0]).toBe('name,copies,runner,steps');
		const parsed = Papa.parse<string[]>(text.trim(), { newline: '\r\n' });
		expect(parsed.errors).toEqual([]);
		expect(parsed.data).toEqual([
			['name', 'copies', 'runner', 'steps'],
			['Rosehip dash', '2', 'Rosehip', '2'],
			['Saffron dash', '1', 'Saffron', '3'],
			['Sorrel dash', '1', 'Sorrel', '4'],
			['Pebble dash', '3', 'Pebble', '1']
		]);
		const again = (await csvPage.actions.preview(designer({ csv: text, removeMissing: 'on' }))) as unknown as {
			preview: { ok: boolean; added: unknown[]; changed: unknown[]; missing: unknown[]; unchanged: number };
		};
		expect(again.preview).toMatchObject({ ok: true, added: [], changed: [], missing: [], unchanged: 4 });
	});

	it('keeps the cards a file does not list unless asked, and removes them only with the count confirmed', async () => {
		const partial = ['name,copies,runner,steps', 'Rosehip dash,2,Rosehip,2', 'Saffron dash,1,Saffron,3'].join('\n');
		// Not asked (the page's box starts unticked): the two cards not in the file are listed and kept.
		const kept = (await csvPage.actions.preview(designer({ csv: partial }))) as unknown as {
			preview: { ok: boolean; removeMissing: boolean; missing: { name: string }[] };
			basis: string;
		};
		expect(kept.preview.removeMissing).toBe(false);
		expect(kept.preview.missing.map((c) => c.name)).toEqual(['Sorrel dash', 'Pebble dash']);
		const keptApply = (await csvPage.actions.apply(designer({ csv: partial, basis: kept.basis }))) as unknown as { applied: { removed: number } };
		expect(keptApply.applied.removed).toBe(0);
		expect(await sprintCards()).toHaveLength(4);

		// Asked, but without the count the person saw: refused, nothing written, the count said.
		const asked = (await csvPage.actions.preview(designer({ csv: partial, removeMissing: 'on' }))) as unknown as { basis: string };
		for (const confirmRemove of [undefined, '1', '3']) {
			const form: Record<string, string> = { csv: partial, removeMissing: 'on', basis: asked.basis, ...(confirmRemove ? { confirmRemove } : {}) };
			const refused = await csvPage.actions.apply(designer(form));
			expect(isActionFailure(refused)).toBe(true);
			expect((refused as unknown as { data: { problem: string } }).data.problem).toMatch(/would remove 2 cards/);
			expect(await sprintCards()).toHaveLength(4);
		}
		const removed = (await csvPage.actions.apply(designer({ csv: partial, removeMissing: 'on', confirmRemove: '2', basis: asked.basis }))) as unknown as {
			applied: { removed: number };
		};
		expect(removed.applied.removed).toBe(2);
		expect((await sprintCards()).map((c) => c.name)).toEqual(['Rosehip dash', 'Saffron dash']);
	});
});
