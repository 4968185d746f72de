import type { ParamMatcher } from '@sveltejs/kit';
import { COLLECTION_SEGMENTS } from '$lib/schemas/collections';

/** The game-object collections as they appear in API paths. */
export const match: ParamMatcher = (param) => param in COLLECTION_SEGMENTS;
