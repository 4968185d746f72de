/**
 * The stage scenario the odds lab takes from the CLI, the API and the Odds tab: where everyone
 * stands, the rogue, the modifiers on the track, the rules and the cards still to come this stage.
 * Every order of `deck` is equally likely. Runner ids are free strings; a runner is known when it
 * stands in one of the stacks.
 */
import { z } from 'zod';
import { RaceRulesSchema } from '../game/model';

/** Largest deck enumerated exactly: 12 distinct cards are 479,001,600 orders before memoising. */
export const EXACT_MAX_CARDS = 12;
/** Most Monte Carlo samples one run may ask for (about 10 s on two cores). */
export const MAX_SAMPLES = 10_000_000;
/** Runners on the track, rogue included (the game model allows 8 ranked runners). */
export const MAX_TRACK_RUNNERS = 9;
export const MAX_FINISH = 250;
export const MAX_DECK_CARDS = 200;
export const MAX_MODIFIERS = 30;
export const MAX_STEPS = 20;

const RunnerIdSchema = z.string().trim().min(1).max(60);

export const StackSchema = z.strictObject({
	space: z.int().min(0, 'A stack stands on space 0 (behind the start) or further'),
	bottomToTop: z.array(RunnerIdSchema).min(1, 'A stack holds at least one runner').max(MAX_TRACK_RUNNERS)
});

export const ScenarioCardSchema = z.strictObject({
	runner: RunnerIdSchema,
	steps: z.int().min(1, 'A card moves at least 1 step').max(MAX_STEPS, `A card moves at most ${MAX_STEPS} steps`)
});
export type ScenarioCard = z.infer<typeof ScenarioCardSchema>;

export const ModifierSchema = z.strictObject({
	space: z.int().min(1, 'A modifier stands on space 1 or further'),
	steps: z
		.int()
		.min(-MAX_STEPS)
		.max(MAX_STEPS)
		.refine((s) => s !== 0, 'A modifier moves a group at least one space')
});

export const ScenarioSchema = z
	.strictObject({
		finish: z
			.int('finish must be a whole number')
			.min(1, 'finish must be greater than 0')
			.max(MAX_FINISH, `finish must be at most ${MAX_FINISH}`),
		stacks: z.array(StackSchema).min(1, 'Place at least one runner').max(MAX_TRACK_RUNNERS),
		rogue: z.strictObject({ runner: RunnerIdSchema }).optional(),
		modifiers: z.array(ModifierSchema).max(MAX_MODIFIERS, `At most ${MAX_MODIFIERS} modifiers`).default([]),
		rules: RaceRulesSchema.default({ rogueCarryBonus: 1, modifiersOneUse: true, backUnder: true }),
		deck: z.array(ScenarioCardSchema).max(MAX_DECK_CARDS, `A stage deck holds at most ${MAX_DECK_CARDS} cards`)
	})
	.superRefine((s, ctx) => {
		const finishOk = Number.isInteger(s.finish) && s.finish >= 1;
		const where = new Map<string, number>();
		const spaces = new Set<number>();
		s.stacks.forEach((stack, i) => {
			if (spaces.has(stack.space))
				ctx.addIssue({ code: 'custom', path: ['stacks', i, 'space'], message: `Two stacks stand on space ${stack.space}; make them one` });
			spaces.add(stack.space);
			if (finishOk && stack.space >= s.finish)
				ctx.addIssue({
					code: 'custom',
					path: ['stacks', i, 'space'],
					message: `Space ${stack.space} is at or past the finish (${s.finish}): the race would already be over`
				});
			stack.bottomToTop.forEach((runner, j) => {
				if (where.has(runner))
					ctx.addIssue({
						code: 'custom',
						path: ['stacks', i, 'bottomToTop', j],
						message: `Runner “${runner}” stands in two places; a runner is in one stack only`
					});
				where.set(runner, i);
			});
		});
		if (where.size > MAX_TRACK_RUNNERS)
			ctx.addIssue({ code: 'custom', path: ['stacks'], message: `At most ${MAX_TRACK_RUNNERS} runners on the track` });
		if (s.rogue && !where.has(s.rogue.runner))
			ctx.addIssue({ code: 'custom', path: ['rogue', 'runner'], message: `The rogue “${s.rogue.runner}” is not on the track` });
		const ranked = [...where.keys()].filter((r) => r !== s.rogue?.runner).length;
		if (ranked < 1) ctx.addIssue({ code: 'custom', path: ['stacks'], message: 'Place at least one runner besides the rogue' });
		const modSpaces = new Set<number>();
		s.modifiers.forEach((m, i) => {
			if (finishOk && m.space >= s.finish)
				ctx.addIssue({ code: 'custom', path: ['modifiers', i, 'space'], message: `A modifier on space ${m.space} is at or past the finish` });
			if (modSpaces.has(m.space))
				ctx.addIssue({ code: 'custom', path: ['modifiers', i, 'space'], message: `Two modifiers on space ${m.space}` });
			modSpaces.add(m.space);
		});
		s.deck.forEach((card, i) => {
			if (!where.has(card.runner))
				ctx.addIssue({
					code: 'custom',
					path: ['deck', i, 'runner'],
					message: `Card ${i + 1} moves “${card.runner}”, who is not on the track`
				});
		});
	});
/** What a caller sends (defaults not yet filled in). */
export type ScenarioInput = z.input<typeof ScenarioSchema>;
/** A checked scenario, defaults filled in. */
export type Scenario = z.infer<typeof ScenarioSchema>;

/** How to compute: every order, or a seeded sample. */
export const MethodSchema = z.union([
	z.strictObject({ exact: z.literal(true) }),
	z.strictObject({
		samples: z
			.int('samples must be a whole number')
			.min(1, 'samples must be at least 1')
			.max(MAX_SAMPLES, `samples must be at most ${MAX_SAMPLES.toLocaleString('en-GB')}`),
		seed: z.int().min(0).max(0xffffffff).optional()
	})
]);
export type Method = z.infer<typeof MethodSchema>;

/** Refusal for a deck too large to enumerate, naming the limit. */
export function exactLimitMessage(cards: number): string {
	return `Exact odds enumerate at most ${EXACT_MAX_CARDS} cards; this deck has ${cards}. Ask for samples instead.`;
}

/** Ranked runners in a stable order: bottom to top of each stack, stacks in the order given. */
export function rankedRunners(s: Scenario): string[] {
	return s.stacks.flatMap((st) => st.bottomToTop).filter((r) => r !== s.rogue?.runner);
}

/** Zod issues as one readable line each (`deck.3.runner: …`). */
export function describeIssues(error: z.ZodError): string[] {
	return error.issues.map((i) => (i.path.length ? `${i.path.join('.')}: ${i.message}` : i.message));
}
