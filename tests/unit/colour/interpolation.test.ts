import { describe, expect, it } from 'vitest';
import { linearInterpolate, spragueInterpolate, wavelengthGrid } from '../../../src/lib/colour/interpolation';

describe('Sprague interpolation (CIE 167:2005)', () => {
	const grid = wavelengthGrid(400, 500, 10);
	it('returns tabulated values exactly at the nodes', () => {
		const y = Array.from(grid, (x) => Math.sin(x / 20));
		expect(Array.from(spragueInterpolate(y, 400, 10, grid))).toEqual(y);
	});
	it('Westland, Ripamonti & Cheung (2012) worked example: y = (5.92, 9.37, 10.8135, 4.51, 69.59, 27.8007, 86.05) → f(0.25, 0.5, 0.75) = 6.7295161, 7.2185026, 7.8140625', () => {
		const got = spragueInterpolate([5.92, 9.37, 10.8135, 4.51, 69.59, 27.8007, 86.05], 0, 1, [0.25, 0.5, 0.75]);
		expect(got[0]).toBeCloseTo(6.7295161, 7);
		expect(got[1]).toBeCloseTo(7.2185026, 7);
		expect(got[2]).toBeCloseTo(7.8140625, 7);
	});
	it('reproduces a quartic exactly away from the ends (fifth-order formula on six points)', () => {
		const f = (x: number) => 1e-6 * (x - 430) ** 4 - 2e-4 * (x - 450) ** 3 + 0.01 * x;
		const y = Array.from(grid, f);
		const at = wavelengthGrid(420, 470, 1);
		const got = spragueInterpolate(y, 400, 10, at);
		at.forEach((x, i) => expect(got[i]).toBeCloseTo(f(x), 9));
	});
	it('zero outside the table; fewer than 6 points throws', () => {
		expect(spragueInterpolate([1, 2, 3, 4, 5, 6], 0, 1, [-1, 7])).toEqual(new Float64Array([0, 0]));
		expect(() => spragueInterpolate([1, 2, 3], 0, 1, [1])).toThrow(/at least 6/);
	});
});

describe('linear interpolation', () => {
	it('halfway between two points is their mean; zero outside', () => {
		expect(Array.from(linearInterpolate([0, 10], 0, 5, [2.5, -1, 6]))).toEqual([5, 0, 0]);
	});
});
