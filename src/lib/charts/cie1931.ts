/**
 * Geometry of the CIE 1931 xy chromaticity chart: scales, the spectral locus with wavelength ticks,
 * the Planckian locus with isotemperature ticks at even mired steps, the CIE daylight locus, a band
 * of ±Duv around the Planckian locus, a target's Δu′v′ tolerance drawn in xy, and arrows.
 * Everything returns plain numbers and SVG path strings; the Svelte components only draw them.
 *
 * The chromaticities themselves come from the colour core (CMF-based spectral locus, Planckian
 * chromaticity with Duv offsets, xy ↔ u′v′); this file only places them on the drawing.
 *
 * Two drawing choices a reader should know:
 *   - The tolerance of a target is a distance Δu′v′ (CIE 1976 UCS), so the tolerance is a circle
 *     in u′v′. Mapped to xy it becomes a closed curve close to an ellipse (the projective map from
 *     u′v′ to xy is smooth, not affine), tilted and stretched along the green direction. We sample
 *     the u′v′ circle and map each point, so the curve is exact at the samples.
 *   - Besides the band Duv = ±0.006 around the Planckian locus (the Duv tolerance ANSI C78.377 uses
 *     for its nominal CCTs), the chart can draw that standard's quadrangles themselves (`ansi.ts`).
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed.: §7 (chromaticity coordinates x, y), §8.1 (CIE 1976 UCS u′v′),
 *     §9.5 (correlated colour temperature on the CIE 1960 UCS; isotemperature lines are normal to
 *     the Planckian locus in uv), §3.1 eq. 3.3 (daylight locus, computed by the colour core).
 *   ANSI C78.377-2017 Specifications for the Chromaticity of Solid-State Lighting Products
 *     (Duv tolerance ±0.006 around the nominal CCTs; the quadrangles are in `ansi.ts`).
 *   Mired: M = 10⁶ / T with T in kelvin (common practice).
 */
import { line, symbol, symbolCircle, symbolCross, symbolDiamond, symbolSquare, symbolStar, symbolTriangle, symbolWye } from 'd3-shape';
import { daylightLocusXy, spectralLocusXy, uvPrimeToXy, xyToUvPrime } from '../colour';
import { CCTDuvToXy } from './planckian';
import { contains, planeScales, round, type Domain, type PlaneScales, type Plot, type Point } from './viewport';

export type { Domain, Plot, PlaneScales, Point };

/** The whole chart: x 0–0.8, y 0–0.9, which holds the spectral locus with a small margin. */
export const XY_FULL_DOMAIN: Domain = { x0: 0, x1: 0.8, y0: 0, y1: 0.9 };

/** viewBox 540 × 592: an inner plot of 480 × 540 units (600 units per unit of x and of y). */
export const XY_PLOT: Plot = { width: 540, height: 592, margin: { top: 12, right: 12, bottom: 40, left: 48 } };

/** Narrowest view: 0.01 of x across (a few hundred times Δu′v′ 0.001 at 600 units per x). */
export const XY_MIN_WIDTH = 0.01;

/** Wavelengths labelled on the spectral locus, nm. */
export const WAVELENGTH_TICKS_NM = [380, 460, 470, 480, 490, 500, 510, 520, 530, 540, 550, 560, 570, 580, 590, 600, 620, 700];

/** Kelvin ticks that are not on the even-mired grid but matter on set: tungsten and daylight (common practice). */
export const REFERENCE_KELVIN = [3200, 5600];

export function xyScales(domain: Domain = XY_FULL_DOMAIN, plot: Plot = XY_PLOT): PlaneScales {
	return planeScales(domain, plot);
}

/** Screen position (viewBox units) of a chromaticity (x, y). */
export function project(s: PlaneScales, p: Point): Point {
	return { x: s.x(p.x), y: s.y(p.y) };
}

const pathOf = line<Point>()
	.x((p) => round(p.x))
	.y((p) => round(p.y));

/** An SVG path string through chromaticities (plane units), optionally closed. */
export function planePath(points: readonly Point[], s: PlaneScales, closed = false): string {
	if (points.length === 0) return '';
	const d = pathOf(points.map((p) => project(s, p))) ?? '';
	return closed ? `${d}Z` : d;
}

/* ------------------------------------------------------------------ spectral locus */

export interface LocusPoint {
	wavelength: number;
	x: number;
	y: number;
}

