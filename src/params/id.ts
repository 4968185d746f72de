import type { ParamMatcher } from '@sveltejs/kit';
import { isUuid } from '$lib/schemas/ids';

/** Ids are UUIDs; anything else is not a route. */
export const match: ParamMatcher = isUuid;
