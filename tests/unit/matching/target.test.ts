import { describe, expect, it } from 'vitest';
import { CCTToXy, cieIlluminant, spectrumToXYZ, XYZToXy, xyToUvPrime } from '../../../src/lib/colour';
import { DEFAULT_TOLERANCE_DUV_PRIME, distance, resolveTargetWhite } from '../../../src/lib/matching/target';
import { cctTarget, planck } from './factories';

describe('resolveTargetWhite', () => {
	it('CIE 15:2004 Table T.3: illuminant D65 → x 0.3127, y 0.3290, CCT ≈ 6504 K', () => {
		const t = resolveTargetWhite({ kind: 'illuminant', name: 'D65' });
		expect(t.x.toFixed(4)).toBe('0.3127');
		expect(t.y.toFixed(4)).toBe('0.3290');
		expect(Math.abs(t.CCT! - 6504)).toBeLessThan(5);
		expect(t.spectrum).not.toBeNull();
		expect(t.label).toBe('CIE illuminant D65');
	});

	it('CIE 15:2004 Table T.3: illuminant A → x 0.4476, y 0.4074, a Planckian at 2856 K (Duv ≈ 0)', () => {
		const t = resolveTargetWhite({ kind: 'illuminant', name: 'A' });
		expect(t.x.toFixed(4)).toBe('0.4476');
		expect(t.y.toFixed(4)).toBe('0.4074');
		expect(Math.abs(t.CCT! - 2856)).toBeLessThan(2);
		expect(Math.abs(t.Duv!)).toBeLessThan(1e-4);
		expect(t.mired!).toBeCloseTo(1e6 / t.CCT!, 9);
	});

	it('CCT + Duv round-trips through xy (Ohno 2014 via the colour core)', () => {
		const t = resolveTargetWhite({ kind: 'cct', CCT: 5600, Duv: 0.003 });
		const xy = CCTToXy(5600, 0.003);
		expect(t.x).toBeCloseTo(xy.x, 12);
		expect(t.CCT!).toBeCloseTo(5600, 0);
		expect(t.Duv!).toBeCloseTo(0.003, 5);
		expect(t.label).toBe('5600 K, Duv +0.0030');
	});

	it('xy, u′v′ and a stored reading (spectrum or xy) resolve to the same chromaticity', () => {
		const s = planck(4000);
		const xy = XYZToXy(spectrumToXYZ(s));
		const uvp = xyToUvPrime(xy);
		const a = resolveTargetWhite({ kind: 'reading', spectrum: s, label: 'key' });
		const b = resolveTargetWhite({ kind: 'xy', x: xy.x, y: xy.y });
		const c = resolveTargetWhite({ kind: 'uvPrime', u_prime: uvp.u_prime, v_prime: uvp.v_prime });
		const d = resolveTargetWhite({ kind: 'reading', x: xy.x, y: xy.y });
		for (const t of [b, c, d]) {
			expect(t.x).toBeCloseTo(a.x, 12);
			expect(t.y).toBeCloseTo(a.y, 12);
		}
		expect(a.label).toBe('key');
		expect(a.spectrum).toBe(s);
	});

	it('average in u′v′ (default) is the mean of the readings’ u′v′', () => {
		const r = [{ CCT: 3200 }, { CCT: 5600, Duv: 0.002 }];
		const t = resolveTargetWhite({ kind: 'average', readings: r });
		const p = r.map((c) => xyToUvPrime(CCTToXy(c.CCT, c.Duv ?? 0)));
		expect(t.u_prime).toBeCloseTo((p[0].u_prime + p[1].u_prime) / 2, 12);
		expect(t.v_prime).toBeCloseTo((p[0].v_prime + p[1].v_prime) / 2, 12);
	});

	it('Grassmann additivity: the XYZ average equals the colour of an additive mix of the lights at equal luminance', () => {
		const a = cieIlluminant('A');
		const d = cieIlluminant('D65');
		const ya = spectrumToXYZ(a).Y;
		const yd = spectrumToXYZ(d).Y;
		const mix = { ...a, values: a.values.map((v, i) => v / ya + d.values[i] / yd) };
		const mixXy = XYZToXy(spectrumToXYZ(mix));
		const t = resolveTargetWhite({ kind: 'average', space: 'XYZ', readings: [{ spectrum: a }, { spectrum: d }] });
		expect(t.x).toBeCloseTo(mixXy.x, 12);
		expect(t.y).toBeCloseTo(mixXy.y, 12);
		// The two averages differ, but for near whites only slightly (regression: ~0.003 for A with D65).
		const u = resolveTargetWhite({ kind: 'average', readings: [{ spectrum: a }, { spectrum: d }] });
		const gap = Math.hypot(u.u_prime - t.u_prime, u.v_prime - t.v_prime);
		expect(gap).toBeGreaterThan(0);
		expect(gap).toBeLessThan(0.01);
	});

	it('common practice: the default tolerance is Δu′v′ 0.002; a production may set its own', () => {
		expect(cctTarget(5600).tolerance).toBe(DEFAULT_TOLERANCE_DUV_PRIME);
		expect(DEFAULT_TOLERANCE_DUV_PRIME).toBe(0.002);
		expect(cctTarget(5600, 0, 0.004).tolerance).toBe(0.004);
	});

	it('throws on bad targets', () => {
		expect(() => resolveTargetWhite({ kind: 'cct', CCT: -1 })).toThrow(/kelvin/);
		expect(() => resolveTargetWhite({ kind: 'xy', x: Number.NaN, y: 0.3 })).toThrow(/not a chromaticity/);
		expect(() => resolveTargetWhite({ kind: 'reading' })).toThrow(/spectrum or its xy/);
		expect(() => resolveTargetWhite({ kind: 'average', readings: [] })).toThrow(/at least one/);
		expect(() => resolveTargetWhite({ kind: 'cct', CCT: 5600 }, { tolerance: 0 })).toThrow(/Tolerance/);
		expect(() => resolveTargetWhite({ kind: 'cct', CCT: 5600 }, { tolerance: Number.NaN })).toThrow(/Tolerance/);
		// @ts-expect-error an unknown kind
		expect(() => resolveTargetWhite({ kind: 'guess' })).toThrow(/Unknown target kind/);
	});
});

