import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { xyToUv1960 } from '../../../../src/lib/colour/chromaticity';
import { cieIlluminant, type CieIlluminantName } from '../../../../src/lib/colour/illuminants/cie';
import { CCTToXy, xyToCCT } from '../../../../src/lib/colour/temperature';
import { CCTToUv, uvToCCTOhno2013 } from '../../../../src/lib/colour/temperature/ohno2013';
import { uvToCCTRobertson1968 } from '../../../../src/lib/colour/temperature/robertson1968';
import { spectrumToXYZ, XYZToXy } from '../../../../src/lib/colour/tristimulus';
import { bruteForceCCT } from './brute-force';

const cctOf = (name: CieIlluminantName) => xyToCCT(XYZToXy(spectrumToXYZ(cieIlluminant(name))));
const mired = (K: number) => 1e6 / K;

describe('CCT of the CIE illuminants', () => {
	it('CIE 15:2004 §3.1: A is a Planckian radiator of 2856 K (2848 K with c2 = 1.435e-2 m·K, i.e. 2855.5 K on c2 = 1.4388e-2), Duv 0', () => {
		const c = cctOf('A');
		expect(Math.abs(c.CCT - 2856)).toBeLessThan(1);
		expect(c.CCT).toBeCloseTo((2848 * 1.4388) / 1.435, 1);
		expect(Math.abs(c.Duv)).toBeLessThan(1e-5);
	});
	it('CIE 15:2004 §3.1: D65 has a CCT of about 6504 K', () => {
		expect(Math.abs(cctOf('D65').CCT - 6504)).toBeLessThan(1);
	});
	// CIE 15:2004 Table T.8 prints CCT to 10 K. Ours agree within half a step plus 5 K: T.8 runs
	// about 0.05 % above a CCT from today's 1 nm locus (F2: 4224.5 K against 4230 K).
	const t8: [CieIlluminantName, number][] = [
		['F1', 6430], ['F2', 4230], ['F3', 3450], ['F4', 2940], ['F5', 6350], ['F6', 4150],
		['F7', 6500], ['F8', 5000], ['F9', 4150], ['F10', 5000], ['F11', 4000], ['F12', 3000]
	];
	for (const [name, K] of t8) {
		it(`CIE 15:2004 Table T.8: CCT of ${name} = ${K} K`, () => {
			expect(Math.abs(cctOf(name).CCT - K)).toBeLessThanOrEqual(10);
		});
	}
});

describe('ANSI C78.377-2017 Table 1: nominal categories, target CCT and Duv → centre chromaticity', () => {
	const table: [string, number, number, number, number][] = [
		['2700 K', 2725, 0.0, 0.4578, 0.4101],
		['4000 K', 3985, 0.001, 0.3818, 0.3797],
		['6500 K', 6532, 0.0031, 0.3123, 0.3283]
	];
	for (const [name, K, Duv, x, y] of table) {
		it(`ANSI C78.377-2017 Table 1: ${name} (${K} K, Duv ${Duv}) → (${x}, ${y})`, () => {
			const c = CCTToXy(K, Duv);
			expect(Math.abs(c.x - x)).toBeLessThanOrEqual(2e-4);
			expect(Math.abs(c.y - y)).toBeLessThanOrEqual(2e-4);
			const back = xyToCCT(c);
			expect(back.CCT).toBeCloseTo(K, 3);
			expect(back.Duv).toBeCloseTo(Duv, 8);
		});
	}
});