let locusCache: LocusPoint[] | null = null;

/** The CIE 1931 2° spectral locus (xy per wavelength, nm) from the colour core, trimmed to 380–700 nm
 *  where the chromaticities still move (beyond 700 nm they sit on one point; below 380 nm they crowd). */
export function spectralLocus(): LocusPoint[] {
	if (!locusCache) {
		locusCache = spectralLocusXy({ observer: 'CIE1931_2', start: 380, end: 700 }).map((p) => ({ wavelength: p.wavelength, x: p.x, y: p.y }));
	}
	return locusCache;
}

/** The horseshoe, closed by the line of purples. */
export function spectralLocusPath(s: PlaneScales, locus: readonly LocusPoint[] = spectralLocus()): string {
	return planePath(locus, s, true);
}

export interface WavelengthTick {
	wavelength: number;
	/** On the locus, viewBox units. */
	x1: number;
	y1: number;
	/** Outer end of the tick. */
	x2: number;
	y2: number;
	/** Label anchor point and text anchor. */
	lx: number;
	ly: number;
	anchor: 'start' | 'middle' | 'end';
}

/** Linear interpolation of the locus at wavelength `nm` (the core's table is on a regular grid). */
export function locusAt(nm: number, locus: readonly LocusPoint[] = spectralLocus()): Point | null {
	for (let i = 0; i < locus.length - 1; i++) {
		const a = locus[i];
		const b = locus[i + 1];
		if (nm >= a.wavelength && nm <= b.wavelength) {
			const t = b.wavelength === a.wavelength ? 0 : (nm - a.wavelength) / (b.wavelength - a.wavelength);
			return { x: a.x + t * (b.x - a.x), y: a.y + t * (b.y - a.y) };
		}
	}
	return null;
}

/**
 * Ticks across the locus at the given wavelengths, pointing away from the equal-energy white
 * (1/3, 1/3), `length` viewBox units long, with a label point beyond. Ticks outside `domain` are dropped.
 */
export function wavelengthTicks(
	s: PlaneScales,
	domain: Domain,
	wavelengths: readonly number[] = WAVELENGTH_TICKS_NM,
	length = 7,
	locus: readonly LocusPoint[] = spectralLocus()
): WavelengthTick[] {
	const white = project(s, { x: 1 / 3, y: 1 / 3 });
	const out: WavelengthTick[] = [];
	for (const nm of wavelengths) {
		const p = locusAt(nm, locus);
		const before = locusAt(nm - 2, locus) ?? p;
		const after = locusAt(nm + 2, locus) ?? p;
		if (!p || !before || !after || !contains(domain, p)) continue;
		const a = project(s, before);
		const b = project(s, after);
		const o = project(s, p);
		let nx = -(b.y - a.y);
		let ny = b.x - a.x;
		const n = Math.hypot(nx, ny);
		if (n === 0) {
			nx = o.x - white.x;
			ny = o.y - white.y;
		}
		const len = Math.hypot(nx, ny) || 1;
		nx /= len;
		ny /= len;
		// Point outward: away from the white point.
		if (nx * (o.x - white.x) + ny * (o.y - white.y) < 0) {
			nx = -nx;
			ny = -ny;
		}
		const lx = o.x + nx * (length + 4);
		const ly = o.y + ny * (length + 4) + 3;
		out.push({
			wavelength: nm,
			x1: round(o.x),
			y1: round(o.y),
			x2: round(o.x + nx * length),
			y2: round(o.y + ny * length),
			lx: round(lx),
			ly: round(ly),
			anchor: nx > 0.35 ? 'start' : nx < -0.35 ? 'end' : 'middle'
		});
	}
	return out;
}

/* ------------------------------------------------------------------ Planckian locus */

export const PLANCK_MIN_K = 1000;
export const PLANCK_MAX_K = 25000;

/**
 * Planckian locus xy sampled every `stepMired` mired from `minK` to `maxK`, plus the temperatures in
 * `alsoK` as exact vertices (so a tick at 3200 K lies on the drawn line), warm end first. Duv ≠ 0
 * gives the parallel curve at that Duv (CCTToXy, CIE 1960 uv offsets normal to the locus).
 */
