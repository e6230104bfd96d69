import { describe, expect, it } from 'vitest';
import { planckianLocusXy, spectralLocusXy } from '../../../../src/lib/colour/illuminants/loci';

describe('loci for charts', () => {
	it('CIE 15:2004 Table T.4: spectrum locus at 520 nm is (0.07430, 0.83380) and at 380 nm (0.17411, 0.00496)', () => {
		const loc = spectralLocusXy();
		const at = (nm: number) => loc.find((p) => p.wavelength === nm)!;
		expect(at(520).x).toBeCloseTo(0.0743, 5);
		expect(at(520).y).toBeCloseTo(0.8338, 4);
		expect(at(380).x).toBeCloseTo(0.17411, 5);
		expect(at(380).y).toBeCloseTo(0.00496, 5);
		expect(loc.length).toBe(95);
	});
	it('range options trim the spectrum locus', () => {
		const loc = spectralLocusXy({ start: 380, end: 700 });
		expect(loc[0].wavelength).toBe(380);
		expect(loc[loc.length - 1].wavelength).toBe(700);
	});
	it('Planckian locus: points carry their temperature and get bluer as T rises (batch)', () => {
		const pts = planckianLocusXy([1000, 2000, 3000, 5000, 10000, 20000]);
		for (let i = 1; i < pts.length; i++) expect(pts[i].x).toBeLessThan(pts[i - 1].x);
		expect(pts[0].T).toBe(1000);
		expect(() => planckianLocusXy([-1])).toThrow(/positive/);
	});
});
