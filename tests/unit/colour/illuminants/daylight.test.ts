import { describe, expect, it } from 'vitest';
import { colordDaylightTable, cieIlluminant } from '../../../../src/lib/colour/illuminants/cie';
import { daylightM, daylightSpectrum } from '../../../../src/lib/colour/illuminants/daylight';
import { daylightLocusXy } from '../../../../src/lib/colour/illuminants/loci';
import { spectrumToXYZ, XYZToXy } from '../../../../src/lib/colour/tristimulus';

describe('CIE daylight from S0, S1, S2 (CIE 15:2004 §3.1)', () => {
	it('CIE 15:2004 Table T.1: D65 built from S0, S1, S2 equals the tabulated D65 (colord copy, 6 figures) within 0.02 at every 5 nm, 300–830 nm', () => {
		const ours = cieIlluminant('D65');
		const table = colordDaylightTable('D65');
		expect([ours.start, ours.interval, ours.values.length]).toEqual([table.start, table.interval, table.values.length]);
		let worst = 0;
		for (let i = 0; i < ours.values.length; i++) worst = Math.max(worst, Math.abs(ours.values[i] - table.values[i]));
		expect(worst).toBeLessThan(0.02);
	});
	it('CIE 15:2004 Table T.3: D50 y = 0.35851; colord’s own 3-figure D50 table integrates to 0.35854, ours from S0, S1, S2 is closer', () => {
		const colord = XYZToXy(spectrumToXYZ(colordDaylightTable('D50')));
		const ours = XYZToXy(spectrumToXYZ(cieIlluminant('D50')));
		expect(Math.abs(colord.y - 0.35854)).toBeLessThan(5e-6);
		expect(Math.abs(ours.y - 0.35851)).toBeLessThan(Math.abs(colord.y - 0.35851));
		expect(Math.abs(ours.y - 0.35851)).toBeLessThan(2e-5);
	});
	it('CIE 15:2004 §3.1: M1, M2 are rounded to 3 decimals', () => {
		const m = daylightM({ x: 0.3127, y: 0.329 });
		expect(Math.round(m.M1 * 1000) / 1000).toBe(m.M1);
		expect(Math.round(m.M2 * 1000) / 1000).toBe(m.M2);
	});
	it('every D illuminant is 100 at 560 nm (S0 = 100, S1 = S2 = 0 there)', () => {
		for (const T of [4000, 5000, 6504, 9300, 25000]) {
			const s = daylightSpectrum(T);
			expect(s.values[(560 - 300) / 5]).toBeCloseTo(100, 12);
		}
	});
	it('1 nm daylight is linear between the 5 nm values', () => {
		const five = daylightSpectrum(6504, 300, 830, 5);
		const one = daylightSpectrum(6504, 300, 830, 1);
		expect(one.values[(562 - 300)]).toBeCloseTo(five.values[52] + 0.4 * (five.values[53] - five.values[52]), 10);
	});
	it('CIE 15:2004 §3.1: the daylight locus at 6504 K is (0.3127, 0.3291) (from memory)', () => {
		const [p] = daylightLocusXy([6504]);
		expect(p.x.toFixed(4)).toBe('0.3127');
		expect(p.y.toFixed(4)).toBe('0.3291');
	});
	it('outside 4000–25000 K throws', () => {
		expect(() => daylightSpectrum(3000)).toThrow(/4000–25000 K/);
		expect(() => daylightSpectrum(NaN)).toThrow(/4000–25000 K/);
		expect(() => daylightLocusXy([30000])).toThrow(/4000–25000 K/);
	});
});
