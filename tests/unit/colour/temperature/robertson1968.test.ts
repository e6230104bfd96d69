import { describe, expect, it } from 'vitest';
import { CCTToUv } from '../../../../src/lib/colour/temperature/ohno2013';
import { robertsonIsotemperatureLines, uvToCCTRobertson1968 } from '../../../../src/lib/colour/temperature/robertson1968';

describe('Robertson 1968 isotemperature lines computed from our locus', () => {
	// Wyszecki & Stiles (1982) Table 1(3.11), Robertson's table (rows from memory).
	it('Wyszecki & Stiles Table 1(3.11): 0 mired → u 0.18006, v 0.26352, t −0.24341 (from memory)', () => {
		const [l] = robertsonIsotemperatureLines([0]);
		expect(Math.abs(l.u - 0.18006)).toBeLessThan(2e-5);
		expect(Math.abs(l.v - 0.26352)).toBeLessThan(2e-5);
		expect(Math.abs(l.t - -0.24341)).toBeLessThan(2e-4);
	});
	it('Wyszecki & Stiles Table 1(3.11): 10 mired → u 0.18066, v 0.26589, t −0.25479 (from memory)', () => {
		const [l] = robertsonIsotemperatureLines([10]);
		expect(Math.abs(l.u - 0.18066)).toBeLessThan(2e-5);
		expect(Math.abs(l.v - 0.26589)).toBeLessThan(2e-5);
		expect(Math.abs(l.t - -0.25479)).toBeLessThan(2e-4);
	});
	it('Wyszecki & Stiles Table 1(3.11): 325 mired → u 0.24792 (printed 0.24702, a misprint), v 0.34655 (from memory)', () => {
		const [l] = robertsonIsotemperatureLines([325]);
		expect(Math.abs(l.u - 0.24792)).toBeLessThan(2e-5);
		expect(Math.abs(l.u - 0.24702)).toBeGreaterThan(5e-4);
		expect(Math.abs(l.v - 0.34655)).toBeLessThan(2e-5);
	});
});

describe('uvToCCTRobertson1968', () => {
	it('round trip on the locus and off it (batch)', () => {
		for (const T of [1000, 2000, 3000, 4500, 6500, 10000, 20000]) {
			for (const D of [-0.02, 0, 0.02]) {
				const r = uvToCCTRobertson1968(CCTToUv(T, D));
				expect(Math.abs(1e6 / r.CCT - 1e6 / T)).toBeLessThan(0.05);
				expect(Math.abs(r.Duv - D)).toBeLessThan(2e-5);
			}
		}
	});
	it('warns outside its validity and throws on NaN', () => {
		expect(uvToCCTRobertson1968(CCTToUv(25000, 0)).warnings.length).toBe(1);
		expect(() => uvToCCTRobertson1968({ u: 0.2, v: NaN })).toThrow(/finite/);
	});
});
