import { test, expect } from '@playwright/test';
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hydrated, signIn, demoGameId } from './helpers';
import { checkPdfx } from '../../src/lib/print/testing/pdfx-check';

/** Screenshots and page renders of this file, to look at (not compared). */
const SHOTS = process.env.E2E_SHOTS ?? join(tmpdir(), 'paddock-pdfx-shots');
mkdirSync(SHOTS, { recursive: true });

test('a printer picks PDF/X-4 on the print page, downloads a card’s press file, and independent readers accept it', async ({ page }) => {
	test.setTimeout(120_000);
	await signIn(page, 'printer@paddock.test');
	const gameId = await demoGameId(page);
	await page.goto(`/games/${gameId}/print`);
	await hydrated(page);
	// Printers print the released proof; the fields by hand, the file as PDF/X-4.
	await expect(page.getByLabel('Print', { exact: true })).toHaveValue('1');
	await page.getByLabel('Printer profile').selectOption({ label: 'Set by hand' });
	await page.getByTestId('print-output').selectOption('pdfx4');
	await expect(page.getByText('the game\'s press profile')).toContainText('FOGRA39');
	const card = page.getByTestId('press-card');
	await card.selectOption({ index: 0 });
	const link = page.getByTestId('download-press');
	await expect(link).toHaveAttribute('href', /\/proofs\/1\/cards\/.+\/press\.pdf\?output=pdfx4&intent=relative/);
	await page.screenshot({ path: join(SHOTS, 'print-page-pdfx4.png'), fullPage: true });
	const [download] = await Promise.all([page.waitForEvent('download', { timeout: 90_000 }), link.click()]);
	const file = join(mkdtempSync(join(tmpdir(), 'paddock-pdfx-')), 'press.pdf');
	await download.saveAs(file);
	const bytes = new Uint8Array(readFileSync(file));

	// qpdf and poppler read it (src/lib/print/testing/pdfx-check.ts uses nothing of the writer).
	const r = checkPdfx(bytes);
	// qpdf --check: clean.
	expect(r.qpdfCheck).toEqual({ status: 0, warnings: [] });
	// ISO 15930-7 §6.2.2: the identification key, PDF 1.6.
	expect(r.info.GTS_PDFXVersion).toBe('PDF/X-4');
	expect(r.pdfVersion).toBe('1.6');
	expect(r.xmp).toContain('<pdfxid:GTS_PDFXVersion>PDF/X-4</pdfxid:GTS_PDFXVersion>');
	// ISO 32000-1 §14.11.5: one GTS_PDFX output intent with the condition and its CMYK output profile (ICC.1:2010 header).
	expect(r.outputIntents).toHaveLength(1);
	expect(r.outputIntents[0]['/S']).toBe('/GTS_PDFX');
	expect(String(r.outputIntents[0]['/OutputConditionIdentifier'])).toContain('FOGRA39');
	expect(r.destOutputProfile).toMatchObject({ signature: 'acsp', deviceClass: 'prtr', colourSpace: 'CMYK', dict: { '/N': 4 } });
	// pdfinfo -box: front and back, each with TrimBox inside BleedBox inside MediaBox (ISO 32000-1 §14.11.2).
	const boxes = execFileSync('pdfinfo', ['-box', '-f', '1', '-l', '2', file], { encoding: 'utf8' });
	expect(boxes.match(/Page\s+\d+ TrimBox:/g)).toHaveLength(2);
	expect(boxes.match(/Page\s+\d+ BleedBox:/g)).toHaveLength(2);
	expect(r.pages).toHaveLength(2);
	for (const p of r.pages) {
		const [tx0, ty0, tx1, ty1] = p.trimBox!;
		const [bx0, by0, bx1, by1] = p.bleedBox!;
		expect(bx0 <= tx0 && by0 <= ty0 && bx1 >= tx1 && by1 >= ty1).toBe(true);
	}
	// pdfimages -list: no RGB picture; pdffonts: every font embedded and subset.
	expect(r.imageColours.filter((c) => c === 'rgb')).toEqual([]);
	for (const f of r.fonts) expect(f).toMatchObject({ emb: true, sub: true });
	// poppler draws it.
	expect(r.inkedShare).toBeGreaterThan(0.2);
	execFileSync('pdftoppm', ['-png', '-r', '50', file, join(SHOTS, 'press-pdfx4')]);
});

test('a designer shows a proof as it will print, and chooses the game’s press profile', async ({ page }) => {
	test.setTimeout(120_000);
	await signIn(page, 'designer@paddock.test');
	const gameId = await demoGameId(page);

	await page.goto(`/games/${gameId}/proofs/1`);
	await hydrated(page);
	// Colour choices belong to a card opened large from the grid.
	await page.getByTestId('card-thumb').first().click();
	await page.getByTestId('as-printed').first().check();
	await expect(page.getByTestId('soft-proof-legend')).toContainText('ΔE2000 3');
	const face = page.locator('img[src*="soft-proof.png"]').first();
	await face.scrollIntoViewIfNeeded();
	await expect.poll(() => face.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth), { timeout: 60_000 }).toBeGreaterThan(100);
	await page.screenshot({ path: join(SHOTS, 'proof-as-printed.png') });

	await page.goto(`/games/${gameId}/settings`);
	await hydrated(page);
	await expect(page.getByTestId('current-press')).toContainText('FOGRA39');
	await page.getByLabel('Default press profile').selectOption({ label: 'Office laser, A4 duplex: FOGRA39 (Paddock coated FOGRA39 (TAC 330%)) · prints plain PDF' });
	await page.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByRole('status')).toContainText('FOGRA39');
	await expect(page.getByTestId('current-press')).toContainText('Office laser, A4 duplex');
	await page.screenshot({ path: join(SHOTS, 'game-settings.png'), fullPage: true });
	// Back to the built-in one, as the demo started.
	await page.getByLabel('Default press profile').selectOption('');
	await page.getByRole('button', { name: 'Save' }).click();
	await expect(page.getByTestId('current-press')).not.toContainText('Office laser');
});
