import { describe, expect, it } from 'vitest';
import { ledSpectrumOhno2005, ohno2005Value, phosphorLedSpectrum } from '../../../../src/lib/matching/led/ohno2005';

describe('Ohno 2005 LED model', () => {
	it('Ohno 2005 eq. (1): S = (g + 2g⁵)/3 — 1 at the peak, (e⁻¹ + 2e⁻⁵)/3 one half-width away, symmetric', () => {
		expect(ohno2005Value(530, 530, 30)).toBe(1);
		expect(ohno2005Value(560, 530, 30)).toBeCloseTo((Math.exp(-1) + 2 * Math.exp(-5)) / 3, 14);
		expect(ohno2005Value(500, 530, 30)).toBeCloseTo(ohno2005Value(560, 530, 30), 14);
	});
	it('derived from eq. (1): the full width at half maximum is 0.922·Δλ', () => {
		const hw = 40;
		let lo = 0;
		let hi = 3 * hw;
		for (let i = 0; i < 60; i++) {
			const m = (lo + hi) / 2;
			if (ohno2005Value(600 + m, 600, hw) > 0.5) lo = m;
			else hi = m;
		}
		expect((2 * lo) / hw).toBeCloseTo(0.922, 3);
	});
	it('builds spectra on 380–780 nm at 5 nm by default', () => {
		const s = ledSpectrumOhno2005(455, 22);
		expect(s.start).toBe(380);
		expect(s.interval).toBe(5);
		expect(s.values).toHaveLength(81);
		expect(Math.max(...s.values)).toBe(1);
		const w = phosphorLedSpectrum([
			{ peak: 450, halfWidth: 22, weight: 1 },
			{ peak: 560, halfWidth: 100, weight: 0.5 }
		]);
		expect(w.values[(450 - 380) / 5]).toBeGreaterThan(1);
	});
	it('throws on impossible peaks, widths and weights', () => {
		expect(() => ledSpectrumOhno2005(100, 20)).toThrow(/300–900/);
		expect(() => ledSpectrumOhno2005(500, 0)).toThrow(/width/);
		expect(() => phosphorLedSpectrum([])).toThrow(/at least one/);
		expect(() => phosphorLedSpectrum([{ peak: 450, halfWidth: 20, weight: -1 }])).toThrow(/weight/);
	});
});
