import { it } from 'vitest';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { stringify } from 'devalue';
import { CardKindSchema, CardSchema } from '$lib/game/model';
import { demoGame } from '$lib/game/demo';

it('scratch', async () => {
	const g = demoGame();
	const c = g.cards[0];
	const fd = new FormData();
	fd.set('__superform_json', stringify({ ...c, copies: 5, version: 1 }));
	fd.set('__superform_id', 'card');
	const f3 = await superValidate(new Request('http://x/', { method: 'POST', body: fd }), zod4(CardSchema));
	console.log(JSON.stringify(f3.data), f3.id);
	const k = g.kinds[5];
	const fd2 = new FormData();
	fd2.set('__superform_json', stringify({ ...k, params: { ...k.params, foo: 3 } }));
	const f4 = await superValidate(new Request('http://x/', { method: 'POST', body: fd2 }), zod4(CardKindSchema));
	console.log(f4.valid, JSON.stringify(f4.data));
});
