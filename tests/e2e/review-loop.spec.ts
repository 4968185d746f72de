/**
 * The whole review loop, each person in a browser context of their own: the designer cuts a
 * proof; the reviewer follows the e-mail, pins a comment on a card; the designer sees it arrive
 * without reloading, replies and resolves; the reviewer approves; the designer releases; the
 * printer follows the release e-mail and downloads the sheet PDF, which poppler's pdfinfo reads.
 * E-mail is caught by the instance and read by its recipient on their own "Caught mail" page.
 */
import { test, expect, type Browser, type Page } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hydrated, signInNewBrowser, demoGameId } from './helpers';

const person = (browser: Browser, email: string) => signInNewBrowser(browser, email, { viewport: { width: 1280, height: 900 } });

/** The path of the first link in the newest caught message to `to` that contains `text`, read by its recipient. */
async function mailLink(recipient: Page, to: string, text: string) {
	let href: string | null = null;
	await expect(async () => {
		await recipient.goto('/mail');
		const message = recipient
			.getByTestId('mail')
			.filter({ hasText: text })
			.filter({ has: recipient.getByTestId('mail-to').getByText(to, { exact: true }) })
			.first();
		await expect(message).toBeVisible({ timeout: 1000 });
		href = await message.getByRole('link').first().getAttribute('href');
	}).toPass({ timeout: 20_000 });
	const url = new URL(href!);
	return url.pathname + url.search;
}

