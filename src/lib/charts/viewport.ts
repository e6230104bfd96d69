/**
 * The chart viewport: which part of a chromaticity plane is on screen, how it maps to the drawing,
 * and how zoom and pan move it. Pure arithmetic on plain objects so the same rules serve the wheel,
 * a pinch, a drag, the +/− buttons and the tests.
 *
 * Both charts draw a chromaticity plane with one unit the same length along both axes (a circle of
 * Δu′v′ must look round in u′v′), so a viewport keeps its width-to-height ratio when it zooms.
 *
 * References: none (plane geometry).
 */
import { scaleLinear, type ScaleLinear } from 'd3-scale';

/** A rectangle of the chromaticity plane: x0 < x1 and y0 < y1, in the plane's own units. */
export interface Domain {
	x0: number;
	x1: number;
	y0: number;
	y1: number;
}

/** The drawing: a viewBox of `width` × `height` user units with margins for the axes. */
export interface Plot {
	width: number;
	height: number;
	margin: { top: number; right: number; bottom: number; left: number };
}

export interface PlaneScales {
	x: ScaleLinear<number, number>;
	y: ScaleLinear<number, number>;
	/** User units per plane unit (the same on both axes when the domain matches the plot's ratio). */
	unit: number;
}

export interface Point {
	x: number;
	y: number;
}

export function innerSize(plot: Plot): { width: number; height: number } {
	return {
		width: plot.width - plot.margin.left - plot.margin.right,
		height: plot.height - plot.margin.top - plot.margin.bottom
	};
}

/** Linear scales from the plane to the viewBox; y grows upward on the chart, downward in SVG. */
export function planeScales(domain: Domain, plot: Plot): PlaneScales {
	const inner = innerSize(plot);
	const x = scaleLinear().domain([domain.x0, domain.x1]).range([plot.margin.left, plot.margin.left + inner.width]);
	const y = scaleLinear().domain([domain.y0, domain.y1]).range([plot.margin.top + inner.height, plot.margin.top]);
	return { x, y, unit: inner.width / (domain.x1 - domain.x0) };
}

export function spanOf(d: Domain): { width: number; height: number } {
	return { width: d.x1 - d.x0, height: d.y1 - d.y0 };
}

export function centreOf(d: Domain): Point {
	return { x: (d.x0 + d.x1) / 2, y: (d.y0 + d.y1) / 2 };
}

/** A domain centred on `centre`, `width` wide, with the plot's aspect ratio (equal units on both axes). */
export function domainAround(centre: Point, width: number, plot: Plot): Domain {
	const inner = innerSize(plot);
	const height = (width * inner.height) / inner.width;
	return { x0: centre.x - width / 2, x1: centre.x + width / 2, y0: centre.y - height / 2, y1: centre.y + height / 2 };
}

/**
 * Shift `d` (without resizing it) so it lies inside `limits`; if it is larger than the limits along
 * an axis, centre it on them along that axis.
 */
export function clampDomain(d: Domain, limits: Domain): Domain {
	const out = { ...d };
	const w = d.x1 - d.x0;
	const h = d.y1 - d.y0;
	if (w >= limits.x1 - limits.x0) {
		const c = (limits.x0 + limits.x1) / 2;
		out.x0 = c - w / 2;
		out.x1 = c + w / 2;
	} else if (d.x0 < limits.x0) {
		out.x0 = limits.x0;
		out.x1 = limits.x0 + w;
	} else if (d.x1 > limits.x1) {
		out.x1 = limits.x1;
		out.x0 = limits.x1 - w;
	}
	if (h >= limits.y1 - limits.y0) {
		const c = (limits.y0 + limits.y1) / 2;
		out.y0 = c - h / 2;
		out.y1 = c + h / 2;
	} else if (d.y0 < limits.y0) {
		out.y0 = limits.y0;
		out.y1 = limits.y0 + h;
	} else if (d.y1 > limits.y1) {
		out.y1 = limits.y1;
		out.y0 = limits.y1 - h;
	}
	return out;
}

export interface ZoomLimits {
	/** The widest view (also the pan limits). */
	full: Domain;
	/** The narrowest width allowed, in plane units. */
	minWidth: number;
}

/**
 * Zoom by `factor` (> 1 zooms in) keeping the plane point `at` fixed on screen, then keep the view
 * inside the limits. Widths are clamped to [minWidth, full width]; the ratio is kept.
 */
export function zoomAt(d: Domain, factor: number, at: Point, limits: ZoomLimits): Domain {
	if (!Number.isFinite(factor) || factor <= 0) return d;
	const w = d.x1 - d.x0;
	const fullW = limits.full.x1 - limits.full.x0;
	const newW = Math.min(fullW, Math.max(limits.minWidth, w / factor));
	const k = newW / w;
	const next: Domain = {
		x0: at.x - (at.x - d.x0) * k,
		x1: at.x + (d.x1 - at.x) * k,
		y0: at.y - (at.y - d.y0) * k,
		y1: at.y + (d.y1 - at.y) * k
	};
	return clampDomain(next, limits.full);
}

/** Move the view by (dx, dy) plane units, kept inside `limits`. */
export function panBy(d: Domain, dx: number, dy: number, limits: Domain): Domain {
	if (!Number.isFinite(dx) || !Number.isFinite(dy)) return d;
	return clampDomain({ x0: d.x0 + dx, x1: d.x1 + dx, y0: d.y0 + dy, y1: d.y1 + dy }, limits);
}

/** How far the view is zoomed in relative to the full view (1 = full view). */
export function zoomLevel(d: Domain, full: Domain): number {
	return (full.x1 - full.x0) / (d.x1 - d.x0);
}

export function contains(d: Domain, p: Point, pad = 0): boolean {
	return p.x >= d.x0 - pad && p.x <= d.x1 + pad && p.y >= d.y0 - pad && p.y <= d.y1 + pad;
}

/** Round to `decimals` for path strings and attributes (keeps the DOM and exported files small). */
export function round(v: number, decimals = 2): number {
	const f = 10 ** decimals;
	return Math.round(v * f) / f;
}

/**
 * The y axis as the chart frame labels it: ticks, their format, and whether the labels go inside the
 * plot because they are wider than the left margin (narrow screens, fine ticks). `px` is viewBox
 * units per CSS pixel; labels are 11 px, about 0.58 em per digit.
 */
export function yAxisLabels(s: PlaneScales, plot: Plot, px: number): { ticks: number[]; format: (v: number) => string; inside: boolean } {
	const inner = innerSize(plot);
	const count = Math.max(2, Math.min(10, Math.floor(inner.height / (11 * px * 3))));
	const ticks = s.y.ticks(count);
	const format = s.y.tickFormat(count);
	const inside = Math.max(0, ...ticks.map((t) => format(t).length)) * 11 * px * 0.58 > plot.margin.left - 6 * px;
	return { ticks, format, inside };
}

/** Where the frame draws y labels inside the plot (baseline, start-anchored), for other labels to keep clear of. */
export function insideYLabels(s: PlaneScales, plot: Plot, px: number): Array<{ x: number; y: number; text: string }> {
	const y = yAxisLabels(s, plot, px);
	if (!y.inside) return [];
	return y.ticks.filter((t) => s.y(t) > plot.margin.top + 24 * px).map((t) => ({ x: plot.margin.left + 4 * px, y: round(s.y(t) + 4 * px), text: y.format(t) }));
}
