/** The words the card-kind pages show for the model's values. */
import { MM_PER_INCH, type BetType, type BleedStandard, type CardKindType, type TileRole } from './model';

export const KIND_TYPE_LABEL: Record<CardKindType, string> = {
	movement: 'Movement',
	rogue: 'Rogue',
	wager: 'Wager',
	setup: 'Setup',
	modifier: 'Modifier',
	custom: 'Custom',
	tile: 'Track tile'
};

export const BLEED_LABEL: Record<BleedStandard, string> = {
	metric: '3 mm each side (metric)',
	us: `1/8 in = ${MM_PER_INCH / 8} mm each side (US)`
};

export const BET_LABEL: Record<BetType, string> = {
	stage: 'Leads the stage',
	winner: 'Wins the race',
	loser: 'Comes last'
};

export const TILE_ROLE_LABEL: Record<TileRole, string> = { start: 'Start', normal: 'Track', finish: 'Finish' };

/** Millimetres as people read them: at most 3 decimals, no trailing zeros. */
export const mm = (value: number) => String(Math.round(value * 1000) / 1000);