export function planckianLocus(
	minK = PLANCK_MIN_K,
	maxK = PLANCK_MAX_K,
	stepMired = 20,
	Duv = 0,
	alsoK: readonly number[] = REFERENCE_KELVIN
): Array<Point & { K: number }> {
	if (!(minK > 0) || !(maxK > minK) || !(stepMired > 0)) throw new RangeError(`bad Planckian range ${minK}–${maxK} K, step ${stepMired} mired`);
	const lo = 1e6 / maxK;
	const mireds: number[] = [];
	for (let m = 1e6 / minK; m > lo; m -= stepMired) mireds.push(m);
	mireds.push(lo);
	for (const K of alsoK) if (K > minK && K < maxK) mireds.push(1e6 / K);
	mireds.sort((a, b) => b - a);
	return mireds.map((m) => {
		const K = 1e6 / m;
		const p = CCTDuvToXy(K, Duv);
		return { K, x: p.x, y: p.y };
	});
}

/**
 * The Planckian locus as a path: every 20 mired over the whole locus, and finer (20 / zoom mired, at
 * least 0.5) across the part in `domain` when zoomed in, so the curve stays smooth at any zoom
 * without computing the whole locus finely.
 */
export function planckianLocusPath(s: PlaneScales, domain: Domain = XY_FULL_DOMAIN): string {
	const base = planckianLocus();
	const zoom = (XY_FULL_DOMAIN.x1 - XY_FULL_DOMAIN.x0) / (domain.x1 - domain.x0);
	if (zoom < 3) return planePath(base, s);
	const inView = base.filter((p) => contains(domain, p, (domain.x1 - domain.x0) * 0.5));
	if (inView.length === 0) return planePath(base, s);
	const mHi = Math.min(1e6 / PLANCK_MIN_K, 1e6 / inView[0].K + 20);
	const mLo = Math.max(1e6 / PLANCK_MAX_K, 1e6 / inView[inView.length - 1].K - 20);
	const step = Math.max(0.5, 20 / zoom);
	const fine: Array<Point & { K: number }> = [];
	for (let m = mHi; m >= mLo; m -= step) fine.push({ K: 1e6 / m, ...CCTDuvToXy(1e6 / m, 0) });
	const pts = [...base.filter((p) => 1e6 / p.K > mHi), ...fine, ...base.filter((p) => 1e6 / p.K < mLo)];
	return planePath(pts, s);
}

/**
 * The band between Duv = −duv and +duv along the Planckian locus (a closed path), from minK to maxK.
 * Duv > 0 lies above the locus (greenish), < 0 below (magenta).
 */
export function duvBandPath(s: PlaneScales, duv = 0.006, minK = 1500, maxK = 20000): string {
	const upper = planckianLocus(minK, maxK, 20, duv);
	const lower = planckianLocus(minK, maxK, 20, -duv).reverse();
	return planePath([...upper, ...lower], s, true);
}

/** Mired step between isotemperature ticks for a zoom level (1 = full view). */
export function miredStepForZoom(zoom: number): number {
	if (zoom >= 24) return 5;
	if (zoom >= 10) return 10;
	if (zoom >= 5) return 20;
	if (zoom >= 2.5) return 50;
	return 100;
}

export interface IsotemperatureTick {
	K: number;
	mired: number;
	/** Rounded label, e.g. "3333 K". */
	label: string;
	/** True for REFERENCE_KELVIN ticks (labelled on the green side, the others on the magenta side). */
	reference: boolean;
	/** The locus point, xy. */
	at: Point;
	/** The isotemperature segment from Duv −span to +span, viewBox units. */
	x1: number;
	y1: number;
	x2: number;
	y2: number;
	/** Label anchor, viewBox units. */
	lx: number;
	ly: number;
	anchor: 'start' | 'end';
}

/**
 * Isotemperature ticks at every multiple of `stepMired` mired (labelled with the rounded kelvin) and at
 * `extraK`, each a short segment of the isotemperature line (Duv −span … +span, CIE 1960 uv, where
 * such lines are normal to the locus) mapped to the chart. Only ticks whose locus point is in `domain`.
 */
