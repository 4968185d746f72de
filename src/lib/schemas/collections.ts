/** URL segments of a game's object collections, and which permission edits each. */
export const COLLECTION_SEGMENTS = {
	runners: 'runner',
	'money-tables': 'moneyTable',
	kinds: 'kind',
	cards: 'card',
	art: 'art'
} as const;

export type CollectionSegment = keyof typeof COLLECTION_SEGMENTS;
/** A collection as the database names it. */
export type Collection = (typeof COLLECTION_SEGMENTS)[CollectionSegment];
