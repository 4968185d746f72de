import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';

/** The process is up (liveness): no database or store is asked. */
export const GET: RequestHandler = () => json({ ok: true }, { headers: { 'cache-control': 'no-store' } });
