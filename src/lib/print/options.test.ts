import { describe, expect, it } from 'vitest';
import { parsePrintOptions, PrintSettingsSchema, settingsQuery, type PrintSettings } from './options';

const shop: PrintSettings = {
	paper: 'custom',
	customWidthMm: 320,
	customHeightMm: 450,
	marginMm: 6.35,
	layout: 'butted',
	marks: false,
	duplex: 'short',
	backOffsetXMm: 0.8,
	backOffsetYMm: -0.5,
	colour: 'cmyk',
	output: 'pdfx4',
	intent: 'perceptual'
};

describe('print settings', () => {
	it('read back as the same options once turned into query parameters', () => {
		expect(parsePrintOptions(settingsQuery(shop))).toMatchObject({
			paper: { widthMm: 320, heightMm: 450 },
			marginMm: 6.35,
			layout: 'butted',
			marks: false,
			duplex: 'short',
			backOffsetMm: { x: 0.8, y: -0.5 },
			colour: 'cmyk',
			output: 'pdfx4',
			intent: 'perceptual'
		});
	});

	it('take output=pdfx4 or pdfx1a and a rendering intent; plain and relative when absent', () => {
		expect(parsePrintOptions({ output: 'pdfx1a' })).toMatchObject({ output: 'pdfx1a', intent: 'relative' });
		expect(parsePrintOptions({})).toMatchObject({ output: 'plain', intent: 'relative' });
		expect(() => parsePrintOptions({ output: 'pdfx3' })).toThrow(/output is plain, pdfx4 or pdfx1a/);
		expect(() => parsePrintOptions({ intent: 'saturation' })).toThrow(/intent is relative or perceptual/);
	});

	it('hold the same limits typed as in the query', () => {
		for (const bad of [{ marginMm: 51 }, { backOffsetXMm: 10.5 }, { customWidthMm: 40 }, { layout: 'tiled' }, { output: 'pdfx3' }]) {
			const settings = { ...shop, ...bad } as PrintSettings;
			expect(PrintSettingsSchema.safeParse(settings).success).toBe(false);
			expect(() => parsePrintOptions(settingsQuery(settings))).toThrow();
		}
	});
});
