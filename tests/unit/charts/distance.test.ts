import { describe, expect, it } from 'vitest';
import { CCTToUv, uvPrimeToXy, xyToCCT, xyToUvPrime } from '$lib/colour';
import {
	DISTANCE_PLOT,
	DUV_GRID,
	deltaCircles,
	distanceDomain,
	distanceScales,
	duvGridLines,
	gridCCT,
	isoStepForWidth,
	isotemperatureLines,
	lastVisible,
	toPlane
} from '$lib/charts/distance';

const D65 = { x: 0.31272, y: 0.32903 }; // CIE 15:2004 Table T.3: D65, 2° observer

/** CIE 1960 uv of a chart point (u = u′, v = 2v′/3; CIE 15:2004 §8.1). */
const uv1960 = (p: { x: number; y: number }) => ({ u: p.x, v: (2 * p.y) / 3 });

describe('toPlane', () => {
	it('CIE 15:2004 eq. 8.2: D65 at u′ 0.1978, v′ 0.4683 (from memory)', () => {
		const p = toPlane(D65);
		expect(p.x).toBeCloseTo(0.1978, 4);
		expect(p.y).toBeCloseTo(0.4683, 4);
	});
});

describe('duvGridLines', () => {
	const lines = duvGridLines(5600);

	it('draws the grid at Duv ±0.002, ±0.006, ±0.02 and the locus', () => {
		expect(lines.map((l) => l.Duv)).toEqual([-0.02, -0.006, -0.002, 0, 0.002, 0.006, 0.02]);
		expect(DUV_GRID).toHaveLength(7);
		expect(lines.map((l) => l.label)).toEqual(['−0.02', '−0.006', '−0.002', 'Duv 0', '+0.002', '+0.006', '+0.02']);
	});

	it('Ohno 2014 (LEUKOS 10:47) Duv definition: each line lies |Duv| from the locus in CIE 1960 uv, at the same CCT', () => {
		const locus = lines.find((l) => l.Duv === 0)!;
		for (const line of lines) {
			expect(line.points).toHaveLength(locus.points.length);
			for (let i = 0; i < line.points.length; i += 10) {
				const a = uv1960(line.points[i]);
				const b = uv1960(locus.points[i]);
				expect(Math.hypot(a.u - b.u, a.v - b.v)).toBeCloseTo(Math.abs(line.Duv), 9);
			}
		}
	});

	it('reads back as its Duv through the core’s Ohno 2013 method', () => {
		for (const line of lines) {
			const mid = line.points[Math.floor(line.points.length / 2)];
			const r = xyToCCT(uvPrimeToXy({ u_prime: mid.x, v_prime: mid.y }));
			expect(r.Duv).toBeCloseTo(line.Duv, 4);
			expect(r.CCT).toBeCloseTo(5600, -1);
		}
	});

	it('puts positive Duv above the locus (greener, larger v′)', () => {
		const i = 60;
		const at = (d: number) => lines.find((l) => l.Duv === d)!.points[i];
		expect(at(0.006).y).toBeGreaterThan(at(0).y);
		expect(at(-0.006).y).toBeLessThan(at(0).y);
	});

	it('matches CCTToUv at the centre (the line passes the target CCT)', () => {
		const line = duvGridLines(4000, [0.006], 100, 2)[0];
		const mid = uv1960(line.points[50]);
		const ref = CCTToUv(4000, 0.006);
		expect(mid.u).toBeCloseTo(ref.u, 12);
		expect(mid.v).toBeCloseTo(ref.v, 12);
	});

	it('throws on a zero or NaN CCT', () => {
		expect(() => duvGridLines(0)).toThrow(/CCT/);
		expect(() => duvGridLines(Number.NaN)).toThrow(/CCT/);
	});
});

describe('isotemperatureLines', () => {
	it('sit at multiples of the mired step, each at one CCT from Duv −0.025 to +0.025', () => {
		const lines = isotemperatureLines(5600, 20, 60);
		// 5600 K is 178.6 mired: ±60 mired covers 118.6–238.6.
		expect(lines.map((l) => l.mired)).toEqual([120, 140, 160, 180, 200, 220]);
		expect(lines.find((l) => l.mired === 200)!.label).toBe('5000 K');
		const l = lines.find((k) => k.mired === 200)!;
		const a = xyToCCT(uvPrimeToXy({ u_prime: l.from.x, v_prime: l.from.y }));
		const b = xyToCCT(uvPrimeToXy({ u_prime: l.to.x, v_prime: l.to.y }));
		expect(a.CCT).toBeCloseTo(5000, -1);
		expect(b.CCT).toBeCloseTo(5000, -1);
		expect(a.Duv).toBeCloseTo(-0.025, 4);
		expect(b.Duv).toBeCloseTo(0.025, 4);
	});

	it('chooses finer steps for narrower views', () => {
		expect([0.003, 0.008, 0.024, 0.05, 0.1].map(isoStepForWidth)).toEqual([2, 5, 10, 20, 50]);
	});

	it('throws on a bad step', () => {
		expect(() => isotemperatureLines(5600, 0)).toThrow(/step/);
	});
});

describe('the view and the Δu′v′ circles', () => {
	it('centres the default view on the target with one scale on both axes', () => {
		const d = distanceDomain(D65);
		const c = toPlane(D65);
		expect((d.x0 + d.x1) / 2).toBeCloseTo(c.x, 12);
		expect((d.y0 + d.y1) / 2).toBeCloseTo(c.y, 12);
		const s = distanceScales(d);
		expect((s.x(d.x1) - s.x(d.x0)) / (d.x1 - d.x0)).toBeCloseTo((s.y(d.y0) - s.y(d.y1)) / (d.y1 - d.y0), 6);
	});

	it('draws circles of Δu′v′ 0.001, 0.002, 0.005 whose radii are that distance on the u′ scale', () => {
		const d = distanceDomain(D65);
		const s = distanceScales(d);
		const circles = deltaCircles(D65, s);
		expect(circles.map((c) => c.radius)).toEqual([0.001, 0.002, 0.005]);
		const inner = DISTANCE_PLOT.width - DISTANCE_PLOT.margin.left - DISTANCE_PLOT.margin.right;
		for (const c of circles) expect(c.r).toBeCloseTo((c.radius * inner) / (d.x1 - d.x0), 2);
		// A point Δu′v′ 0.002 to the right of the target lies on the 0.002 circle.
		const t = xyToUvPrime(D65);
		const edge = s.x(t.u_prime + 0.002) - s.x(t.u_prime);
		expect(circles[1].r).toBeCloseTo(edge, 2);
	});

	it('uses the target’s CCT for the grid, clamped to 1000–25000 K', () => {
		// CIE 15:2004 Table T.3: D65 has a CCT of about 6504 K.
		expect(gridCCT(D65)).toBeGreaterThan(6490);
		expect(gridCCT(D65)).toBeLessThan(6520);
		expect(gridCCT({ x: 0.64, y: 0.33 })).toBeLessThanOrEqual(25000);
	});

	it('finds the last point of a line inside the view, or none', () => {
		const d = { x0: 0, x1: 1, y0: 0, y1: 1 };
		expect(lastVisible([{ x: 0.5, y: 0.5 }, { x: 0.9, y: 0.9 }, { x: 2, y: 2 }], d)).toEqual({ x: 0.9, y: 0.9 });
		expect(lastVisible([{ x: 2, y: 2 }], d)).toBeNull();
	});
});
