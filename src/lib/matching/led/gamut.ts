/**
 * The gamut of a multi-channel fixture in CIE 1976 u'v': the convex hull of its channels'
 * chromaticities, a point-in-gamut test, and the nearest gamut point to a chromaticity.
 *
 * Why u'v' and a convex hull: an additive mixture's tristimulus values are the sum of the
 * channels' (Grassmann's laws), and u' = 4X/D, v' = 9Y/D with D = X + 15Y + 3Z is a projective
 * map, so a mixture's u'v' is the weighted mean Σ wᵢ pᵢ / Σ wᵢ with wᵢ = lᵢ Dᵢ ≥ 0: every mix lies
 * in the convex hull of the channel points, and every hull point is reachable. Distances in u'v'
 * are Euclidean, so the nearest reachable chromaticity is the Euclidean projection on the hull.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §8.1 (u'v'); H. Grassmann, "Zur Theorie der Farbenmischung",
 *   Annalen der Physik 165(5), 69–84, 1853 (additivity).
 *   A. M. Andrew, "Another efficient algorithm for convex hulls in two dimensions", Information
 *   Processing Letters 9(5), 216–219, 1979 (monotone chain).
 */

export interface Point {
	u: number;
	v: number;
}

const cross = (o: Point, a: Point, b: Point) => (a.u - o.u) * (b.v - o.v) - (a.v - o.v) * (b.u - o.u);

/** Indices of the hull vertices in counter-clockwise order (Andrew 1979). Collinear points dropped. */
export function convexHull(points: readonly Point[]): number[] {
	const idx = points.map((_, i) => i).sort((a, b) => points[a].u - points[b].u || points[a].v - points[b].v);
	const unique: number[] = [];
	for (const i of idx) {
		const last = unique[unique.length - 1];
		if (last === undefined || Math.hypot(points[i].u - points[last].u, points[i].v - points[last].v) > 1e-12) unique.push(i);
	}
	if (unique.length <= 2) return unique;
	const lower: number[] = [];
	for (const i of unique) {
		while (lower.length >= 2 && cross(points[lower[lower.length - 2]], points[lower[lower.length - 1]], points[i]) <= 1e-15) lower.pop();
		lower.push(i);
	}
	const upper: number[] = [];
	for (let k = unique.length - 1; k >= 0; k--) {
		const i = unique[k];
		while (upper.length >= 2 && cross(points[upper[upper.length - 2]], points[upper[upper.length - 1]], points[i]) <= 1e-15) upper.pop();
		upper.push(i);
	}
	lower.pop();
	upper.pop();
	const hull = [...lower, ...upper];
	return hull.length >= 2 ? hull : unique.slice(0, 2);
}

export interface NearestOnSegment {
	point: Point;
	/** Position along a→b, 0..1. */
	t: number;
	distance: number;
}

export function nearestOnSegment(p: Point, a: Point, b: Point): NearestOnSegment {
	const du = b.u - a.u;
	const dv = b.v - a.v;
	const len2 = du * du + dv * dv;
	const t = len2 > 0 ? Math.min(1, Math.max(0, ((p.u - a.u) * du + (p.v - a.v) * dv) / len2)) : 0;
	const point = { u: a.u + t * du, v: a.v + t * dv };
	return { point, t, distance: Math.hypot(p.u - point.u, p.v - point.v) };
}

export interface GamutLocation {
	inside: boolean;
	/** Nearest gamut point (the point itself when inside). */
	nearest: Point;
	/** Distance from the gamut (0 inside), Δu'v'. */
	distance: number;
	/** When outside: the hull edge (channel indices a, b; a === b for a vertex) the nearest point lies on. */
	edge: [number, number] | null;
}

/** Where p lies relative to the hull of `points` (tolerance `eps` in u'v'). */
export function locateInGamut(p: Point, points: readonly Point[], eps = 1e-10): GamutLocation {
	const hull = convexHull(points);
	if (hull.length === 1) {
		const a = points[hull[0]];
		const d = Math.hypot(p.u - a.u, p.v - a.v);
		return { inside: d <= eps, nearest: { ...a }, distance: d <= eps ? 0 : d, edge: d <= eps ? null : [hull[0], hull[0]] };
	}
	let inside = hull.length >= 3;
	if (inside) {
		for (let k = 0; k < hull.length; k++) {
			const a = points[hull[k]];
			const b = points[hull[(k + 1) % hull.length]];
			const len = Math.hypot(b.u - a.u, b.v - a.v);
			if (cross(a, b, p) / len < -eps) {
				inside = false;
				break;
			}
		}
	}
	if (inside) return { inside: true, nearest: { ...p }, distance: 0, edge: null };
	const b = nearestOnBoundary(p, points, hull);
	if (b.distance <= eps) return { inside: true, nearest: b.point, distance: 0, edge: null };
	return { inside: false, nearest: b.point, distance: b.distance, edge: b.edge };
}

/** The nearest point of the hull's boundary to p (inside or out), and the edge (or vertex) it lies on. */
export function nearestOnBoundary(
	p: Point,
	points: readonly Point[],
	hull: number[] = convexHull(points)
): { point: Point; distance: number; edge: [number, number] } {
	if (hull.length === 1) {
		const a = points[hull[0]];
		return { point: { ...a }, distance: Math.hypot(p.u - a.u, p.v - a.v), edge: [hull[0], hull[0]] };
	}
	let best: { n: NearestOnSegment; a: number; b: number } | null = null;
	const edges = hull.length === 2 ? 1 : hull.length;
	for (let k = 0; k < edges; k++) {
		const a = hull[k];
		const b = hull[(k + 1) % hull.length];
		const n = nearestOnSegment(p, points[a], points[b]);
		if (!best || n.distance < best.n.distance) best = { n, a, b };
	}
	const b = best as { n: NearestOnSegment; a: number; b: number };
	const edge: [number, number] = b.n.t <= 1e-12 ? [b.a, b.a] : b.n.t >= 1 - 1e-12 ? [b.b, b.b] : [b.a, b.b];
	return { point: b.n.point, distance: b.n.distance, edge };
}
