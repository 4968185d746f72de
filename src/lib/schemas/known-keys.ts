import { z } from 'zod';

/**
 * A form's value cut down to the keys its schema knows. A form over a union (a card's data, a
 * kind's back) holds the fields of every member at once, while the schemas refuse keys they do not
 * know; this keeps, at every depth, only the keys of the member the value is. Values are not checked
 * or changed here: parse the result with the same schema.
 */
export function knownKeysOnly(schema: z.ZodType, value: unknown): unknown {
	const def = schema._zod.def as unknown as Record<string, unknown> & { type: string };
	switch (def.type) {
		case 'optional':
		case 'nullable':
		case 'default':
		case 'prefault':
		case 'readonly':
		case 'nonoptional':
		case 'catch':
			return knownKeysOnly(def.innerType as z.ZodType, value);
		case 'pipe':
			return knownKeysOnly(def.in as z.ZodType, value);
		case 'array':
			return Array.isArray(value) ? value.map((v) => knownKeysOnly(def.element as z.ZodType, v)) : value;
		case 'object': {
			if (!isPlainObject(value)) return value;
			const shape = def.shape as Record<string, z.ZodType>;
			// An open object (a catch-all other than "never") keeps the keys it does not name.
			const open = def.catchall !== undefined && (def.catchall as z.ZodType)._zod.def.type !== 'never';
			return Object.fromEntries(
				Object.entries(value)
					.filter(([k]) => k in shape || open)
					.map(([k, v]) => [k, k in shape ? knownKeysOnly(shape[k], v) : v])
			);
		}
		case 'union': {
			if (!isPlainObject(value)) return value;
			const options = def.options as z.ZodType[];
			const key = def.discriminator as string | undefined;
			const member = key
				? options.find((o) => (o._zod as { propValues?: Record<string, Set<unknown>> }).propValues?.[key]?.has(value[key]))
				: options.find((o) => o.safeParse(knownKeysOnly(o, value)).success);
			return member ? knownKeysOnly(member, value) : value;
		}
		default:
			return value;
	}
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
	return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/**
 * The schema a form over `schema` validates with, on the server and in the browser: the form's extra
 * union fields are cut first, then the strict check runs as for the API.
 */
export function formSchema<S extends z.ZodType>(schema: S) {
	return z.preprocess((value) => knownKeysOnly(schema, value), schema);
}
