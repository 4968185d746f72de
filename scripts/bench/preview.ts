/**
 * Live preview: time from a keystroke in the card editor (the input event) to the new face in the
 * page, in Debian's chromium driven by Playwright against the built server. Typing a movement
 * card's name (printed on its face) and stepping a wager's tier (its payout rows); every key
 * waits for its own redraw. Reported to the DOM change and to the next frame after it, with any
 * request the page made while typing (there should be none). Target: median under 50 ms.
 *
 * Run alone: `npx tsx scripts/bench/preview.ts` (port BENCH_PREVIEW_PORT, default 4433).
 */
import { cpus, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { chromium, type Page } from '@playwright/test';
import { CHROMIUM, CHROMIUM_ARGS } from '../../tests/e2e/env';
import { signIn as apiSignIn, startServer } from './server';

const TARGET_MS = 50;
/** Every key changes the printed name (a space at the end would not: names are trimmed). */
const NAME = 'Quillon-Dewdrop';

const round = (v: number) => Math.round(v * 10) / 10;
const quantile = (xs: number[], q: number) => {
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.min(s.length - 1, Math.floor(q * s.length))];
};

/**
 * In the page: note each input event's time and when the front face next changes (and the frame
 * after it). A string, so the TypeScript loader's helpers do not leak into the page.
 */
const WATCH = `(() => {
	window.__keys = [];
	const front = () => document.querySelector('[data-testid="card-preview"] svg');
	let seen = front()?.outerHTML;
	for (const el of document.querySelectorAll('form input, form textarea'))
		el.addEventListener('input', (e) => window.__keys.push({ input: e.timeStamp }), true);
	new MutationObserver(() => {
		const now = performance.now();
		const html = front()?.outerHTML;
		const last = window.__keys.at(-1);
		if (html === seen || !last || last.dom !== undefined) return;
		seen = html;
		last.dom = now;
		requestAnimationFrame(() => setTimeout(() => (last.frame = performance.now())));
	}).observe(document.querySelector('[data-testid="card-preview"]'), { subtree: true, childList: true, characterData: true, attributes: true });
})()`;

type Key = { input: number; dom: number; frame: number };
const READY = `document.documentElement.dataset.ready === 'yes'`;
const keysSoFar = (page: Page) => page.evaluate('window.__keys') as Promise<Key[]>;

async function keyTimes(page: Page, press: () => Promise<void>) {
	const before = (await keysSoFar(page)).length;
	await press();
	await page.waitForFunction(`window.__keys.length > ${before}`, undefined, { timeout: 10_000 });
	try {
		await page.waitForFunction(`window.__keys.at(-1).frame !== undefined`, undefined, { timeout: 3_000 });
	} catch {
		// A key that leaves the face as it was (a space a name is trimmed of) has nothing to time.
		await page.evaluate('window.__keys.pop()');
	}
}

async function openCard(page: Page, base: string, gameId: string, cardId: string, kindId: string) {
	await page.goto(`${base}/games/${gameId}/kinds/${kindId}?card=${cardId}`);
	await page.waitForFunction(READY);
	await page.locator('[data-testid="card-preview"] svg').first().waitFor();
	// The page's own loads (its fonts, the art) are over before anyone types.
	await page.waitForLoadState('networkidle');
	await page.evaluate('document.fonts.ready.then(() => undefined)');
	await page.evaluate(WATCH);
}

export async function benchPreview() {
	const port = Number(process.env.BENCH_PREVIEW_PORT ?? 4433);
	const server = await startServer(port);
	const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
	try {
		const session = await apiSignIn(server.url);
		const typed = (await (await fetch(`${server.url}/api/v1/games/${session.gameId}/cards`, { headers: session.headers })).json()) as {
			cards: { id: string; kindId: string; kind: string }[];
		};
		const movement = typed.cards.find((c) => c.kind === 'movement')!;
		const wager = typed.cards.find((c) => c.kind === 'wager')!;

		const context = await browser.newContext({ baseURL: server.url });
		const page = await context.newPage();
		page.on('dialog', (d) => void d.accept());
		await page.goto('/signin');
		await page.waitForFunction(READY);
		await page.getByLabel('E-mail').fill('designer@paddock.test');
		await page.getByLabel('Password').fill('paddock-demo');
		await page.getByRole('button', { name: 'Sign in' }).click();
		await page.waitForURL(`${server.url}/`);

		const requests: string[] = [];
		await openCard(page, server.url, session.gameId, movement.id, movement.kindId);
		page.on('request', (r) => requests.push(r.url()));
		const name = page.getByRole('textbox', { name: /^Card name/ });
		await name.click();
		await name.press('End');
		const length = (await name.inputValue()).length;
		for (let i = 0; i < length; i++) await keyTimes(page, () => name.press('Backspace'));
		for (const ch of NAME) await keyTimes(page, () => name.press(ch));
		const nameKeys = await keysSoFar(page);

		page.removeAllListeners('request');
		await openCard(page, server.url, session.gameId, wager.id, wager.kindId);
		page.on('request', (r) => requests.push(r.url()));
		const tier = page.getByRole('spinbutton', { name: /^Tier/ });
		await tier.click();
		for (let i = 0; i < 10; i++) await keyTimes(page, () => tier.press(i % 2 ? 'ArrowDown' : 'ArrowUp'));
		const tierKeys = await keysSoFar(page);
		await context.close();

		const keys = [...nameKeys, ...tierKeys];
		const dom = keys.map((k) => k.dom - k.input);
		const frame = keys.map((k) => k.frame - k.input);
		const result = {
			keystrokes: keys.length,
			toDomMs: { median: round(quantile(dom, 0.5)), p95: round(quantile(dom, 0.95)), max: round(Math.max(...dom)) },
			toNextFrameMs: { median: round(quantile(frame, 0.5)), p95: round(quantile(frame, 0.95)), max: round(Math.max(...frame)) },
			requestsWhileTyping: requests.length,
			targetMs: TARGET_MS,
			met: quantile(dom, 0.5) < TARGET_MS && requests.length === 0,
			loadAverage: round(loadavg()[0]),
			cpus: cpus().length
		};
		console.log('\nLive preview: keystroke (input event) → new face in the page, chromium');
		console.log(`  ${result.keystrokes} keystrokes (a movement card's name, a wager's tier); machine load ${result.loadAverage} on ${result.cpus} CPUs`);
		console.log(`  to the DOM:        median ${result.toDomMs.median} ms, p95 ${result.toDomMs.p95} ms, max ${result.toDomMs.max} ms`);
		console.log(`  to the next frame: median ${result.toNextFrameMs.median} ms, p95 ${result.toNextFrameMs.p95} ms, max ${result.toNextFrameMs.max} ms`);
		console.log(`  requests while typing: ${result.requestsWhileTyping}`);
		console.log(`  target: median < ${TARGET_MS} ms with no request → ${result.met ? 'met' : 'NOT met'}`);
		return result;
	} finally {
		await browser.close();
		await server.stop();
	}
}

if (process.argv[1] === fileURLToPath(import.meta.url)) await benchPreview();
