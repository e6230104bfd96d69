import { describe, expect, it } from 'vitest';
import { CCTToXy, cieIlluminant, spectrumToXYZ, XYZToXy } from '../../../src/lib/colour';
import { DUV_LIMIT, inputToXy, summarise, xyzWeights } from '../../../src/lib/matching/chromaticity';
import { planck, spectrumOf } from './factories';

describe('xyzWeights', () => {
	it('CIE 15:2004 §7.1 summation is linear: weights reproduce spectrumToXYZ on 1, 5 and 10 nm grids', () => {
		const cases = [planck(3000), cieIlluminant('F2'), spectrumOf((nm) => 1 + Math.sin(nm / 17), 380, 780, 10)];
		for (const s of cases) {
			const w = xyzWeights(s.start, s.interval, s.values.length);
			let X = 0;
			let Y = 0;
			let Z = 0;
			s.values.forEach((v, i) => {
				X += v * w.x[i];
				Y += v * w.y[i];
				Z += v * w.z[i];
			});
			const ref = spectrumToXYZ(s);
			expect(X / ref.X).toBeCloseTo(1, 12);
			expect(Y / ref.Y).toBeCloseTo(1, 12);
			expect(Z / ref.Z).toBeCloseTo(1, 12);
		}
	});
	it('samples outside the observer’s 360–830 nm weigh nothing', () => {
		const w = xyzWeights(300, 5, 20); // 300–395 nm
		expect(w.y[0]).toBe(0);
		expect(w.y[19]).toBeGreaterThan(0);
	});
});

describe('inputToXy and summarise', () => {
	it('every input form gives the same chromaticity (Ohno 2014 CCT + Duv via the colour core)', () => {
		const xy = CCTToXy(4500, 0.002);
		const s = summarise({ CCT: 4500, Duv: 0.002 });
		expect(s.x).toBeCloseTo(xy.x, 12);
		expect(inputToXy({ u_prime: s.u_prime, v_prime: s.v_prime }).x).toBeCloseTo(xy.x, 12);
		expect(inputToXy({ X: xy.x * 2, Y: xy.y * 2, Z: (1 - xy.x - xy.y) * 2 }).y).toBeCloseTo(xy.y, 12);
		expect(s.CCT!).toBeCloseTo(4500, 0);
		expect(s.mired!).toBeCloseTo(1e6 / s.CCT!, 9);
		const a = cieIlluminant('A');
		expect(inputToXy({ spectrum: a }).x).toBeCloseTo(XYZToXy(spectrumToXYZ(a)).x, 12);
	});
	it(`gives no CCT beyond |Duv| ${DUV_LIMIT} (Ohno 2014), with a warning`, () => {
		const s = summarise({ x: 0.2, y: 0.6 });
		expect(s.CCT).toBeNull();
		expect(s.mired).toBeNull();
		expect(s.warnings.length).toBeGreaterThan(0);
	});
	it('throws on impossible or missing values', () => {
		expect(() => inputToXy({ x: 0.8, y: 0.5 })).toThrow(/not a chromaticity/);
		expect(() => inputToXy({ x: 0.3, y: 0 })).toThrow(RangeError);
		expect(() => inputToXy({ u_prime: Number.NaN, v_prime: 0.4 })).toThrow(/u′v′/);
		expect(() => inputToXy({ CCT: 0 })).toThrow(/CCT/);
		expect(() => inputToXy({ X: 1, Y: Number.POSITIVE_INFINITY, Z: 1 })).toThrow(/XYZ/);
		// @ts-expect-error nothing usable
		expect(() => inputToXy({})).toThrow(/chromaticity is needed/);
	});
});
