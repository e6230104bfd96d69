import { describe, expect, it } from 'vitest';
import { deltaDuv, kelvinToMired, miredShift, miredToKelvin } from '../../../../src/lib/colour/temperature/mired';

describe('mired arithmetic', () => {
	it('common practice: 4000 → 3000 K is 83 mired; 7000 → 6000 K is 24 mired', () => {
		expect(Math.round(miredShift(4000, 3000))).toBe(83);
		expect(Math.round(miredShift(7000, 6000))).toBe(24);
	});
	it('common practice (derived): a 2700 K practical against a 3200 K camera is +58 mired', () => {
		expect(Math.round(miredShift(3200, 2700))).toBe(58);
	});
	it('common practice: 3092 K to 5600 K needs −144.8 mired', () => {
		expect(miredShift(3092, 5600)).toBeCloseTo(-144.8, 1);
	});
	it('round trip K → mired → K', () => {
		for (const K of [1000, 3200, 5600, 20000]) expect(miredToKelvin(kelvinToMired(K))).toBeCloseTo(K, 9);
		expect(kelvinToMired(5000)).toBe(200);
	});
	it('ΔDuv is b − a', () => {
		expect(deltaDuv(-0.002, 0.003)).toBeCloseTo(0.005, 15);
	});
	it('zero, negative and NaN throw', () => {
		expect(() => kelvinToMired(0)).toThrow(/positive number of kelvin/);
		expect(() => miredToKelvin(-5)).toThrow(/positive/);
		expect(() => miredShift(NaN, 3200)).toThrow(/fromK/);
		expect(() => deltaDuv(NaN, 0)).toThrow(/finite/);
	});
});
