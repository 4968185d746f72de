/** The request the CLI and the API share: bad input refused with the limit named. */
import { describe, expect, it } from 'vitest';
import { OddsRequestSchema, runStage } from './report';
import { describeIssues } from './scenario';

const base = { finish: 12, stacks: [{ space: 2, bottomToTop: ['amber', 'teal'] }], deck: [{ runner: 'amber', steps: 1 }] };
const refusal = (body: unknown) => {
	const r = OddsRequestSchema.safeParse(body);
	expect(r.success).toBe(false);
	return describeIssues(r.error!).join('\n');
};

describe('odds requests', () => {
	it('accepts exact or samples with a seed', () => {
		expect(OddsRequestSchema.parse({ ...base, exact: true }).method).toEqual({ exact: true });
		expect(OddsRequestSchema.parse({ ...base, samples: 1000, seed: 7 }).method).toEqual({ samples: 1000, seed: 7 });
	});

	it('refuses bad input with a clear message', () => {
		expect(refusal({ ...base, deck: [{ runner: 'plum', steps: 1 }], exact: true })).toMatch(/“plum”, who is not on the track/);
		expect(refusal({ ...base, stacks: [...base.stacks, { space: 5, bottomToTop: ['amber'] }], exact: true })).toMatch(/in one stack only/);
		expect(refusal({ ...base, finish: -4, exact: true })).toMatch(/finish must be greater than 0/);
		expect(refusal({ ...base, samples: 1e9 })).toMatch(/at most 10,000,000/);
		expect(refusal({ ...base, deck: Array.from({ length: 40 }, () => ({ runner: 'teal', steps: 2 })), exact: true })).toMatch(/at most 12 cards; this deck has 40/);
		expect(refusal(base)).toMatch(/"exact": true or for "samples"/);
	});

	it('answers the shape the CLI prints', () => {
		const out = runStage(OddsRequestSchema.parse({ ...base, exact: true }).scenario, { exact: true });
		expect(out.method).toBe('exact');
		expect(out.samples).toBeNull();
		// amber moves 1 from under teal, carrying it: 3: [amber, teal]; teal 1st for sure.
		expect(out.stage).toEqual({ amber: [0, 1], teal: [1, 0] });
		const mc = runStage(OddsRequestSchema.parse({ ...base, samples: 500, seed: 3 }).scenario, { samples: 500, seed: 3 });
		expect(mc).toMatchObject({ method: 'monte-carlo', samples: 500, seed: 3 });
	});
});
