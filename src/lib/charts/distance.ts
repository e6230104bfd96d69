/**
 * Geometry of the distance view: a zoomed CIE 1976 u′v′ plane around a target white, with a grid of
 * constant-Duv lines near the target's CCT, isotemperature lines at even mired steps, and circles of
 * constant Δu′v′ about the target. It shows a crew how far a reading is off and in which direction
 * (warmer or cooler along the locus, greener or more magenta across it).
 *
 * Duv is defined on the CIE 1960 uv plane, so a line of constant Duv is the set CCTToUv(T, Duv) for
 * varying T, carried to u′v′ (u′ = u, v′ = 1.5 v) through xy with the colour core's conversions.
 * Δu′v′ is Euclidean in u′v′, so its circles are true circles here (both axes share one scale).
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §8.1 (CIE 1976 UCS u′v′), §9.5 (CCT on the CIE 1960 UCS).
 *   Y. Ohno, "Practical use and calculation of CCT and Duv", LEUKOS 10(1), 47–55, 2014,
 *     doi:10.1080/15502724.2013.855138 (Duv: signed distance from the Planckian locus in uv).
 *   Mired: M = 10⁶ / T with T in kelvin (common practice).
 */
import { xyToCCT, xyToUvPrime } from '../colour';
import { CCTDuvToXy } from './planckian';
import { contains, domainAround, planeScales, round, type Domain, type PlaneScales, type Plot, type Point } from './viewport';

/** Duv values of the grid lines (0 is the Planckian locus itself). */
export const DUV_GRID = [-0.02, -0.006, -0.002, 0, 0.002, 0.006, 0.02] as const;

/** Radii of the Δu′v′ circles about the target. */
export const DELTA_CIRCLES = [0.001, 0.002, 0.005] as const;

/** viewBox 420 × 412: an inner plot of 352 × 360 units. */
export const DISTANCE_PLOT: Plot = { width: 420, height: 412, margin: { top: 12, right: 12, bottom: 40, left: 56 } };

/** Default view width in u′ (Δu′v′ 0.005 circles and Duv ±0.006 lines fit). */
export const DISTANCE_DEFAULT_WIDTH = 0.024;
export const DISTANCE_MAX_WIDTH = 0.1;
export const DISTANCE_MIN_WIDTH = 0.002;

export interface UvPoint {
	/** u′ on the chart's x axis. */
	x: number;
	/** v′ on the chart's y axis. */
	y: number;
}

/** u′v′ of an xy chromaticity, as chart coordinates (x = u′, y = v′). */
export function toPlane(xy: Point): UvPoint {
	const p = xyToUvPrime(xy);
	return { x: p.u_prime, y: p.v_prime };
}

/** The default view: centred on the target, `width` of u′ across, the plot's aspect ratio. */
export function distanceDomain(targetXy: Point, width = DISTANCE_DEFAULT_WIDTH, plot: Plot = DISTANCE_PLOT): Domain {
	return domainAround(toPlane(targetXy), width, plot);
}

/** The widest view (pan and zoom-out limits). */
export function distanceLimits(targetXy: Point, plot: Plot = DISTANCE_PLOT): Domain {
	return domainAround(toPlane(targetXy), DISTANCE_MAX_WIDTH, plot);
}

export function distanceScales(domain: Domain, plot: Plot = DISTANCE_PLOT): PlaneScales {
	return planeScales(domain, plot);
}

/** The target's CCT in kelvin for the grid, clamped to 1000–25000 K (Ohno 2013 via the core). */
export function gridCCT(targetXy: Point): number {
	const { CCT } = xyToCCT(targetXy);
	if (!Number.isFinite(CCT)) return 6500;
	return Math.min(25000, Math.max(1000, CCT));
}

export interface DuvLine {
	Duv: number;
	/** u′v′ points (x = u′, y = v′) from the warm end to the cool end. */
	points: UvPoint[];
	/** Signed label, e.g. "+0.006", "0", "−0.02". */
	label: string;
}

export function duvLabel(Duv: number): string {
	if (Duv === 0) return 'Duv 0';
	return `${Duv > 0 ? '+' : '−'}${Math.abs(Duv)}`;
}