export function isotemperatureTicks(
	s: PlaneScales,
	domain: Domain,
	stepMired = 100,
	extraK: readonly number[] = REFERENCE_KELVIN,
	span = 0.01,
	minK = PLANCK_MIN_K,
	maxK = PLANCK_MAX_K
): IsotemperatureTick[] {
	if (!(stepMired > 0)) throw new RangeError(`mired step must be > 0, got ${stepMired}`);
	// Only temperatures whose part of the locus is in view (found from the drawn locus), so a zoomed
	// view with a fine step does not compute ticks for the whole locus.
	const seen = planckianLocus(minK, maxK).filter((p) => contains(domain, p, (domain.x1 - domain.x0) * 0.05));
	if (seen.length === 0 && extraK.every((K) => !contains(domain, CCTDuvToXy(K, 0)))) return [];
	const mLo = seen.length ? Math.max(1e6 / maxK, 1e6 / seen[seen.length - 1].K - 10) : Infinity;
	const mHi = seen.length ? Math.min(1e6 / minK, 1e6 / seen[0].K + 10) : -Infinity;
	const temps: Array<{ K: number; reference: boolean }> = [];
	for (let m = Math.ceil(mLo / stepMired) * stepMired; m <= mHi + 1e-9; m += stepMired) {
		temps.push({ K: 1e6 / m, reference: false });
	}
	for (const K of extraK) temps.push({ K, reference: true });
	const out: IsotemperatureTick[] = [];
	for (const { K, reference } of temps) {
		const at = CCTDuvToXy(K, 0);
		if (!contains(domain, at)) continue;
		const lo = project(s, CCTDuvToXy(K, -span));
		const hi = project(s, CCTDuvToXy(K, span));
		// Even-mired labels beyond the magenta (Duv < 0) end, reference labels beyond the green end.
		const [from, to] = reference ? [lo, hi] : [hi, lo];
		const dx = to.x - from.x;
		const dy = to.y - from.y;
		const n = Math.hypot(dx, dy) || 1;
		out.push({
			K,
			mired: 1e6 / K,
			label: `${Math.round(K)} K`,
			reference,
			at,
			x1: round(lo.x),
			y1: round(lo.y),
			x2: round(hi.x),
			y2: round(hi.y),
			lx: round(to.x + (dx / n) * 4),
			ly: round(to.y + (dy / n) * 4 + 3),
			anchor: dx >= 0 ? 'start' : 'end'
		});
	}
	return out;
}

/* ------------------------------------------------------------------ daylight locus */

/** CIE daylight locus xy every `stepMired` mired from minK to maxK (4000–25000 K; the core's CIE 15:2004 eq. 3.3). */
export function daylightLocus(minK = 4000, maxK = 25000, stepMired = 5): Array<Point & { K: number }> {
	const temps: number[] = [];
	for (let m = 1e6 / minK; m > 1e6 / maxK; m -= stepMired) temps.push(1e6 / m);
	temps.push(maxK);
	return daylightLocusXy(temps).map((p) => ({ K: p.T, x: p.x, y: p.y }));
}

export function daylightLocusPath(s: PlaneScales): string {
	return planePath(daylightLocus(), s);
}

/* ------------------------------------------------------------------ target and tolerance */

/**
 * The target's tolerance: the circle of radius `radius` (Δu′v′) about the target in CIE 1976 u′v′,
 * sampled at `n` points and mapped to xy (see the header: close to an ellipse in xy).
 */
export function toleranceOutlineXy(target: Point, radius: number, n = 96): Point[] {
	if (!(radius > 0) || !Number.isFinite(radius)) throw new RangeError(`tolerance must be a Δu′v′ above 0, got ${radius}`);
	const c = xyToUvPrime(target);
	const out: Point[] = [];
	for (let i = 0; i < n; i++) {
		const a = (2 * Math.PI * i) / n;
		out.push(uvPrimeToXy({ u_prime: c.u_prime + radius * Math.cos(a), v_prime: c.v_prime + radius * Math.sin(a) }));
	}
	return out;
}

export function tolerancePath(s: PlaneScales, target: Point, radius: number): string {
	return planePath(toleranceOutlineXy(target, radius), s, true);
}

/* ------------------------------------------------------------------ arrows and marks */

export interface ArrowShape {
	x1: number;
	y1: number;
	/** End of the shaft (at the base of the head). */
	x2: number;
	y2: number;
	/** Closed triangle whose tip is the arrow's end. */
	head: string;
	/** A place for the arrow's label: `head` × 4 back from the tip (or half-way), beside the shaft. */
	lx: number;
	ly: number;
}

