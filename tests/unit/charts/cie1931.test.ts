import { describe, expect, it } from 'vitest';
import { CCTToXy, xyToCCT, xyToUvPrime } from '$lib/colour';
import {
	SHAPES,
	circleRadius,
	shapePolygon,
	XY_FULL_DOMAIN,
	arrowShape,
	daylightLocus,
	duvBandPath,
	isotemperatureTicks,
	locusAt,
	miredStepForZoom,
	planckianLocus,
	planckianLocusPath,
	project,
	shapeFor,
	shapePath,
	spectralLocus,
	spectralLocusPath,
	toleranceOutlineXy,
	wavelengthTicks,
	xyScales
} from '$lib/charts/cie1931';

// Published chromaticities used below.
const D65 = { x: 0.31272, y: 0.32903 }; // CIE 15:2004 Table T.3: D65, 2° observer
const ILLUMINANT_A = { x: 0.44757, y: 0.40745 }; // CIE 15:2004 Table T.3: A, 2° observer (Planckian, 2856 K)

/** Vertices of an SVG path made of M/L commands (and an optional Z). */
function vertices(d: string): Array<{ x: number; y: number }> {
	return [...d.matchAll(/[ML]\s*(-?[\d.]+)[ ,](-?[\d.]+)/g)].map((m) => ({ x: Number(m[1]), y: Number(m[2]) }));
}

/** Shortest distance from p to the polyline through `pts`. */
function distanceToPolyline(p: { x: number; y: number }, pts: Array<{ x: number; y: number }>): number {
	let best = Infinity;
	for (let i = 0; i < pts.length - 1; i++) {
		const a = pts[i];
		const b = pts[i + 1];
		const dx = b.x - a.x;
		const dy = b.y - a.y;
		const t = Math.max(0, Math.min(1, ((p.x - a.x) * dx + (p.y - a.y) * dy) / (dx * dx + dy * dy || 1)));
		best = Math.min(best, Math.hypot(p.x - (a.x + t * dx), p.y - (a.y + t * dy)));
	}
	return best;
}

describe('xyScales', () => {
	it('CIE 15:2004 Table T.3: D65 (0.31272, 0.32903) lands where the plot geometry puts it', () => {
		// The plot is 480 × 540 user units inside margins left 48 and top 12, for x 0–0.8 and y 0–0.9:
		// x → 48 + 0.31272 / 0.8 × 480 = 235.632; y → 12 + 540 − 0.32903 / 0.9 × 540 = 354.582.
		const p = project(xyScales(), D65);
		expect(p.x).toBeCloseTo(235.632, 9);
		expect(p.y).toBeCloseTo(354.582, 9);
	});

	it('uses one scale on both axes (600 units per unit of x and of y)', () => {
		const s = xyScales();
		expect(s.x(0.1) - s.x(0)).toBeCloseTo(60, 9);
		expect(s.y(0) - s.y(0.1)).toBeCloseTo(60, 9);
	});
});

describe('spectral locus', () => {
	it('CIE 15:2004 Table T.4: 520 nm at x 0.0743, y 0.8338 (from memory; x̄/(x̄+ȳ+z̄) of the table row)', () => {
		const p = locusAt(520)!;
		expect(p.x).toBeCloseTo(0.0743, 4);
		expect(p.y).toBeCloseTo(0.8338, 4);
	});

	it('runs 380–700 nm and closes with the line of purples', () => {
		const l = spectralLocus();
		expect(l[0].wavelength).toBe(380);
		expect(l.at(-1)!.wavelength).toBe(700);
		const d = spectralLocusPath(xyScales());
		expect(d.endsWith('Z')).toBe(true);
		expect(vertices(d)).toHaveLength(l.length);
	});

	it('has no point outside 380–700 nm between samples', () => {
		expect(locusAt(379)).toBeNull();
		expect(locusAt(701)).toBeNull();
		expect(locusAt(Number.NaN)).toBeNull();
	});

	it('puts wavelength ticks across the locus, pointing away from the white point', () => {
		const s = xyScales();
		const white = project(s, { x: 1 / 3, y: 1 / 3 });
		const ticks = wavelengthTicks(s, XY_FULL_DOMAIN);
		expect(ticks.map((t) => t.wavelength)).toContain(520);
		for (const t of ticks) {
			const inner = Math.hypot(t.x1 - white.x, t.y1 - white.y);
			const outer = Math.hypot(t.x2 - white.x, t.y2 - white.y);
			expect(outer).toBeGreaterThan(inner);
			expect(Math.hypot(t.x2 - t.x1, t.y2 - t.y1)).toBeCloseTo(7, 1);
		}
	});

	it('drops wavelength ticks outside a zoomed view', () => {
		const s = xyScales({ x0: 0.3, x1: 0.4, y0: 0.3, y1: 0.4125 });
		expect(wavelengthTicks(s, { x0: 0.3, x1: 0.4, y0: 0.3, y1: 0.4125 })).toEqual([]);
	});
});

