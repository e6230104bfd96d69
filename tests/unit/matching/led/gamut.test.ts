import { describe, expect, it } from 'vitest';
import { convexHull, locateInGamut, nearestOnSegment } from '../../../../src/lib/matching/led/gamut';

const tri = [
	{ u: 0, v: 0 },
	{ u: 1, v: 0 },
	{ u: 0, v: 1 }
];

describe('convexHull (Andrew 1979)', () => {
	it('keeps the corners, drops interior and collinear points, counter-clockwise', () => {
		const pts = [...tri, { u: 0.2, v: 0.2 }, { u: 0.5, v: 0 }];
		const h = convexHull(pts);
		expect(h.sort()).toEqual([0, 1, 2]);
		const ccw = convexHull(tri);
		const [a, b, c] = ccw.map((i) => tri[i]);
		expect((b.u - a.u) * (c.v - a.v) - (b.v - a.v) * (c.u - a.u)).toBeGreaterThan(0);
	});
	it('handles two points and one point', () => {
		expect(convexHull([{ u: 0, v: 0 }, { u: 1, v: 1 }])).toHaveLength(2);
		expect(convexHull([{ u: 0.3, v: 0.3 }, { u: 0.3, v: 0.3 }])).toHaveLength(1);
	});
});

describe('locateInGamut', () => {
	it('geometry: inside, on an edge, beyond an edge, beyond a corner', () => {
		expect(locateInGamut({ u: 0.2, v: 0.2 }, tri).inside).toBe(true);
		expect(locateInGamut({ u: 0.5, v: 0 }, tri).inside).toBe(true);
		const out = locateInGamut({ u: 1, v: 1 }, tri);
		expect(out.inside).toBe(false);
		expect(out.nearest.u).toBeCloseTo(0.5, 12);
		expect(out.nearest.v).toBeCloseTo(0.5, 12);
		expect(out.distance).toBeCloseTo(Math.SQRT1_2, 12);
		expect(out.edge!.sort()).toEqual([1, 2]);
		const corner = locateInGamut({ u: 2, v: -1 }, tri);
		expect(corner.edge).toEqual([1, 1]);
		expect(corner.distance).toBeCloseTo(Math.SQRT2, 12);
	});
	it('a two-channel gamut is a segment', () => {
		const seg = [{ u: 0, v: 0 }, { u: 1, v: 0 }];
		expect(locateInGamut({ u: 0.5, v: 0 }, seg).inside).toBe(true);
		const l = locateInGamut({ u: 0.25, v: 0.1 }, seg);
		expect(l.inside).toBe(false);
		expect(l.nearest).toEqual({ u: 0.25, v: 0 });
	});
	it('nearestOnSegment clamps to the ends', () => {
		expect(nearestOnSegment({ u: -1, v: 0 }, { u: 0, v: 0 }, { u: 1, v: 0 }).t).toBe(0);
		expect(nearestOnSegment({ u: 3, v: 1 }, { u: 0, v: 0 }, { u: 1, v: 0 }).t).toBe(1);
	});
});
