import { describe, expect, it } from 'vitest';
import { cardSize } from '$lib/game/model';
import { frontTemplates } from '$lib/print/layout/templates';
import { NewKindSchema } from './kinds';

describe('the new-kind form', () => {
	it('accepts a kind with its usual layout, which comes first', () => {
		const input = { name: 'Sprint cards', type: 'movement' as const, size: cardSize('poker'), bleed: 'us' as const, template: 'movement' };
		expect(NewKindSchema.safeParse(input).success).toBe(true);
		expect(frontTemplates('tile')[0].id).toBe('tile-front');
	});

	it('refuses a layout that draws another type of card', () => {
		const r = NewKindSchema.safeParse({ name: 'Odd', type: 'wager', size: cardSize('bridge'), bleed: 'metric', template: 'movement' });
		expect(r.success).toBe(false);
	});
});
