/**
 * What the odds API answers (and the Odds tab shows): a stage's or whole races' odds with the
 * game's wager cards priced, and the job view of a large run.
 */
import type { StageReport } from './report';
import type { WagerPrice } from './wagers';

/** A wager card priced: the engine's own shape, also as the API answers it. */
export type WagerLine = WagerPrice;

export type StageAnswer = StageReport & { kind: 'stage'; target: number; wagers: WagerLine[] };
export interface RaceAnswer {
	kind: 'race';
	method: 'monte-carlo';
	samples: number;
	seed: number;
	players: number;
	/** Place odds at the end of a stage (over all stages played) and at race end. */
	stage: Record<string, number[]>;
	race: Record<string, number[]>;
	raceStandardErrors: Record<string, number[]>;
	stages: { stages: number; probability: number }[];
	meanStages: number;
	unfinished: number;
	target: number;
	wagers: WagerLine[];
	ms?: number;
}
export type OddsAnswer = StageAnswer | RaceAnswer;

export interface JobView {
	id: string;
	state: 'queued' | 'running' | 'done' | 'failed' | 'cancelled';
	done: number;
	total: number;
	error?: string;
	result?: OddsAnswer;
}

