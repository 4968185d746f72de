/** The part of lcms-wasm (LittleCMS 2.16 compiled to WebAssembly) that Paddock calls; the package ships no types. */
declare module 'lcms-wasm' {
	export type Handle = number;
	export interface Lcms {
		cmsOpenProfileFromMem(bytes: Uint8Array, size: number): Handle;
		cmsCloseProfile(profile: Handle): void;
		cmsCreate_sRGBProfile(): Handle;
		cmsCreateLab4Profile(whitePoint: number[] | null): Handle;
		cmsGetProfileInfoASCII(profile: Handle, info: number, language: string, country: string): string;
		cmsGetColorSpaceASCII(profile: Handle): string | null;
		cmsCreateTransform(input: Handle, inFormat: number, output: Handle, outFormat: number, intent: number, flags: number): Handle;
		cmsDeleteTransform(transform: Handle): void;
		cmsDoTransform(transform: Handle, input: Uint8Array | Uint16Array | Float32Array, pixels: number): Uint8Array & Uint16Array & Float32Array;
		_malloc(bytes: number): number;
		_free(ptr: number): void;
		_cmsOpenProfileFromMem(ptr: number, size: number): Handle;
		HEAPU8: Uint8Array;
	}
	export function instantiate(options?: { locateFile?: (name: string) => string }): Promise<Lcms>;
	export const TYPE_RGB_8: number;
	export const TYPE_CMYK_8: number;
	export const TYPE_CMYK_16: number;
	export const TYPE_GRAY_8: number;
	export const PT_Lab: number;
	export const PT_CMYK: number;
	export const FLOAT_SH: (a: number) => number;
	export const COLORSPACE_SH: (s: number) => number;
	export const CHANNELS_SH: (c: number) => number;
	export const BYTES_SH: (b: number) => number;
	export const INTENT_PERCEPTUAL: number;
	export const INTENT_RELATIVE_COLORIMETRIC: number;
	export const cmsFLAGS_BLACKPOINTCOMPENSATION: number;
	export const cmsInfoDescription: number;
}
