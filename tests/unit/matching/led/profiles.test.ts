import { describe, expect, it } from 'vitest';
import { makeSpectrum } from '../../../../src/lib/colour';
import { summariseXYZ } from '../../../../src/lib/matching/chromaticity';
import { GENERIC_FIXTURES, genericFixture, resolveFixture, type FixtureProfile } from '../../../../src/lib/matching/led/profiles';
import { fourChannelFixture } from '../factories';

describe('generic fixture profiles', () => {
	it('are labelled invented and generic, with unique channel ids (bi-colour 2, RGB 3, RGBW 4, seven-colour 7)', () => {
		expect(GENERIC_FIXTURES.map((p) => p.channels.length)).toEqual([2, 3, 4, 7]);
		for (const p of GENERIC_FIXTURES) {
			expect(p.generic).toBe(true);
			expect(p.label).toMatch(/invented/);
			expect(new Set(p.channels.map((c) => c.id)).size).toBe(p.channels.length);
		}
		expect(genericFixture('generic-seven').channels.map((c) => c.id)).toEqual(['R', 'G', 'B', 'A', 'C', 'L', 'W']);
	});
	it('regression: the modelled warm and cool whites sit near 2700 K and 5650 K, within 0.001 Duv of the locus', () => {
		const [ww, cw] = resolveFixture(genericFixture('generic-bicolour')).channels.map((c) => summariseXYZ(c.XYZ));
		expect(Math.abs(ww.CCT! - 2700)).toBeLessThan(50);
		expect(Math.abs(cw.CCT! - 5650)).toBeLessThan(50);
		expect(Math.abs(ww.Duv!)).toBeLessThan(0.001);
		expect(Math.abs(cw.Duv!)).toBeLessThan(0.001);
	});
	it('scales each channel so its Y (k = 1) equals maxFlux', () => {
		const f = resolveFixture(fourChannelFixture());
		expect(f.channels.map((c) => c.XYZ.Y)).toEqual([0.3, 0.7, 0.1, 1].map((v) => expect.closeTo(v, 12)));
		expect(f.totalY).toBeCloseTo(2.1, 12);
	});
	it('takes measured spectra with a scale, and refuses mixed grids, duplicates and double scaling', () => {
		const flat = makeSpectrum(380, 5, new Array(81).fill(1));
		const p: FixtureProfile = {
			id: 'm',
			label: 'measured',
			kind: 'custom',
			description: '',
			generic: false,
			channels: [
				{ id: 'a', label: 'a', emitter: { kind: 'measured', spectrum: flat }, scale: 2 },
				{ id: 'b', label: 'b', emitter: { kind: 'led', peak: 450, halfWidth: 20 } }
			]
		};
		const f = resolveFixture(p);
		expect(f.channels[0].spectrum.values[0]).toBe(2);
		expect(f.channels[1].XYZ.Y).toBeCloseTo(1, 12);
		const other = makeSpectrum(380, 1, new Array(401).fill(1));
		expect(() => resolveFixture({ ...p, channels: [p.channels[0], { ...p.channels[0], id: 'c', emitter: { kind: 'measured', spectrum: other } }] })).toThrow(/different wavelength grid/);
		expect(() => resolveFixture({ ...p, channels: [p.channels[1], p.channels[1]] })).toThrow(/two channels/);
		expect(() => resolveFixture({ ...p, channels: [{ ...p.channels[0], maxFlux: 1 }] })).toThrow(/either maxFlux or scale/);
		expect(() => resolveFixture({ ...p, channels: [] })).toThrow(/no channels/);
		expect(() => genericFixture('nope')).toThrow(/Unknown fixture/);
	});
});
