/**
 * Every API route and form action × every role, plus anonymous callers and a member of another
 * team: the status each gets. The expected table follows the role list in the product brief.
 * Each area keeps its rows in role-rows/; new routes join there.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openWorld, EVERYONE, type World } from './harness';
import type { Row } from './role-table';
import * as foundation from './role-rows/foundation';
import * as gameData from './role-rows/game';
import * as gamePages from './role-rows/game-pages';
import * as proofRows from './role-rows/proofs';
import * as proofPages from './role-rows/proof-pages';
import * as printRows from './role-rows/printing';
import * as artRows from './role-rows/art';
import * as kindRows from './role-rows/kinds';
import * as securityRows from './role-rows/security';
import * as dailyRows from './role-rows/daily';
import * as publicRows from './role-rows/public-pages';
import * as coverageRows from './role-rows/coverage';
import * as oddsRows from './role-rows/odds';
import * as healthRows from './role-rows/health';
import * as pressRows from './role-rows/press';
import * as softProofRows from './role-rows/soft-proof';
import * as lifecycleRows from './role-rows/lifecycle';
import * as pressDefaultRows from './role-rows/press-default';
import * as historyRows from './role-rows/history';
import * as proofCompareRows from './role-rows/proof-compare';

const ROWS: Row[] = [...foundation.rows, ...gameData.rows, ...gamePages.rows, ...proofRows.rows, ...proofPages.rows, ...printRows.rows, ...printRows.pageRows, ...artRows.rows, ...kindRows.rows, ...dailyRows.rows, ...publicRows.rows, ...coverageRows.rows, ...oddsRows.rows, ...healthRows.rows, ...pressRows.rows, ...softProofRows.rows, ...lifecycleRows.rows, ...pressDefaultRows.rows, ...historyRows.rows, ...proofCompareRows.rows, ...foundation.lastRows];

let world: World;
beforeAll(async () => {
	world = await openWorld();
});
afterAll(async () => world?.close());

describe('role × route table', () => {
	for (const row of ROWS) {
		describe(row.route, () => {
			for (const who of EVERYONE) {
				const want = row.expect[who] ?? row.expect.default;
				it(`${who} → ${want}`, async () => {
					expect(await row.run(world, who)).toBe(want);
				});
			}
		});
	}
});
