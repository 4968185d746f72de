import { describe, expect, it } from 'vitest';
import { activityLine } from './activity-lines';

const g = 'game-1';

describe('activity lines', () => {
	it('say what happened to a proof and link to it', () => {
		expect(activityLine({ action: 'proof.cut', detail: { number: 3, description: 'second round' } }, g)).toEqual({
			text: 'cut proof 3: second round',
			href: '/games/game-1/proofs/3',
			group: 'proofs'
		});
		expect(activityLine({ action: 'proof.verdict', detail: { proof: 3, verdict: 'changes' } }, g).text).toBe('asked for changes to proof 3');
		expect(activityLine({ action: 'proof.withdrawn', detail: { proof: 2, note: 'wrong bleed' } }, g).text).toBe(
			'withdrew the release of proof 2: wrong bleed'
		);
	});

	it('link a comment to its thread', () => {
		const line = activityLine({ action: 'comment.pinned', detail: { proof: 1, cardId: 'mv-1', commentId: 'c-9' } }, g, () => 'Fern 2');
		expect(line.text).toBe('pinned a comment on proof 1 (Fern 2)');
		expect(line.href).toBe('/games/game-1/proofs/1?comment=c-9');
		expect(line.group).toBe('comments');
	});

	it('name downloads, saves and unknown actions', () => {
		expect(activityLine({ action: 'print.downloaded', detail: { what: 'press:mv-1', proof: 4 } }, g).text).toBe('downloaded the press PDF of mv-1 of proof 4');
		expect(activityLine({ action: 'print.downloaded', detail: { what: 'sheets' } }, g).text).toBe('downloaded the sheet PDF of the working copy');
		expect(activityLine({ action: 'moneyTable.saved', detail: { changes: 1 } }, g).text).toBe('saved a money table');
		expect(activityLine({ action: 'tile.flipped', detail: {} }, g).text).toBe('tile flipped');
	});
});
