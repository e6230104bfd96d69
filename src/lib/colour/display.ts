/**
 * A display swatch for a light: the colour a reader should see as the light's tint on a screen.
 *
 * The light's chromaticity is taken at a luminance that puts its brightest linear RGB channel at
 * 1 (so every swatch is as bright as the display allows at that tint), expressed in the display's
 * space with the display white as D65 — a D65 light shows as white, tungsten as amber, a green
 * fluorescent as green. No chromatic adaptation is applied: the tint is the point. A chromaticity
 * outside the display gamut (a negative channel) is reported and brought in with colorjs.io's CSS
 * Color 4 gamut mapping (chroma reduced in OKLCh at constant lightness and hue).
 *
 * References:
 *   IEC 61966-2-1:1999 (sRGB); SMPTE EG 432-1:2010 / CSS Color 4 'display-p3'.
 *   W3C CSS Color Module Level 4, §13.2 (CSS gamut mapping algorithm).
 */
import Color from 'colorjs.io';
import { xyToXYZ } from './tristimulus';

export interface DisplaySwatch {
	/** CSS colour: `#rrggbb` for sRGB, `color(display-p3 r g b)` for P3 */
	css: string;
	/** sRGB hex, always given (for P3 swatches, the sRGB swatch as a fallback) */
	hex: string;
	/** true when the chromaticity is outside the chosen display gamut and was gamut-mapped */
	outOfGamut: boolean;
}

/** Swatch for chromaticity xy (CIE 1931) in sRGB (default) or Display P3. */
export function displaySwatch(xy: { x: number; y: number }, options: { space?: 'srgb' | 'p3' } = {}): DisplaySwatch {
	const space = options.space ?? 'srgb';
	if (space !== 'srgb' && space !== 'p3') throw new RangeError(`unknown display space ${String(space)}: use 'srgb' or 'p3'`);
	if (!Number.isFinite(xy?.x) || !Number.isFinite(xy?.y) || xy.x < 0 || xy.y <= 0 || xy.x + xy.y > 1) {
		throw new RangeError(`chromaticity (${xy?.x}, ${xy?.y}) is not valid: need x ≥ 0, y > 0, x + y ≤ 1`);
	}
	const { X, Y, Z } = xyToXYZ(xy, 1);
	const linearSpace = space === 'srgb' ? 'srgb-linear' : 'p3-linear';
	const lin = new Color('xyz-d65', [X, Y, Z]).to(linearSpace).coords.map((c) => Number(c ?? 0));
	const max = Math.max(...lin);
	const scaled = lin.map((c) => c / max) as [number, number, number];
	const eps = 1e-9;
	const outOfGamut = scaled.some((c) => c < -eps);
	let colour = new Color(linearSpace, scaled).to(space === 'srgb' ? 'srgb' : 'p3');
	if (outOfGamut || !colour.inGamut()) colour = colour.toGamut({ method: 'css' });
	if (space === 'srgb') {
		const hex = colour.toString({ format: 'hex', collapse: false });
		return { css: hex, hex, outOfGamut };
	}
	return { css: colour.toString({ precision: 4 }), hex: displaySwatch(xy, { space: 'srgb' }).hex, outOfGamut };
}