describe('distance', () => {
	it('common practice mired arithmetic: a 3200 K reading from a 5600 K target needs −133.9 mired (CTB), no Duv, not within', () => {
		const d = distance({ CCT: 3200 }, cctTarget(5600));
		expect(d.mired!).toBeCloseTo(1e6 / 5600 - 1e6 / 3200, 0);
		expect(Math.abs(d.dDuv!)).toBeLessThan(1e-4);
		expect(d.within).toBe(false);
		expect(d.duv_prime).toBeGreaterThan(0.03);
	});
	it('Duv sign (Ohno 2014: Duv > 0 above the locus): a reading below the target’s Duv needs plus green (dDuv > 0)', () => {
		const d = distance({ CCT: 5600, Duv: -0.004 }, cctTarget(5600, 0));
		expect(d.dDuv!).toBeCloseTo(0.004, 4);
		expect(Math.abs(d.mired!)).toBeLessThan(0.5);
		// u′ = u, v′ = 1.5 v (CIE 15:2004 §8.1): a Duv step of 0.004 in uv is 0.004–0.006 in u′v′.
		expect(d.duv_prime).toBeGreaterThan(0.004 - 1e-6);
		expect(d.duv_prime).toBeLessThan(0.006);
	});
	it('is within the tolerance at and under it, and zero on the target', () => {
		const t = cctTarget(4000);
		expect(distance({ x: t.x, y: t.y }, t)).toEqual({ duv_prime: 0, mired: 0, dDuv: 0, within: true });
		const near = { u_prime: t.u_prime + 0.0019, v_prime: t.v_prime };
		expect(distance(near, t).within).toBe(true);
		expect(distance({ u_prime: t.u_prime + 0.0021, v_prime: t.v_prime }, t).within).toBe(false);
	});
	it('has no mired or dDuv for a light without a CCT', () => {
		const d = distance({ x: 0.2, y: 0.6 }, cctTarget(4000));
		expect(d.mired).toBeNull();
		expect(d.dDuv).toBeNull();
	});
});
