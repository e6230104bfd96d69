import { describe, expect, it } from 'vitest';
import { xyToCCT } from '../../../src/lib/colour';
import { ANSI_C78377_QUADRANGLES, insideQuadrangle, quadrangleCorners, quadranglePaths } from '../../../src/lib/charts/ansi';
import { CCTDuvToXy } from '../../../src/lib/charts/planckian';
import { XY_FULL_DOMAIN, XY_PLOT, xyScales } from '../../../src/lib/charts/cie1931';

const byNominal = (k: number) => ANSI_C78377_QUADRANGLES.find((q) => q.nominalK === k)!;

describe('ANSI C78.377 nominal-CCT quadrangles', () => {
	it('ANSI C78.377-2008 Table 1 (from memory): the eight classes tile the CCT axis, each upper limit the next one’s lower limit within 1 K', () => {
		expect(ANSI_C78377_QUADRANGLES.map((q) => q.nominalK)).toEqual([2700, 3000, 3500, 4000, 4500, 5000, 5700, 6500]);
		for (let i = 1; i < ANSI_C78377_QUADRANGLES.length; i++) {
			const a = ANSI_C78377_QUADRANGLES[i - 1];
			const b = ANSI_C78377_QUADRANGLES[i];
			expect(Math.abs(a.targetK + a.toleranceK - (b.targetK - b.toleranceK))).toBeLessThanOrEqual(1);
		}
		expect(ANSI_C78377_QUADRANGLES.every((q) => q.toleranceDuv === 0.006)).toBe(true);
	});

	// Corner chromaticities as the standard tabulates them (ANSI C78.377-2008 Table 1, from memory).
	const corners: Record<number, [number, number][]> = {
		2700: [[0.4593, 0.3944], [0.4813, 0.4319], [0.4562, 0.426], [0.4373, 0.3893]],
		4000: [[0.3898, 0.3716], [0.4006, 0.4044], [0.3736, 0.3874], [0.367, 0.3578]],
		6500: [[0.3221, 0.3261], [0.3205, 0.3481], [0.3028, 0.3304], [0.3068, 0.3113]]
	};
	it.each(Object.entries(corners))('ANSI C78.377-2008 Table 1 (from memory): the %s K quadrangle’s corners within 5e-4', (k, expected) => {
		const got = quadrangleCorners(byNominal(Number(k)));
		expect(got).toHaveLength(4);
		got.forEach((p, i) => {
			expect(Math.abs(p.x - expected[i][0])).toBeLessThanOrEqual(5e-4);
			expect(Math.abs(p.y - expected[i][1])).toBeLessThanOrEqual(5e-4);
		});
	});

	it('corners sit on the isotemperature lines at the CCT limits and on the Duv limits (round trip through the colour core, Ohno 2014)', () => {
		for (const q of ANSI_C78377_QUADRANGLES) {
			const [a, b, c, d] = quadrangleCorners(q).map((p) => xyToCCT(p));
			for (const w of [a, b]) expect(w.CCT).toBeCloseTo(q.targetK - q.toleranceK, 2);
			for (const w of [c, d]) expect(w.CCT).toBeCloseTo(q.targetK + q.toleranceK, 2);
			for (const w of [a, d]) expect(w.Duv).toBeCloseTo(q.targetDuv - 0.006, 7);
			for (const w of [b, c]) expect(w.Duv).toBeCloseTo(q.targetDuv + 0.006, 7);
		}
	});

	it('a class holds its own target white and not a neighbour’s, nor a point 0.0065 above its Duv target', () => {
		const q = byNominal(4000);
		expect(insideQuadrangle(CCTDuvToXy(3985, 0.001), q)).toBe(true);
		expect(insideQuadrangle(CCTDuvToXy(3465, 0), q)).toBe(false);
		expect(insideQuadrangle(CCTDuvToXy(3985, 0.0075), q)).toBe(false);
		expect(insideQuadrangle(CCTDuvToXy(3985, -0.0055), q)).toBe(false);
		expect(insideQuadrangle(CCTDuvToXy(3985, -0.0045), q)).toBe(true);
	});

	it('paths are closed, one per class, labelled at the centre, and tiny on the full chart (no label room there)', () => {
		const s = xyScales(XY_FULL_DOMAIN, XY_PLOT);
		const shapes = quadranglePaths(s);
		expect(shapes).toHaveLength(8);
		for (const sh of shapes) {
			expect(sh.path).toMatch(/^M.*Z$/);
			expect(sh.width).toBeGreaterThan(0);
			expect(sh.width).toBeLessThan(34);
		}
		const c = CCTDuvToXy(3985, 0.001);
		const four = shapes.find((x) => x.nominalK === 4000)!;
		expect(four.label.x).toBeCloseTo(s.x(c.x), 9);
		expect(four.label.y).toBeCloseTo(s.y(c.y), 9);
	});
});
