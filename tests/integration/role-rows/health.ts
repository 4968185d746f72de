/** Rows of the role × route table: health and readiness answer everyone, signed in or not. */
import type { Row } from '../role-table';
import { as } from '../role-table';
import { statusOf } from '../harness';
import * as healthz from '../../../src/routes/healthz/+server';
import * as readyz from '../../../src/routes/readyz/+server';

export const rows: Row[] = [
	{ route: 'GET /healthz', run: (w, who) => statusOf(() => healthz.GET(as(w, who))), expect: { default: 200 } },
	{ route: 'GET /readyz', run: (w, who) => statusOf(() => readyz.GET(as(w, who))), expect: { default: 200 } }
];
