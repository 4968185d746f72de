/**
 * A PDF/X file as independent readers see it: qpdf (structure, objects), poppler (images, fonts,
 * pixels). Nothing here uses the code that wrote the file; the ICC header is read with a few
 * lines of our own from the bytes qpdf hands out (ICC.1:2010 §7.2 offsets).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { withFile } from './poppler';

/* eslint-disable @typescript-eslint/no-explicit-any */
type Obj = Record<string, any>;

export interface PdfxReport {
	/** `qpdf --check`: exit status and anything it printed beyond the all-clear. */
	qpdfCheck: { status: number; warnings: string[] };
	/** The header's version, e.g. "1.6". */
	pdfVersion: string;
	info: Record<string, string>;
	outputIntents: Obj[];
	/** The embedded DestOutputProfile: stream dictionary and the ICC header fields read from its bytes. */
	destOutputProfile?: { dict: Obj; bytes: number; declaredSize: number; deviceClass: string; colourSpace: string; pcs: string; signature: string };
	/** XMP metadata text (the catalog's /Metadata stream). */
	xmp: string;
	trailerId: boolean;
	pages: { trimBox?: number[]; bleedBox?: number[]; mediaBox: number[] }[];
	/** `pdfimages -list`: the colour column of every image. */
	imageColours: string[];
	/** `pdffonts`: name, embedded, subset of every font. */
	fonts: { name: string; emb: boolean; sub: boolean }[];
	/** `pdftoppm` at 20 dpi, page 1: share of pixels that are not paper white. */
	inkedShare: number;
}


const text = (v: unknown) => (typeof v === 'string' ? v.replace(/^[ub]:/, '') : String(v));

export function checkPdfx(bytes: Uint8Array): PdfxReport {
	return withFile(bytes, (path, dir) => {
		const check = spawnSync('qpdf', ['--check', path], { encoding: 'utf8' });
		// qpdf prints "WARNING: …" for every problem it repairs or notices; its all-clear mentions no warning.
		const warnings = `${check.stdout}\n${check.stderr}`.split('\n').filter((l) => /warning/i.test(l));

		const json = JSON.parse(
			execFileSync('qpdf', ['--json=2', '--json-stream-data=inline', '--decode-level=generalized', '--json-key=qpdf', path], {
				encoding: 'utf8',
				maxBuffer: 1 << 29
			})
		);
		const objects: Obj = json.qpdf[1];
		const get = (ref: unknown): Obj => {
			const o = objects[`obj:${ref}`];
			return o?.value ?? o?.stream ?? o;
		};
		const deref = (v: unknown): Obj => (typeof v === 'string' && / R$/.test(v) ? get(v) : (v as Obj));
		const trailer: Obj = objects.trailer.value;
		const catalog = deref(trailer['/Root']);
		const infoDict = deref(trailer['/Info']) ?? {};
		const info = Object.fromEntries(Object.entries(infoDict).map(([k, v]) => [k.slice(1), text(v)]));
		const outputIntents = ((deref(catalog['/OutputIntents']) as unknown as unknown[]) ?? []).map((i) => deref(i));

		let destOutputProfile: PdfxReport['destOutputProfile'];
		const iccRef = outputIntents[0]?.['/DestOutputProfile'];
		if (iccRef) {
			const stream = objects[`obj:${iccRef}`].stream;
			const icc = Buffer.from(stream.data, 'base64');
			destOutputProfile = {
				dict: stream.dict,
				bytes: icc.length,
				declaredSize: icc.readUInt32BE(0),
				deviceClass: icc.toString('latin1', 12, 16),
				colourSpace: icc.toString('latin1', 16, 20),
				pcs: icc.toString('latin1', 20, 24),
				signature: icc.toString('latin1', 36, 40)
			};
		}
		const metaRef = catalog['/Metadata'];
		const xmp = metaRef ? Buffer.from(objects[`obj:${metaRef}`].stream.data, 'base64').toString('utf8') : '';

		const pages: PdfxReport['pages'] = [];
		const walk = (node: Obj) => {
			if (node['/Type'] === '/Pages') for (const kid of node['/Kids']) walk(deref(kid));
			else pages.push({ trimBox: node['/TrimBox'], bleedBox: node['/BleedBox'], mediaBox: node['/MediaBox'] });
		};
		walk(deref(catalog['/Pages']));

		const imageColours = execFileSync('pdfimages', ['-list', path], { encoding: 'utf8' })
			.split('\n')
			.slice(2)
			.filter((l) => l.trim())
			.map((l) => l.trim().split(/\s+/)[5]);
		const fonts = execFileSync('pdffonts', [path], { encoding: 'utf8' })
			.split('\n')
			.slice(2)
			.filter((l) => l.trim())
			.map((l) => {
				// name type… encoding emb sub uni object ID: read the yes/no columns from the end.
				const cols = l.trim().split(/\s+/);
				const n = cols.length;
				return { name: cols[0], emb: cols[n - 5] === 'yes', sub: cols[n - 4] === 'yes' };
			});

		execFileSync('pdftoppm', ['-r', '20', '-f', '1', '-l', '1', '-gray', path, join(dir, 'p')]);
		const pgm = readFileSync(join(dir, execFileSync('ls', [dir], { encoding: 'utf8' }).split('\n').find((f) => f.endsWith('.pgm'))!));
		// Binary PGM (P5): three header lines, then one byte per pixel.
		let at = 0;
		for (let lines = 0; lines < 3; at++) if (pgm[at] === 0x0a) lines++;
		const px = pgm.subarray(at);
		let inked = 0;
		for (const v of px) if (v < 245) inked++;

		return {
			qpdfCheck: { status: check.status ?? -1, warnings },
			pdfVersion: new TextDecoder().decode(bytes.subarray(5, 8)),
			info,
			outputIntents,
			destOutputProfile,
			xmp,
			trailerId: Array.isArray(trailer['/ID']),
			pages,
			imageColours,
			fonts,
			inkedShare: inked / px.length
		};
	});
}