test('cut, pin, reply, resolve, approve, release, print', async ({ browser }) => {
	test.setTimeout(240_000);
	const description = `Review loop ${Date.now()}`;

	// The designer cuts a proof and opens it.
	const designer = await person(browser, 'designer@paddock.test');
	const gameId = await demoGameId(designer);
	await designer.goto(`/games/${gameId}/proofs`);
	await hydrated(designer);
	await designer.getByLabel('What is this proof for?').fill(description);
	await designer.getByRole('button', { name: 'Cut the proof' }).click();
	const cut = designer.getByRole('status').filter({ hasText: 'is cut' });
	await expect(cut).toBeVisible();
	const number = Number((await cut.textContent())!.match(/Proof (\d+)/)![1]);
	await expect(designer.getByTestId('proofs')).toContainText(description);
	await cut.getByRole('link', { name: `Open proof ${number}` }).click();
	await expect(designer.getByRole('heading', { name: `Proof ${number}: ${description}` })).toBeVisible();
	await hydrated(designer);
	await expect(designer.getByTestId('threads')).toBeAttached();
	// Marks this very page: a reload would lose it.
	await designer.evaluate(() => ((window as unknown as { stayed: string }).stayed = 'yes'));

	// The reviewer reads the "proof ready" e-mail (caught, on their own mail page) and follows it.
	const reviewer = await person(browser, 'reviewer@paddock.test');
	const reviewLink = await mailLink(reviewer, 'reviewer@paddock.test', description);
	expect(reviewLink).toBe(`/games/${gameId}/proofs/${number}`);
	await reviewer.goto(reviewLink);
	await hydrated(reviewer);
	await expect(reviewer.getByTestId('threads')).toBeAttached();

	// Open the first card large from the grid of thumbnails, then pin at the middle of its front.
	await reviewer.getByTestId('card-thumb').first().click();
	await expect(reviewer.getByTestId('card-large')).toBeVisible();
	const face = reviewer.getByRole('button', { name: /^Pin a comment on the front of / }).first();
	await face.scrollIntoViewIfNeeded();
	const box = (await face.boundingBox())!;
	await face.click({ position: { x: box.width / 2, y: box.height / 2 } });
	const form = reviewer.getByTestId('pin-form');
	await expect(form).toBeVisible();
	// The demo's first card is a poker card, 63.5 × 88.9 mm trim (2.5 × 3.5 in, common practice), with
	// the metric bleed of 3 mm a side (common practice): its face box is 69.5 × 94.9 mm.
	const across = Number(await form.getByLabel('Across (mm)').inputValue());
	const down = Number(await form.getByLabel('Down (mm)').inputValue());
	expect(Math.abs(across - 69.5 / 2)).toBeLessThan(0.5);
	expect(Math.abs(down - 94.9 / 2)).toBeLessThan(0.5);

	// Bad input: an empty comment is refused, and the refusal is shown in the form.
	await form.getByRole('button', { name: 'Pin the comment' }).click();
	await expect(form.getByRole('alert')).toHaveText('Write something in the comment');
	// A spot outside the face is refused too.
	await form.getByLabel('Across (mm)').fill('120');
	await form.getByLabel('Comment', { exact: true }).fill('The runner disc crowds the step number.');
	await form.getByRole('button', { name: 'Pin the comment' }).click();
	await expect(form.getByRole('alert')).toContainText('The pin is outside the card');
	await form.getByLabel('Across (mm)').fill(String(across));
	await form.getByRole('button', { name: 'Pin the comment' }).click();
	await expect(form).toBeHidden();
	await expect(reviewer.getByTestId('thread').filter({ hasText: 'The runner disc crowds the step number.' })).toBeVisible();
	await expect(reviewer.getByRole('button', { name: /^Comment 1 on the front of / })).toBeVisible();

	// The designer sees it appear without reloading: the list, the count on the card's thumbnail and,
	// opening the card from the thread, the pin on the card.
	const thread = designer.getByTestId('thread').filter({ hasText: 'The runner disc crowds the step number.' });
	await expect(thread).toBeVisible({ timeout: 15_000 });
	await expect(designer.getByTestId('card-thumb').first()).toContainText('1 open');
	await thread.getByRole('button', { name: /./ }).first().click();
	await expect(designer.getByTestId('card-large')).toBeVisible();
	await expect(designer.getByRole('button', { name: /^Comment 1 on the front of / })).toBeVisible();
	expect(await designer.evaluate(() => (window as unknown as { stayed?: string }).stayed)).toBe('yes');

	// The designer replies, and the reviewer sees the reply arrive.
	await thread.getByRole('button', { name: 'Reply' }).click();
	await thread.getByLabel(/Reply to comment/).fill('Moved the disc up by 2 mm in the layout.');
	await thread.getByRole('button', { name: 'Send the reply' }).click();
	await expect(thread.getByTestId('reply')).toContainText('Moved the disc up by 2 mm');
	await expect(reviewer.getByTestId('reply').filter({ hasText: 'Moved the disc up by 2 mm' })).toBeVisible({ timeout: 15_000 });

	// The designer resolves the thread: it leaves the open list and shows under "All" as resolved.
	await thread.getByRole('button', { name: 'Resolve the thread' }).click();
	await expect(thread).toBeHidden();
	await designer.getByRole('combobox', { name: /^Show/ }).selectOption('all');
	await expect(thread.getByText('resolved', { exact: true })).toBeVisible();

	// The e-mail link to the thread (?comment=) opens it, resolved or not, and puts the reader on it.
	const threadLink = await mailLink(reviewer, 'reviewer@paddock.test', 'Moved the disc up by 2 mm');
	expect(threadLink).toMatch(new RegExp(`/games/${gameId}/proofs/${number}\\?comment=`));
	await reviewer.goto(threadLink);
	await hydrated(reviewer);
	await expect
		.poll(() => reviewer.evaluate(() => document.activeElement?.closest('[data-testid=thread]')?.textContent ?? ''))
		.toContain('The runner disc crowds the step number.');

	// The reviewer approves.
	await reviewer.getByLabel('Approve', { exact: true }).check();
	await reviewer.getByLabel('Note for the designer').fill('Ready for the print shop.');
	await reviewer.getByRole('button', { name: 'Give the verdict' }).click();
	await expect(reviewer.getByRole('status').filter({ hasText: 'You approved this proof.' })).toBeVisible();

	// The designer sees the verdict arrive, then releases, confirming first.
	await expect(designer.getByTestId('verdict').filter({ hasText: 'Ready for the print shop.' })).toContainText('approves', { timeout: 15_000 });
	await designer.getByRole('button', { name: 'Release for printing…' }).click();
	await designer.getByRole('button', { name: 'Yes, release it' }).click();
	await expect(designer.getByText('released for printing', { exact: true })).toBeVisible();
	await expect(designer.getByTestId('release-files')).toBeVisible();

	// The printer reads the release e-mail and opens the release page.
	const printer = await person(browser, 'printer@paddock.test');
	const releaseLink = await mailLink(printer, 'printer@paddock.test', `released proof ${number}`);
	expect(releaseLink).toBe(`/games/${gameId}/proofs/${number}`);
	await printer.goto(releaseLink);
	await hydrated(printer);
	await expect(printer.getByRole('heading', { name: `Released for printing: proof ${number}` })).toBeVisible();
	await expect(printer.getByTestId('release-files')).toContainText("confirm them with your print shop's own specification");
	// Printers get the release, not the review.
	await expect(printer.getByRole('heading', { name: 'Comments' })).toHaveCount(0);

	// The sheet PDF downloads and poppler reads it: pages, and a paper size from the standards.
	const [download] = await Promise.all([printer.waitForEvent('download', { timeout: 120_000 }), printer.getByTestId('sheet-pdf').click()]);
	const file = join(mkdtempSync(join(tmpdir(), 'paddock-sheets-')), 'sheets.pdf');
	await download.saveAs(file);
	const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' });
	expect(Number(info.match(/^Pages:\s+(\d+)/m)![1])).toBeGreaterThan(0);
	const [w, h] = info.match(/^Page size:\s+([\d.]+) x ([\d.]+) pts/m)!.slice(1).map(Number);
	const pt = (mm: number) => (mm * 72) / 25.4;
	// ISO 216: A4 210 × 297 mm, A3 297 × 420 mm; ANSI/ASME Y14.1: Letter 8.5 × 11 in, Tabloid 11 × 17 in.
	const papers = [
		[pt(210), pt(297)],
		[pt(297), pt(420)],
		[8.5 * 72, 11 * 72],
		[11 * 72, 17 * 72]
	];
	const fits = papers.some(([a, b]) => (Math.abs(w - a) < 1 && Math.abs(h - b) < 1) || (Math.abs(w - b) < 1 && Math.abs(h - a) < 1));
	expect(fits, `page size ${w} × ${h} pt`).toBe(true);

	// The proof's activity shows the loop, newest first.
	await designer.goto(`/games/${gameId}/activity`);
	const log = designer.getByTestId('activity');
	await expect(log).toContainText(`downloaded the sheet PDF of proof ${number}`);
	await expect(log).toContainText(`released proof ${number} for printing`);
	await expect(log).toContainText(`resolved a thread on proof ${number}`);
	await expect(log).toContainText(`cut proof ${number}: ${description}`);

	for (const p of [designer, reviewer, printer]) await p.context().close();
});
