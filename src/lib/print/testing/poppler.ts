/**
 * Independent readers for print tests: poppler (pdfinfo, pdftoppm) and qpdf, run on PDF bytes.
 * Tests check our output with these rather than with the library that wrote it.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export function withFile<T>(bytes: Uint8Array, run: (path: string, dir: string) => T): T {
	const dir = mkdtempSync(join(tmpdir(), 'paddock-pdf-'));
	try {
		const path = join(dir, 'in.pdf');
		writeFileSync(path, bytes);
		return run(path, dir);
	} finally {
		rmSync(dir, { recursive: true, force: true });
	}
}

export interface Box {
	x0: number;
	y0: number;
	x1: number;
	y1: number;
}
export interface PageBoxes {
	size: { widthPt: number; heightPt: number };
	media: Box;
	crop: Box;
	bleed: Box;
	trim: Box;
	art: Box;
}

/** `pdfinfo -box` for every page: the page size and the five boxes, in pt. */
export function pdfinfoBoxes(bytes: Uint8Array): { pages: number; boxes: PageBoxes[] } {
	return withFile(bytes, (path) => {
		const first = execFileSync('pdfinfo', [path], { encoding: 'utf8' });
		const pages = Number(/^Pages:\s+(\d+)/m.exec(first)![1]);
		const out = execFileSync('pdfinfo', ['-box', '-f', '1', '-l', String(pages), path], { encoding: 'utf8' });
		const boxes: PageBoxes[] = [];
		for (let n = 1; n <= pages; n++) {
			const num = (s: string) => s.split(/\s+/).filter(Boolean).map(Number);
			const size = new RegExp(`^Page\\s+${n} size:\\s+([\\d.]+) x ([\\d.]+) pts`, 'm').exec(out);
			const box = (name: string): Box => {
				const m = new RegExp(`^Page\\s+${n} ${name}:\\s+([-\\d.\\s]+)$`, 'm').exec(out);
				const [x0, y0, x1, y1] = num(m![1]);
				return { x0, y0, x1, y1 };
			};
			boxes.push({
				size: { widthPt: Number(size![1]), heightPt: Number(size![2]) },
				media: box('MediaBox'),
				crop: box('CropBox'),
				bleed: box('BleedBox'),
				trim: box('TrimBox'),
				art: box('ArtBox')
			});
		}
		return { pages, boxes };
	});
}

/** `qpdf --check`: throws with qpdf's report when the file has errors or warnings. */
export function qpdfCheck(bytes: Uint8Array): string {
	return withFile(bytes, (path) => {
		try {
			return execFileSync('qpdf', ['--check', path], { encoding: 'utf8' });
		} catch (e) {
			const err = e as { stdout?: string; stderr?: string };
			throw new Error(`qpdf --check failed:\n${err.stdout ?? ''}${err.stderr ?? ''}`);
		}
	});
}

/** `pdftotext -layout` of the whole document. */
export function pdftotext(bytes: Uint8Array): string {
	return withFile(bytes, (path) => execFileSync('pdftotext', ['-layout', path, '-'], { encoding: 'utf8' }));
}

/** `qpdf --json` parsed (objects and pages). */
export function qpdfJson(bytes: Uint8Array): any {
	return withFile(bytes, (path) => JSON.parse(execFileSync('qpdf', ['--json', path], { encoding: 'utf8', maxBuffer: 1 << 28 })));
}

/** Content streams of every page, uncompressed by qpdf (QDF mode), as one text per page. */
export function qpdfContents(bytes: Uint8Array): string {
	return withFile(bytes, (path, dir) => {
		const out = join(dir, 'qdf.pdf');
		execFileSync('qpdf', ['--qdf', '--object-streams=disable', path, out]);
		return readFileSync(out, 'latin1');
	});
}

export interface GreyImage {
	width: number;
	height: number;
	/** 0 = black ink … 255 = paper. */
	data: Uint8Array;
	dpi: number;
}

/** `pdftoppm -gray -r dpi` of one page (1-based), parsed from its PGM (P5) output. */
export function rasterGrey(bytes: Uint8Array, page: number, dpi = 150, extra: string[] = []): GreyImage {
	return withFile(bytes, (path, dir) => {
		const base = join(dir, 'page');
		execFileSync('pdftoppm', ['-gray', '-r', String(dpi), '-f', String(page), '-l', String(page), '-singlefile', ...extra, path, base]);
		return { ...parsePgm(readFileSync(base + '.pgm')), dpi };
	});
}

