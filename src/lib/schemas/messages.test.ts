import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { RunnerSchema } from '$lib/game/model';
import './messages';

const messages = (schema: z.ZodType, value: unknown) => (schema.safeParse(value).error?.issues ?? []).map((i) => i.message);

describe('plain validation messages', () => {
	it('say what to do, never the library’s wording', () => {
		const said = messages(RunnerSchema, { id: 'r1', name: '', colourHex: 'red', cmyk: { c: 120, m: 'x', y: 0 }, symbol: 'moon', sortOrder: 1.5 });
		expect(said).toEqual(
			expect.arrayContaining(['Fill this in.', 'Colour must look like #rrggbb', 'Use 100 or less.', 'Enter a number.'])
		);
		expect(said.some((m) => m.startsWith('Choose dot, triangle'))).toBe(true);
		for (const m of said) expect(m).not.toMatch(/Too small|Too big|Invalid input|expected/);
	});

	it('cover lengths, e-mail and lists', () => {
		expect(messages(z.string().min(8), 'abc')).toEqual(['Use at least 8 characters.']);
		expect(messages(z.string().max(3), 'abcd')).toEqual(['Keep it to 3 characters or fewer.']);
		expect(messages(z.email(), 'nobody')).toEqual(['Enter an e-mail address, such as name@example.com.']);
		expect(messages(z.array(z.number()).min(1), [])).toEqual(['Add at least one.']);
		// A JSON body's number where text belongs is told to quote it, not to "enter some text".
		expect(messages(z.string().optional(), 1)).toEqual(['Give this as text, in quotes.']);
		// A schema's own message still wins.
		expect(messages(z.string().min(1, 'Name the table'), '')).toEqual(['Name the table']);
	});
});
