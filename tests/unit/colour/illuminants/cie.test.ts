import { describe, expect, it } from 'vitest';
import { cieIlluminant, CIE_ILLUMINANT_NAMES } from '../../../../src/lib/colour/illuminants/cie';

describe('cieIlluminant', () => {
	it('every name resolves to a valid spectrum', () => {
		for (const n of CIE_ILLUMINANT_NAMES) {
			const s = cieIlluminant(n);
			expect(s.values.every((v) => Number.isFinite(v) && v >= 0), n).toBe(true);
		}
	});
	it('CIE 15:2004 Table T.1: A at 5 nm is every fifth value of the 1 nm table (300–830 nm)', () => {
		const five = cieIlluminant('A');
		const one = cieIlluminant('A', { interval: 1 });
		expect([five.start, five.interval, five.values.length]).toEqual([300, 5, 107]);
		for (let i = 0; i < five.values.length; i++) expect(five.values[i]).toBe(one.values[5 * i]);
		expect(five.values[(560 - 300) / 5]).toBe(100);
	});
	it('CIE 15:2004 Table T.6: F-series are 380–780 nm at 5 nm; F10 at 385 nm is 0.80', () => {
		const f10 = cieIlluminant('F10');
		expect([f10.start, f10.interval, f10.values.length]).toEqual([380, 5, 81]);
		expect(f10.values[1]).toBe(0.8);
	});
	it('unknown name throws', () => {
		expect(() => cieIlluminant('F13' as 'F1')).toThrow(/unknown CIE illuminant/);
	});
});
