import { describe, expect, it } from 'vitest';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { CardKindSchema, CardSchema } from '$lib/game/model';
import { demoGame } from '$lib/demo/demo';
import { knownKeysOnly } from './known-keys';

/** The editors' form state, as the form library makes it, must become a value the strict schemas take. */
describe('knownKeysOnly', () => {
	const game = demoGame();

	it('a card form holds every card type’s fields; cut down, it parses and equals the card', async () => {
		for (const type of new Set(game.cards.map((c) => c.data.type))) {
			const card = game.cards.find((c) => c.data.type === type)!;
			const form = await superValidate(card, zod4(CardSchema));
			expect(CardSchema.safeParse(form.data).success).toBe(false);
			const parsed = CardSchema.parse(knownKeysOnly(CardSchema, form.data));
			expect(parsed).toEqual(CardSchema.parse(card));
		}
	});

	it('a kind form over the back union parses after the cut', async () => {
		for (const kind of game.kinds) {
			const form = await superValidate(kind, zod4(CardKindSchema));
			const parsed = CardKindSchema.parse(knownKeysOnly(CardKindSchema, form.data));
			// The form fills absent optional settings with undefined; JSON drops them.
			expect(JSON.parse(JSON.stringify(parsed))).toEqual(JSON.parse(JSON.stringify(CardKindSchema.parse(kind))));
		}
	});

	it('keeps a wrong value wrong, so the form still names the real problem', () => {
		const card = structuredClone(game.cards[0]);
		const cut = knownKeysOnly(CardSchema, { ...card, copies: -1, stray: 1 }) as Record<string, unknown>;
		expect(cut.stray).toBeUndefined();
		expect(CardSchema.safeParse(cut).error?.issues[0].path).toEqual(['copies']);
	});
});