/** `pdftoppm -gray -r dpi` of every page, in page order. */
export function rasterAllGrey(bytes: Uint8Array, dpi = 50): GreyImage[] {
	return withFile(bytes, (path, dir) => {
		execFileSync('pdftoppm', ['-gray', '-r', String(dpi), path, join(dir, 'page')]);
		// pdftoppm numbers pages with as many digits as the last page needs.
		const files = readdirSync(dir)
			.filter((f) => f.endsWith('.pgm'))
			.sort((a, b) => Number(/(\d+)\.pgm$/.exec(a)![1]) - Number(/(\d+)\.pgm$/.exec(b)![1]));
		return files.map((f) => ({ ...parsePgm(readFileSync(join(dir, f))), dpi }));
	});
}

/** `pdftoppm -png` of one page into a file (for looking at it). */
export function rasterPngFile(bytes: Uint8Array, page: number, outBase: string, dpi = 100): void {
	withFile(bytes, (path) => {
		execFileSync('pdftoppm', ['-png', '-r', String(dpi), '-f', String(page), '-l', String(page), '-singlefile', path, outBase]);
	});
}

export function parsePgm(buf: Uint8Array): { width: number; height: number; data: Uint8Array } {
	// P5 header: magic, width, height, maxval, each separated by whitespace, then one byte per pixel.
	let at = 0;
	const tokens: string[] = [];
	while (tokens.length < 4) {
		while (/\s/.test(String.fromCharCode(buf[at]))) at++;
		if (buf[at] === 35) {
			while (buf[at] !== 10) at++;
			continue;
		}
		let t = '';
		while (!/\s/.test(String.fromCharCode(buf[at]))) t += String.fromCharCode(buf[at++]);
		tokens.push(t);
	}
	at++;
	if (tokens[0] !== 'P5' || tokens[3] !== '255') throw new Error('expected an 8-bit P5 PGM');
	const width = Number(tokens[1]);
	const height = Number(tokens[2]);
	return { width, height, data: buf.subarray(at, at + width * height) };
}

/** Pixel value at a point given in mm from the page's top-left. */
export function greyAtMm(img: GreyImage, xMm: number, yMm: number): number {
	const px = Math.floor((xMm / 25.4) * img.dpi);
	const py = Math.floor((yMm / 25.4) * img.dpi);
	if (px < 0 || py < 0 || px >= img.width || py >= img.height) return 255;
	return img.data[py * img.width + px];
}

/** Mean grey over a box in mm (top-left origin). */
export function meanGreyMm(img: GreyImage, xMm: number, yMm: number, wMm: number, hMm: number): number {
	const s = img.dpi / 25.4;
	const x0 = Math.max(0, Math.round(xMm * s));
	const y0 = Math.max(0, Math.round(yMm * s));
	const x1 = Math.min(img.width, Math.round((xMm + wMm) * s));
	const y1 = Math.min(img.height, Math.round((yMm + hMm) * s));
	let sum = 0;
	let n = 0;
	for (let y = y0; y < y1; y++) for (let x = x0; x < x1; x++) (sum += img.data[y * img.width + x]), n++;
	return n ? sum / n : 255;
}

/** Count of pixels darker than `threshold` in a box in mm. */
export function inkedPixelsMm(img: GreyImage, xMm: number, yMm: number, wMm: number, hMm: number, threshold = 200): number {
	const s = img.dpi / 25.4;
	const x0 = Math.max(0, Math.floor(xMm * s));
	const y0 = Math.max(0, Math.floor(yMm * s));
	const x1 = Math.min(img.width, Math.ceil((xMm + wMm) * s));
	const y1 = Math.min(img.height, Math.ceil((yMm + hMm) * s));
	let n = 0;
	for (let y = y0; y < y1; y++) for (let x = x0; x < x1; x++) if (img.data[y * img.width + x] < threshold) n++;
	return n;
}

/** The page as a printer's duplex would show it from the other side: mirrored left-right or top-bottom. */
export function flipGrey(img: GreyImage, axis: 'vertical' | 'horizontal'): GreyImage {
	const out = new Uint8Array(img.data.length);
	const { width: w, height: h } = img;
	for (let y = 0; y < h; y++)
		for (let x = 0; x < w; x++) {
			const sx = axis === 'vertical' ? w - 1 - x : x;
			const sy = axis === 'horizontal' ? h - 1 - y : y;
			out[y * w + x] = img.data[sy * w + sx];
		}
	return { ...img, data: out };
}