describe('Planckian locus', () => {
	it('CIE 15:2004 Table T.3: illuminant A lies on the locus at 2856 K', () => {
		const [p] = planckianLocus(2856, 2857, 5, 0, []);
		expect(p.x).toBeCloseTo(ILLUMINANT_A.x, 4);
		expect(p.y).toBeCloseTo(ILLUMINANT_A.y, 4);
	});

	it('the 3200 K tick equals CCTToXy(3200, 0) within 1e-6 and lies on the drawn path', () => {
		const s = xyScales();
		const tick = isotemperatureTicks(s, XY_FULL_DOMAIN, 100).find((t) => t.K === 3200)!;
		expect(tick).toBeDefined();
		const core = CCTToXy(3200, 0);
		expect(Math.abs(tick.at.x - core.x)).toBeLessThan(1e-6);
		expect(Math.abs(tick.at.y - core.y)).toBeLessThan(1e-6);
		// On the path: within the path's 0.01-unit rounding of the drawn polyline (0.6 µ of x).
		const onScreen = project(s, tick.at);
		expect(distanceToPolyline(onScreen, vertices(planckianLocusPath(s)))).toBeLessThan(0.01);
		// The tick crosses the locus there: an isotemperature line is straight in uv, so straight in xy
		// (a projective map), and the locus point lies on it between its two ends.
		expect(distanceToPolyline(onScreen, [{ x: tick.x1, y: tick.y1 }, { x: tick.x2, y: tick.y2 }])).toBeLessThan(0.02);
	});

	it('stays smooth when zoomed in: finer vertices in view, every temperature within 0.05 units of the path', () => {
		const c = CCTToXy(3200, 0);
		const domain = { x0: c.x - 0.01, x1: c.x + 0.01, y0: c.y - 0.01125, y1: c.y + 0.01125 };
		const s = xyScales(domain);
		const pts = vertices(planckianLocusPath(s, domain));
		const inView = pts.filter((p) => p.x >= 48 && p.x <= 528 && p.y >= 12 && p.y <= 552);
		expect(inView.length).toBeGreaterThan(20);
		for (const K of [3000, 3100, 3150, 3250, 3333, 3400]) {
			expect(distanceToPolyline(project(s, CCTToXy(K, 0)), pts)).toBeLessThan(0.05);
		}
	});

	it('labels even mired steps with the rounded kelvin (common practice: equal mired steps)', () => {
		const ticks = isotemperatureTicks(xyScales(), XY_FULL_DOMAIN, 100, []);
		expect(ticks.map((t) => t.label)).toEqual(['10000 K', '5000 K', '3333 K', '2500 K', '2000 K', '1667 K', '1429 K', '1250 K', '1111 K', '1000 K']);
		for (const t of ticks) expect(t.mired % 100).toBeCloseTo(0, 9);
		const fifty = isotemperatureTicks(xyScales(), XY_FULL_DOMAIN, 50, []).map((t) => Math.round(t.mired));
		expect(fifty.slice(0, 4)).toEqual([50, 100, 150, 200]);
	});

	it('isotemperature ticks span Duv −0.01 … +0.01 along the CCT (Ohno 2013 in the core reads them back)', () => {
		const s = xyScales();
		const t = isotemperatureTicks(s, XY_FULL_DOMAIN, 100).find((k) => k.K === 5000)!;
		const ends = [
			{ x: s.x.invert(t.x1), y: s.y.invert(t.y1) },
			{ x: s.x.invert(t.x2), y: s.y.invert(t.y2) }
		].map((p) => xyToCCT(p));
		expect(ends[0].CCT).toBeCloseTo(5000, -1);
		expect(ends[1].CCT).toBeCloseTo(5000, -1);
		expect(ends[0].Duv).toBeCloseTo(-0.01, 4);
		expect(ends[1].Duv).toBeCloseTo(0.01, 4);
	});

	it('zooming in tightens the mired step', () => {
		const steps = [1, 3, 6, 12, 30].map(miredStepForZoom);
		expect(steps).toEqual([100, 50, 20, 10, 5]);
	});

	it('throws on a bad range or step', () => {
		expect(() => planckianLocus(0, 1000)).toThrow(/range/);
		expect(() => planckianLocus(5000, 4000)).toThrow(/range/);
		expect(() => planckianLocus(1000, 5000, 0)).toThrow(/range/);
		expect(() => isotemperatureTicks(xyScales(), XY_FULL_DOMAIN, 0)).toThrow(/step/);
	});

	it('the Duv ±0.006 band reads back as Duv ±0.006 (Ohno 2013 in the core)', () => {
		const s = xyScales();
		const pts = vertices(duvBandPath(s, 0.006, 3000, 6000)).map((p) => ({ x: s.x.invert(p.x), y: s.y.invert(p.y) }));
		const upper = xyToCCT(pts[10]);
		const lower = xyToCCT(pts[pts.length - 10]);
		// Path vertices are rounded to 0.01 user units (1.7e-5 in x): Duv within 5e-5.
		expect(upper.Duv).toBeCloseTo(0.006, 4);
		expect(lower.Duv).toBeCloseTo(-0.006, 4);
	});
});