/**
 * Lines of constant Duv near `CCT` (kelvin): for each Duv, CCTDuvToXy(T, Duv) → u′v′ for T from
 * `halfRangeMired` mired warmer to as many cooler, every `stepMired` mired.
 */
export function duvGridLines(CCT: number, duvs: readonly number[] = DUV_GRID, halfRangeMired = 120, stepMired = 4): DuvLine[] {
	if (!(CCT > 0) || !Number.isFinite(CCT)) throw new RangeError(`CCT must be a temperature in kelvin above 0, got ${CCT}`);
	const m0 = 1e6 / CCT;
	const hi = Math.min(1000, m0 + halfRangeMired);
	const lo = Math.max(40, m0 - halfRangeMired);
	return duvs.map((Duv) => {
		const points: UvPoint[] = [];
		for (let m = hi; m >= lo - 1e-9; m -= stepMired) points.push(toPlane(CCTDuvToXy(1e6 / m, Duv)));
		return { Duv, points, label: duvLabel(Duv) };
	});
}

export interface IsoLine {
	K: number;
	mired: number;
	label: string;
	from: UvPoint;
	to: UvPoint;
}

/** Isotemperature lines (Duv −span … +span) at multiples of `stepMired` within ±halfRangeMired of CCT. */
export function isotemperatureLines(CCT: number, stepMired = 10, halfRangeMired = 120, span = 0.025): IsoLine[] {
	if (!(CCT > 0) || !Number.isFinite(CCT)) throw new RangeError(`CCT must be a temperature in kelvin above 0, got ${CCT}`);
	if (!(stepMired > 0)) throw new RangeError(`mired step must be > 0, got ${stepMired}`);
	const m0 = 1e6 / CCT;
	const out: IsoLine[] = [];
	const first = Math.ceil(Math.max(40, m0 - halfRangeMired) / stepMired) * stepMired;
	for (let m = first; m <= Math.min(1000, m0 + halfRangeMired) + 1e-9; m += stepMired) {
		const K = 1e6 / m;
		out.push({ K, mired: m, label: `${Math.round(K)} K`, from: toPlane(CCTDuvToXy(K, -span)), to: toPlane(CCTDuvToXy(K, span)) });
	}
	return out;
}

/** Mired step for the isotemperature lines so that a few fall across a view `width` of u′ wide. */
export function isoStepForWidth(width: number): number {
	if (width <= 0.004) return 2;
	if (width <= 0.01) return 5;
	if (width <= 0.03) return 10;
	if (width <= 0.06) return 20;
	return 50;
}

/** SVG path through u′v′ points. */
export function uvPath(points: readonly UvPoint[], s: PlaneScales): string {
	let d = '';
	for (let i = 0; i < points.length; i++) d += `${i ? 'L' : 'M'}${round(s.x(points[i].x))},${round(s.y(points[i].y))}`;
	return d;
}

/** The last point of a polyline inside the domain (for a label at the line's visible end), or null. */
export function lastVisible(points: readonly UvPoint[], domain: Domain, inset = 0): UvPoint | null {
	const w = domain.x1 - domain.x0;
	const inner: Domain = { x0: domain.x0 + w * inset, x1: domain.x1 - w * inset, y0: domain.y0 + w * inset, y1: domain.y1 - w * inset };
	for (let i = points.length - 1; i >= 0; i--) if (contains(inner, points[i])) return points[i];
	return null;
}

export interface DeltaCircle {
	/** Radius Δu′v′. */
	radius: number;
	/** Radius in viewBox units. */
	r: number;
	cx: number;
	cy: number;
	label: string;
}

/** Circles of constant Δu′v′ about the target (true circles: u′ and v′ share the scale). */
export function deltaCircles(targetXy: Point, s: PlaneScales, radii: readonly number[] = DELTA_CIRCLES): DeltaCircle[] {
	const c = toPlane(targetXy);
	return radii.map((radius) => ({
		radius,
		r: round(radius * s.unit, 3),
		cx: round(s.x(c.x)),
		cy: round(s.y(c.y)),
		label: `Δu′v′ ${radius}`
	}));
}
