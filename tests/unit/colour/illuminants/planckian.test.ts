import { describe, expect, it } from 'vitest';
import { cieIlluminant } from '../../../../src/lib/colour/illuminants/cie';
import { planckianSpectrum } from '../../../../src/lib/colour/illuminants/planckian';

describe('Planckian spectrum', () => {
	it('CIE 15:2004 §3.1: illuminant A = 100·(560/λ)⁵·(e^(1.435e7/(2848·560)) − 1)/(e^(1.435e7/(2848·λ)) − 1), i.e. Planck at 2855.54 K on c2 = 1.4388e-2 m·K; the 1 nm table matches to its 6 figures', () => {
		const A = cieIlluminant('A', { interval: 1 });
		const p = planckianSpectrum((2848 * 1.4388) / 1.435, 300, 830, 1);
		for (let i = 0; i < A.values.length; i++) {
			expect(Math.abs(p.values[i] - A.values[i]) / A.values[i]).toBeLessThan(5e-6);
		}
	});
	it('defaults to 360–830 nm at 1 nm, 100 at 560 nm', () => {
		const p = planckianSpectrum(3200);
		expect([p.start, p.interval, p.values.length]).toEqual([360, 1, 471]);
		expect(p.values[200]).toBeCloseTo(100, 12);
	});
	it('bad temperature or grid throws', () => {
		expect(() => planckianSpectrum(0)).toThrow(/positive number of kelvin/);
		expect(() => planckianSpectrum(3200, 400, 300)).toThrow(/not valid/);
	});
});