describe('Ohno 2013 vs Robertson 1968 vs brute-force minimisation, 1000–20000 K × Duv −0.03…+0.03', () => {
	const temps = [1000, 1200, 1500, 2000, 2700, 3200, 4000, 5000, 6500, 8000, 10000, 13000, 16000, 20000];
	const duvs = [-0.03, -0.02, -0.01, -0.004, -0.0019, -0.0005, 0, 0.0005, 0.0019, 0.0021, 0.004, 0.01, 0.02, 0.03];
	it('agree within 0.05 mired and 2e-5 in Duv; round trip recovers CCT and Duv (batch of 196 points)', () => {
		let worstMired = 0;
		let worstDuv = 0;
		for (const T of temps) {
			for (const D of duvs) {
				const uv = CCTToUv(T, D);
				const o = uvToCCTOhno2013(uv);
				const r = uvToCCTRobertson1968(uv);
				const b = bruteForceCCT(uv.u, uv.v);
				for (const [a, c] of [[o, r], [o, b], [r, b]] as const) {
					worstMired = Math.max(worstMired, Math.abs(mired(a.CCT) - mired(c.CCT)));
					worstDuv = Math.max(worstDuv, Math.abs(a.Duv - c.Duv));
				}
				// Round trip CCT/Duv → uv → CCT/Duv.
				expect(Math.abs(mired(o.CCT) - mired(T))).toBeLessThan(0.05);
				expect(Math.abs(o.Duv - D)).toBeLessThan(2e-5);
			}
		}
		expect(worstMired).toBeLessThan(0.05);
		expect(worstDuv).toBeLessThan(2e-5);
	}, 60_000);
	it('round trip by property: random CCT 1000–20000 K and Duv ±0.05 (regression on our own inverse)', () => {
		fc.assert(
			fc.property(fc.double({ min: 1000, max: 20000, noNaN: true }), fc.double({ min: -0.05, max: 0.05, noNaN: true }), (T, D) => {
				const o = uvToCCTOhno2013(CCTToUv(T, D));
				return Math.abs(o.CCT - T) / T < 1e-6 && Math.abs(o.Duv - D) < 1e-8;
			}),
			{ numRuns: 300 }
		);
	});
});

describe('Duv sign and validity', () => {
	it('Ohno 2014: Duv > 0 above the locus (greenish, larger v), < 0 below', () => {
		const on = CCTToUv(4000, 0);
		expect(uvToCCTOhno2013({ u: on.u, v: on.v + 0.005 }).Duv).toBeGreaterThan(0);
		expect(uvToCCTOhno2013({ u: on.u, v: on.v - 0.005 }).Duv).toBeLessThan(0);
	});
	it('no warning inside 1000–20000 K and |Duv| ≤ 0.05', () => {
		expect(uvToCCTOhno2013(CCTToUv(5600, 0.01)).warnings).toEqual([]);
	});
	it('warns, still returning values, below 1000 K, above 20000 K and beyond |Duv| 0.05', () => {
		const low = uvToCCTOhno2013(CCTToUv(800, 0));
		expect(low.CCT).toBeCloseTo(800, 2);
		expect(low.warnings.join(' ')).toMatch(/outside 1000–20,000 K/);
		expect(uvToCCTOhno2013(CCTToUv(30000, 0)).warnings.join(' ')).toMatch(/not meaningful/);
		const far = uvToCCTOhno2013(CCTToUv(4000, 0.06));
		expect(far.Duv).toBeCloseTo(0.06, 6);
		expect(far.warnings.join(' ')).toMatch(/beyond ±0.05/);
	});
	it('a monochromatic blue (far from the locus) is flagged', () => {
		const r = uvToCCTOhno2013(xyToUv1960({ x: 0.1566, y: 0.0177 }));
		expect(r.warnings.length).toBeGreaterThan(0);
	});
	it('NaN, zero and impossible uv throw clear errors', () => {
		expect(() => uvToCCTOhno2013({ u: NaN, v: 0.3 })).toThrow(/finite/);
		expect(() => uvToCCTOhno2013({ u: 0, v: 0 })).toThrow(/not a chromaticity/);
		expect(() => CCTToUv(0)).toThrow(/positive number of kelvin/);
		expect(() => CCTToUv(5000, NaN)).toThrow(/Duv must be a finite/);
	});
});
