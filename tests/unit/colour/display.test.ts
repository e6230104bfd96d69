import { describe, expect, it } from 'vitest';
import { displaySwatch } from '../../../src/lib/colour/display';

const rgb = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));

describe('display swatch', () => {
	it('IEC 61966-2-1: D65 (0.3127, 0.3290) is the sRGB white, #ffffff', () => {
		const s = displaySwatch({ x: 0.3127, y: 0.329 });
		expect(s.hex).toBe('#ffffff');
		expect(s.outOfGamut).toBe(false);
	});
	it('tungsten (CIE A) shows warm: red > green > blue, brightest channel at full scale', () => {
		const [r, g, b] = rgb(displaySwatch({ x: 0.44758, y: 0.40745 }).hex);
		expect(r).toBe(255);
		expect(r).toBeGreaterThan(g);
		expect(g).toBeGreaterThan(b);
	});
	it('a saturated green outside sRGB is reported and gamut-mapped; P3 gives a CSS color() string', () => {
		const s = displaySwatch({ x: 0.2, y: 0.7 });
		expect(s.outOfGamut).toBe(true);
		expect(s.hex).toMatch(/^#[0-9a-f]{6}$/);
		const p3 = displaySwatch({ x: 0.2, y: 0.7 }, { space: 'p3' });
		expect(p3.css).toMatch(/^color\(display-p3 /);
	});
	it('sRGB primaries (0.64, 0.33) are in gamut in sRGB (IEC 61966-2-1)', () => {
		expect(displaySwatch({ x: 0.64, y: 0.33 }).outOfGamut).toBe(false);
	});
	it('invalid chromaticity throws', () => {
		expect(() => displaySwatch({ x: NaN, y: 0.3 })).toThrow(/not valid/);
		expect(() => displaySwatch({ x: 0.7, y: 0.5 })).toThrow(/not valid/);
		expect(() => displaySwatch({ x: 0.3, y: 0.3 }, { space: 'rec2020' as 'p3' })).toThrow(/unknown display space/);
	});
});
