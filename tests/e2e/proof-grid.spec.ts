/**
 * The proof viewer as a grid of the proof's own faces: filters by kind, review state and change
 * since the proof before (the count says how many match, the URL holds the view), one card
 * opened large with its pins and walked with the arrow keys, the grid at phone width; and the
 * compare page between two proofs cut around a change made here, with its field table and the
 * pixel-difference image (pixelmatch, decoded here by jimp, an independent PNG reader).
 */
import { test, expect, type Page } from '@playwright/test';
import { hydrated, signIn, signInNewBrowser, demoGameId } from './helpers';

// A step that cannot happen fails at its own line instead of using up the whole test's time.
test.use({ actionTimeout: 30_000 });

const SHOTS = process.env.E2E_SHOTS;
async function shot(page: Page, name: string) {
	if (SHOTS) await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
}

interface Card {
	id: string;
	name: string;
	version: number;
	data: { type: string; steps?: number };
}

async function cut(page: Page, gameId: string, description: string) {
	const res = await page.request.post(`/api/v1/games/${gameId}/proofs`, { data: { description }, headers: { origin: new URL(page.url()).origin } });
	expect(res.status()).toBe(201);
	return (await res.json()) as { id: string; number: number };
}

async function saveCard(page: Page, gameId: string, card: Card) {
	// The list adds the kind for reading; a save sends the card's own fields only.
	const { kind: _kind, kindName: _kindName, ...own } = card as Card & { kind?: unknown; kindName?: unknown };
	const res = await page.request.put(`/api/v1/games/${gameId}/cards/${encodeURIComponent(card.id)}`, {
		data: own,
		headers: { origin: new URL(page.url()).origin }
	});
	expect(res.status(), await res.text()).toBe(200);
	return (await res.json()).card as Card;
}