/** An arrow in viewBox units from `from` to `to` with a head `head` units long; null if shorter than 0.5. */
export function arrowShape(from: Point, to: Point, head = 8): ArrowShape | null {
	const dx = to.x - from.x;
	const dy = to.y - from.y;
	const len = Math.hypot(dx, dy);
	if (!(len >= 0.5)) return null;
	const ux = dx / len;
	const uy = dy / len;
	const h = Math.min(head, len);
	const bx = to.x - ux * h;
	const by = to.y - uy * h;
	const w = h * 0.45;
	const head_ = `M${round(to.x)},${round(to.y)}L${round(bx - uy * w)},${round(by + ux * w)}L${round(bx + uy * w)},${round(by - ux * w)}Z`;
	const back = Math.min(len / 2, head * 4);
	const side = uy > 0 ? 1 : -1;
	return {
		x1: round(from.x),
		y1: round(from.y),
		x2: round(bx),
		y2: round(by),
		head: head_,
		lx: round(to.x - ux * back - side * uy * head * 0.6),
		ly: round(to.y - uy * back + side * ux * head * 0.6)
	};
}

export type PointShape = 'circle' | 'square' | 'triangle' | 'diamond' | 'cross' | 'star' | 'wye';

export const SHAPES: readonly PointShape[] = ['circle', 'square', 'triangle', 'diamond', 'cross', 'star', 'wye'];

const SYMBOLS = {
	circle: symbolCircle,
	square: symbolSquare,
	triangle: symbolTriangle,
	diamond: symbolDiamond,
	cross: symbolCross,
	star: symbolStar,
	wye: symbolWye
} as const;

/** Default mark per light role, so a key and a fill differ by shape as well as by colour. */
export const ROLE_SHAPES: Record<string, PointShape> = {
	key: 'circle',
	fill: 'square',
	back: 'triangle',
	practical: 'diamond',
	ambient: 'cross',
	background: 'wye',
	effect: 'star'
};

/** The mark of a reading: its own shape, else its role's, else one by position in the list. */
export function shapeFor(r: { shape?: string; role?: string }, index: number): PointShape {
	if (r.shape && (SHAPES as readonly string[]).includes(r.shape)) return r.shape as PointShape;
	if (r.role && ROLE_SHAPES[r.role]) return ROLE_SHAPES[r.role];
	return SHAPES[index % SHAPES.length];
}

const symbolCache = new Map<string, string>();

/** SVG path of a mark centred on (0, 0) covering about `area` square units. */
export function shapePath(shape: PointShape, area = 64): string {
	const key = `${shape}:${area}`;
	let d = symbolCache.get(key);
	if (d === undefined) {
		d = symbol(SYMBOLS[shape], area)() ?? '';
		symbolCache.set(key, d);
	}
	return d;
}

const polygonCache = new Map<string, Array<[number, number]> | null>();

/**
 * The mark as polygon vertices centred on (0, 0) (every shape but the circle is a polygon), or null
 * for the circle: for drawing many marks on a canvas with plain moveTo/lineTo calls.
 */
export function shapePolygon(shape: PointShape, area = 64): Array<[number, number]> | null {
	const key = `${shape}:${area}`;
	if (polygonCache.has(key)) return polygonCache.get(key)!;
	let out: Array<[number, number]> | null = null;
	if (shape !== 'circle') {
		// d3's symbol paths use M, L, h, v and Z only.
		out = [];
		let x = 0;
		let y = 0;
		for (const [, cmd, args] of shapePath(shape, area).matchAll(/([MLHVZmlhvz])([^MLHVZmlhvz]*)/g)) {
			const n = (args.match(/-?\d*\.?\d+(?:e-?\d+)?/g) ?? []).map(Number);
			if (cmd === 'M' || cmd === 'L') for (let i = 0; i + 1 < n.length; i += 2) out.push([(x = n[i]), (y = n[i + 1])]);
			else if (cmd === 'h') for (const d of n) out.push([(x += d), y]);
			else if (cmd === 'v') for (const d of n) out.push([x, (y += d)]);
			else if (cmd === 'H') for (const d of n) out.push([(x = d), y]);
			else if (cmd === 'V') for (const d of n) out.push([x, (y = d)]);
		}
	}
	polygonCache.set(key, out);
	return out;
}

/** Radius of the circle mark of `area` square units. */
export function circleRadius(area = 64): number {
	return Math.sqrt(area / Math.PI);
}

/** Axis ticks inside the domain: `count` or so round values per axis. */
export function axisTicks(s: PlaneScales, count = 8): { x: number[]; y: number[] } {
	return { x: s.x.ticks(count), y: s.y.ticks(count) };
}
