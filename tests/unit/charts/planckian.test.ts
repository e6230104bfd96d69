import { describe, expect, it } from 'vitest';
import { CCTToUv, CCTToXy } from '$lib/colour';
import { CCTDuvToUv, CCTDuvToXy, planckianFrame } from '$lib/charts/planckian';

describe('CCTDuvToXy', () => {
	it('equals the colour core’s CCTToXy (Ohno 2014 §4: Duv offsets are linear along the normal)', () => {
		for (const K of [1000, 2000, 2856, 3200, 5600, 6504, 10000, 25000]) {
			for (const Duv of [-0.02, -0.006, 0, 0.002, 0.02]) {
				const a = CCTDuvToXy(K, Duv);
				const b = CCTToXy(K, Duv);
				expect(Math.abs(a.x - b.x)).toBeLessThan(1e-12);
				expect(Math.abs(a.y - b.y)).toBeLessThan(1e-12);
			}
		}
	});

	it('offsets by exactly |Duv| in CIE 1960 uv', () => {
		const a = CCTDuvToUv(4000, 0);
		const b = CCTDuvToUv(4000, 0.006);
		expect(Math.hypot(b.u - a.u, b.v - a.v)).toBeCloseTo(0.006, 12);
		const f = planckianFrame(4000);
		expect(Math.hypot(f.nu, f.nv)).toBeCloseTo(1, 12);
		expect(CCTDuvToUv(4000, 0.006).v).toBeCloseTo(CCTToUv(4000, 0.006).v, 12);
	});

	it('throws on a bad CCT or Duv', () => {
		expect(() => CCTDuvToXy(0)).toThrow(/CCT/);
		expect(() => CCTDuvToXy(Number.NaN)).toThrow(/CCT/);
		expect(() => CCTDuvToXy(3000, Number.NaN)).toThrow(/Duv/);
	});
});
