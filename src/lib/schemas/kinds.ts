/** The new-kind form: shared by the kinds page, its action and the API. */
import { z } from 'zod';
import { CardKindSchema } from '$lib/game/model';
import { frontTemplates } from '$lib/print/layout/templates';

/** The settings a designer picks first; the rest starts from the layouts. */
export const NewKindSchema = CardKindSchema.pick({ name: true, type: true, size: true, bleed: true, template: true }).superRefine(
	(k, ctx) => {
		if (!frontTemplates(k.type).some((t) => t.id === k.template))
			ctx.addIssue({ code: 'custom', path: ['template'], message: `That layout does not draw ${k.type} cards` });
	}
);
export type NewKind = z.infer<typeof NewKindSchema>;
