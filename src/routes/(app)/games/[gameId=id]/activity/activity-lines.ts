/**
 * A line of the game's activity log in words: what happened and, where there is one, the page
 * it happened on. Unknown actions still read, from their own name.
 */
export type ActivityGroup = 'proofs' | 'comments' | 'files' | 'data';

export interface ActivityEntry {
	action: string;
	detail: Record<string, unknown>;
}

export interface ActivityLine {
	text: string;
	href?: string;
	group: ActivityGroup;
}

const COLLECTION_NAMES: Record<string, string> = {
	runner: 'a runner',
	moneyTable: 'a money table',
	kind: 'a card kind',
	card: 'a card',
	art: 'an art piece'
};

const DOWNLOADS: Record<string, string> = { sheets: 'the sheet PDF', pngs: 'the PNG zip' };

/** `cardName` turns a card id into the name people know it by (the id itself when unknown). */
export function activityLine(entry: ActivityEntry, gameId: string, cardName: (id: string) => string = (id) => id): ActivityLine {
	const d = entry.detail ?? {};
	const proof = typeof d.proof === 'number' ? d.proof : typeof d.number === 'number' ? d.number : null;
	const proofs = `/games/${gameId}/proofs`;
	const at = proof ? `${proofs}/${proof}` : undefined;
	const text = (s: unknown) => (typeof s === 'string' ? s : '');
	switch (entry.action) {
		case 'proof.cut':
			return { text: `cut proof ${proof}${text(d.description) ? `: ${text(d.description)}` : ''}`, href: at, group: 'proofs' };
		case 'proof.verdict':
			return { text: `${d.verdict === 'approve' ? 'approved' : 'asked for changes to'} proof ${proof}`, href: at, group: 'proofs' };
		case 'proof.released':
			return { text: `released proof ${proof} for printing`, href: at, group: 'proofs' };
		case 'proof.withdrawn':
			return { text: `withdrew the release of proof ${proof}${text(d.note) ? `: ${text(d.note)}` : ''}`, href: at, group: 'proofs' };
		case 'comment.pinned':
		case 'comment.replied':
		case 'comment.resolved': {
			const verb = { 'comment.pinned': 'pinned a comment on', 'comment.replied': 'replied to a comment on', 'comment.resolved': 'resolved a thread on' }[entry.action];
			const card = text(d.cardId) ? ` (${cardName(text(d.cardId))})` : '';
			const href = at && text(d.commentId) ? `${at}?comment=${text(d.commentId)}` : at;
			return { text: `${verb} proof ${proof}${card}`, href, group: 'comments' };
		}
		case 'print.downloaded': {
			const what = text(d.what);
			const file = DOWNLOADS[what] ?? (what.startsWith('press:') ? `the press PDF of ${cardName(what.slice(6))}` : 'a print file');
			return { text: `downloaded ${file} of ${proof ? `proof ${proof}` : 'the working copy'}`, href: at, group: 'files' };
		}
		case 'game.exported':
			return { text: 'exported the game bundle', group: 'files' };
		case 'game.imported':
			return { text: `imported the game${text(d.name) ? ` ${text(d.name)}` : ''}`, group: 'data' };
		case 'game.created':
			return { text: 'created the game', group: 'data' };
		case 'game.settings':
			return { text: 'changed the game settings', group: 'data' };
		case 'settings.restored':
			return { text: 'restored an earlier version of the game settings', group: 'data' };
		case 'art.uploaded':
			return { text: 'uploaded art', group: 'data' };
		case 'art.replaced':
			return { text: 'replaced art with a new version', group: 'data' };
	}
	const [thing, verb] = entry.action.split('.');
	if (thing in COLLECTION_NAMES && (verb === 'saved' || verb === 'deleted')) {
		const n = typeof d.changes === 'number' && d.changes > 1 ? ` (${d.changes} changes)` : '';
		return { text: `${verb} ${COLLECTION_NAMES[thing]}${n}`, group: 'data' };
	}
	return { text: entry.action.replace(/[._]/g, ' '), group: 'data' };
}