test('proof grid: filters, a card large with pins, arrow keys, a shareable link, compare, phone width', async ({ page, browser }) => {
	test.setTimeout(240_000);
	await page.setViewportSize({ width: 1280, height: 900 });
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);

	// Two proofs around one change: a movement card's steps.
	const { cards } = (await (await page.request.get(`/api/v1/games/${gameId}/cards`)).json()) as { cards: Card[] };
	const original = cards.find((c) => c.data.type === 'movement')!;
	const before = await cut(page, gameId, 'Grid test: before');
	const stepsBefore = original.data.steps!;
	const stepsAfter = stepsBefore === 1 ? 2 : 1;
	const changed = await saveCard(page, gameId, { ...original, data: { ...original.data, steps: stepsAfter } });
	const after = await cut(page, gameId, 'Grid test: after');
	try {
		// A pin on the changed card, to see it in the large view.
		const pinned = await page.request.post(`/api/v1/games/${gameId}/proofs/${after.id}/comments`, {
			data: { cardId: original.id, side: 'front', xMm: 20, yMm: 30, body: 'Check the step number after the change.' },
			headers: { origin: new URL(page.url()).origin }
		});
		expect(pinned.status()).toBe(201);

		await page.goto(`/games/${gameId}/proofs/${after.number}`);
		await hydrated(page);
		const count = page.getByTestId('match-count');
		await expect(count).toContainText(`${cards.length} of ${cards.length} cards match`);
		const thumbs = page.getByTestId('card-thumb');
		await expect(thumbs).toHaveCount(cards.length);
		// Thumbnails are the proof's own faces, with the card's name and values as their text.
		const src = await thumbs.first().locator('img').getAttribute('src');
		expect(src).toMatch(new RegExp(`^/api/v1/games/${gameId}/proofs/${after.id}/cards/.+/face\\.svg$`));
		expect(await thumbs.first().locator('img').getAttribute('loading')).toBe('lazy');

		// Changed since the proof before: just the card changed here.
		await page.getByLabel(`Since proof ${before.number}`).selectOption('changed');
		await expect(count).toContainText(`1 of ${cards.length} cards match`);
		await expect(thumbs).toHaveCount(1);
		await expect(thumbs.first()).toContainText(original.name);
		await expect(thumbs.first()).toContainText(`changed since ${before.number}`);
		await expect(thumbs.first()).toContainText('1 open');
		await expect(page).toHaveURL(/[?&]changed=changed/);
		await shot(page, 'proof-grid-filtered');

		// Review state: the pinned card is the one with open comments.
		await page.getByLabel(`Since proof ${before.number}`).selectOption('');
		await page.getByLabel('Review').selectOption('open');
		await expect(count).toContainText(`1 of ${cards.length} cards match`);
		await page.getByLabel('Review').selectOption('quiet');
		await expect(count).toContainText(`${cards.length - 1} of ${cards.length} cards match`);
		await page.getByLabel('Review').selectOption('');

		// Kind: the count in each option is what the filter would leave.
		const kindSelect = page.getByTestId('card-filters').locator('select').first();
		const kindOption = kindSelect.locator('option').nth(1);
		const kindCount = Number((await kindOption.textContent())!.match(/\((\d+)\)/)![1]);
		await kindSelect.selectOption({ index: 1 });
		await expect(count).toContainText(`${kindCount} of ${cards.length} cards match`);
		await expect(thumbs).toHaveCount(kindCount);
		await kindSelect.selectOption('');

		// Open the changed card large: both faces, the pin, the changed field.
		await page.getByLabel(`Since proof ${before.number}`).selectOption('changed');
		await thumbs.first().click();
		const large = page.getByTestId('card-large');
		await expect(large).toBeVisible();
		await expect(page).toHaveURL(new RegExp(`[?&]card=${encodeURIComponent(original.id)}`));
		await expect(large.getByRole('heading', { name: original.name })).toBeVisible();
		await expect(large.getByRole('button', { name: /^Comment 1 on the front of / })).toBeVisible();
		const fields = large.getByRole('table', { name: new RegExp(`Fields changed on`) });
		await expect(fields).toContainText('steps');
		await expect(fields).toContainText(String(stepsAfter));
		const frontAlt = await large.locator('img').first().getAttribute('alt');
		expect(frontAlt).toContain(`Front of ${original.name}`);
		expect(frontAlt).toContain(`Steps ${stepsAfter}`);
		await expect(large.locator('img').nth(1)).toHaveAttribute('alt', `Back of ${original.name}`);
		await expect
			.poll(() => large.locator('img').first().evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0), { timeout: 30_000 })
			.toBe(true);
		await shot(page, 'proof-card-large');

		// Shareable: the link opens the same view in a fresh page.
		const link = page.url();
		const other = await page.context().newPage();
		await other.goto(link);
		await hydrated(other);
		await expect(other.getByTestId('card-large').getByRole('heading', { name: original.name })).toBeVisible();
		await expect(other.getByTestId('match-count')).toContainText(`1 of ${cards.length} cards match`);
		await other.close();

		// Arrow keys walk every card once the filters are off; Escape goes back to the grid.
		await page.getByRole('button', { name: 'Show every card' }).click();
		const position = page.getByTestId('card-position');
		const at = Number((await position.textContent())!.split(' of ')[0]);
		await page.keyboard.press('ArrowRight');
		await expect(position).toHaveText(`${(at % cards.length) + 1} of ${cards.length}`);
		await page.keyboard.press('ArrowLeft');
		await expect(position).toHaveText(`${at} of ${cards.length}`);
		await page.getByRole('button', { name: 'Next card' }).click();
		await expect(position).toHaveText(`${(at % cards.length) + 1} of ${cards.length}`);
		await page.keyboard.press('Escape');
		await expect(large).toBeHidden();
		await expect(thumbs).toHaveCount(cards.length);
		await expect(page).not.toHaveURL(/[?&]card=/);

		// The compare page between the two proofs: the field and a pixel difference of the front.
		await page.goto(`/games/${gameId}/proofs/compare?a=${before.number}&b=${after.number}`);
		await hydrated(page);
		const item = page.getByTestId('changed').filter({ hasText: original.name });
		await expect(page.getByTestId('changed')).toHaveCount(1);
		const table = item.getByTestId('changed-fields');
		const row = table.getByRole('row').filter({ hasText: 'steps' });
		await expect(row.getByRole('cell').nth(0)).toHaveText(String(stepsBefore));
		await expect(row.getByRole('cell').nth(1)).toHaveText(String(stepsAfter));
		const diffImg = item.getByTestId('pixel-diff');
		await diffImg.scrollIntoViewIfNeeded();
		await expect.poll(() => diffImg.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0), { timeout: 60_000 }).toBe(true);
		await shot(page, 'proof-compare');
		const diff = await page.request.get(new URL((await diffImg.getAttribute('src'))!, page.url()).href);
		expect(diff.status()).toBe(200);
		expect(diff.headers()['content-type']).toBe('image/png');
		// pixelmatch marks changed pixels in the two marking colours (red lighter, blue darker): some must be there.
		const { Jimp } = await import('jimp');
		const image = await Jimp.read(Buffer.from(await diff.body()));
		const px = image.bitmap.data;
		let marked = 0;
		for (let i = 0; i < px.length; i += 4) {
			const [r, g, b] = [px[i], px[i + 1], px[i + 2]];
			if ((r === 214 && g === 40 && b === 40) || (r === 20 && g === 90 && b === 200)) marked++;
		}
		expect(marked).toBeGreaterThan(20);

		// Phone width: the grid reflows into columns that fit, nothing wider than the screen.
		const small = await signInNewBrowser(browser, 'reviewer@paddock.test', { viewport: { width: 390, height: 844 } });
		await small.goto(`/games/${gameId}/proofs/${after.number}`);
		await hydrated(small);
		const smallThumbs = small.getByTestId('card-thumb');
		await expect(smallThumbs.first()).toBeVisible();
		expect(await small.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
		const [a, b] = [(await smallThumbs.nth(0).boundingBox())!, (await smallThumbs.nth(1).boundingBox())!];
		expect(Math.abs(a.y - b.y)).toBeLessThan(2);
		expect(a.x + a.width).toBeLessThanOrEqual(390);
		await shot(small, 'proof-grid-390');
		await smallThumbs.first().click();
		await expect(small.getByTestId('card-large')).toBeVisible();
		expect(await small.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
		await small.context().close();
	} finally {
		await saveCard(page, gameId, { ...changed, data: { ...changed.data, steps: stepsBefore } });
	}
});

test('a printer cannot open an unreleased proof or its faces', async ({ page, browser }) => {
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);
	const proof = await cut(page, gameId, 'Not for the print shop yet');
	const { cards } = (await (await page.request.get(`/api/v1/games/${gameId}/cards`)).json()) as { cards: Card[] };
	// The printer in a browser of their own, so no answer still coming to the designer's page signs them in again.
	const printer = await signInNewBrowser(browser, 'printer@paddock.test');
	const view = await printer.goto(`/games/${gameId}/proofs/${proof.number}?card=x&changed=changed`);
	expect(view!.status()).toBe(404);
	const cardId = cards[0].id;
	const face = await printer.request.get(`/api/v1/games/${gameId}/proofs/${proof.id}/cards/${encodeURIComponent(cardId)}/face.svg`);
	expect(face.status()).toBe(404);
	await printer.context().close();
});