describe('daylight locus', () => {
	it('CIE 15:2004 Table T.3: D65 sits on the daylight locus at 6504 K', () => {
		// The tabulated D65 (rounded M1, M2 and values) sits about 1e-4 from the locus formula's point.
		const [p] = daylightLocus(6504, 6505);
		expect(Math.abs(p.x - D65.x)).toBeLessThan(2e-4);
		expect(Math.abs(p.y - D65.y)).toBeLessThan(2e-4);
	});

	it('refuses temperatures outside 4000–25000 K', () => {
		expect(() => daylightLocus(3000, 5000)).toThrow(/4000/);
	});
});

describe('target tolerance', () => {
	it('is a circle of Δu′v′ 0.002 about the target in u′v′', () => {
		const c = xyToUvPrime(D65);
		for (const p of toleranceOutlineXy(D65, 0.002)) {
			const q = xyToUvPrime(p);
			expect(Math.hypot(q.u_prime - c.u_prime, q.v_prime - c.v_prime)).toBeCloseTo(0.002, 12);
		}
	});

	it('is not a circle in xy (it maps to an ellipse-like curve)', () => {
		const d = toleranceOutlineXy(D65, 0.002).map((p) => Math.hypot(p.x - D65.x, p.y - D65.y));
		expect(Math.max(...d) / Math.min(...d)).toBeGreaterThan(1.2);
	});

	it('throws on a zero, negative or NaN tolerance', () => {
		expect(() => toleranceOutlineXy(D65, 0)).toThrow(/tolerance/);
		expect(() => toleranceOutlineXy(D65, -0.001)).toThrow(/tolerance/);
		expect(() => toleranceOutlineXy(D65, Number.NaN)).toThrow(/tolerance/);
	});
});

describe('arrows and marks', () => {
	it('ends the arrow head at the target point and the shaft at the head', () => {
		const a = arrowShape({ x: 0, y: 0 }, { x: 30, y: 40 }, 10)!;
		expect(a.head.startsWith('M30,40')).toBe(true);
		expect(a.x2).toBeCloseTo(24, 9);
		expect(a.y2).toBeCloseTo(32, 9);
	});

	it('draws no arrow for a zero or NaN length', () => {
		expect(arrowShape({ x: 5, y: 5 }, { x: 5, y: 5 })).toBeNull();
		expect(arrowShape({ x: 5, y: 5 }, { x: Number.NaN, y: 5 })).toBeNull();
	});

	it('gives each role its own mark, honours an explicit shape and cycles otherwise', () => {
		expect(shapeFor({ role: 'key' }, 3)).toBe('circle');
		expect(shapeFor({ role: 'fill' }, 0)).toBe('square');
		expect(shapeFor({ shape: 'star', role: 'key' }, 0)).toBe('star');
		expect(shapeFor({}, 1)).toBe(SHAPES[1]);
		expect(shapeFor({ shape: 'blob' as never }, 2)).toBe(SHAPES[2]);
		const paths = new Set(SHAPES.map((s) => shapePath(s)));
		expect(paths.size).toBe(SHAPES.length);
	});

	it('gives canvas polygons of the same marks, each enclosing about its requested area (d3-shape symbols are sized by area)', () => {
		expect(shapePolygon('circle', 64)).toBeNull();
		expect(Math.PI * circleRadius(64) ** 2).toBeCloseTo(64, 9);
		expect(shapePolygon('square', 64)).toEqual([[-4, -4], [4, -4], [4, 4], [-4, 4]]);
		for (const shape of SHAPES.filter((s) => s !== 'circle')) {
			const p = shapePolygon(shape, 64)!;
			let a = 0;
			for (let i = 0; i < p.length; i++) {
				const [x0, y0] = p[i];
				const [x1, y1] = p[(i + 1) % p.length];
				a += x0 * y1 - x1 * y0;
			}
			expect(Math.abs(a) / 2).toBeGreaterThan(64 * 0.9);
			expect(Math.abs(a) / 2).toBeLessThan(64 * 1.1);
		}
	});
});
