/**
 * Stamping many small marks into an RGBA pixel buffer: each mark shape is rasterised once into a
 * coverage mask (4 × 4 samples per pixel, with an outline ring), then copied into the buffer with
 * "over" compositing for every reading. Thousands of marks cost a few milliseconds this way, where
 * drawing each as a path on a 2D canvas without a GPU costs a hundred or more.
 *
 * Buffers are straight (non-premultiplied) RGBA, as in ImageData.
 *
 * References: T. Porter and T. Duff, "Compositing digital images", SIGGRAPH 1984 (the "over" operator).
 */
import { circleRadius, shapePolygon, type PointShape } from './cie1931';

export interface Stamp {
	/** Width and height of the masks, pixels. */
	size: number;
	/** Pixel offset from the mask's corner to the mark's centre. */
	centre: number;
	/** Coverage 0…1 of the mark's inside and of its outline ring, row by row. */
	fill: Float32Array;
	edge: Float32Array;
	/** Indices (j·size + i) of the pixels with any coverage, so stamping skips the empty corners. */
	covered: Uint16Array;
}

const SUB = 4;

function insidePolygon(x: number, y: number, p: ReadonlyArray<[number, number]>): boolean {
	let inside = false;
	for (let i = 0, j = p.length - 1; i < p.length; j = i++) {
		const [xi, yi] = p[i];
		const [xj, yj] = p[j];
		if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
	}
	return inside;
}

function distanceToPolygon(x: number, y: number, p: ReadonlyArray<[number, number]>): number {
	let best = Infinity;
	for (let i = 0, j = p.length - 1; i < p.length; j = i++) {
		const [ax, ay] = p[j];
		const [bx, by] = p[i];
		const dx = bx - ax;
		const dy = by - ay;
		const t = Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy || 1)));
		best = Math.min(best, Math.hypot(x - (ax + t * dx), y - (ay + t * dy)));
	}
	return best;
}

const cache = new Map<string, Stamp>();

/**
 * The masks of `shape` covering `area` square units drawn at `scale` pixels per unit, with an
 * outline `outline` pixels wide centred on the edge (cached: a redraw at the same size reuses them).
 */
export function makeStamp(shape: PointShape, area: number, scale: number, outline = 1): Stamp {
	const key = `${shape}:${area}:${scale}:${outline}`;
	let hit = cache.get(key);
	if (!hit) {
		hit = buildStamp(shape, area, scale, outline);
		if (cache.size > 256) cache.clear();
		cache.set(key, hit);
	}
	return hit;
}

function buildStamp(shape: PointShape, area: number, scale: number, outline: number): Stamp {
	if (!(area > 0) || !(scale > 0) || !(outline >= 0)) throw new RangeError(`bad mark size: area ${area}, scale ${scale}, outline ${outline}`);
	const poly = shapePolygon(shape, area)?.map(([x, y]) => [x * scale, y * scale] as [number, number]) ?? null;
	const r = circleRadius(area) * scale;
	const extent = poly ? Math.max(...poly.map(([x, y]) => Math.hypot(x, y))) : r;
	const size = Math.ceil(2 * (extent + outline)) + 2;
	const centre = size / 2;
	const fill = new Float32Array(size * size);
	const edge = new Float32Array(size * size);
	const half = outline / 2;
	const w = 1 / (SUB * SUB);
	for (let j = 0; j < size; j++) {
		for (let i = 0; i < size; i++) {
			const cx = i + 0.5 - centre;
			const cy = j + 0.5 - centre;
			const dc = poly ? distanceToPolygon(cx, cy, poly) : Math.abs(Math.hypot(cx, cy) - r);
			// A pixel whose centre is clear of the outline by more than its half-diagonal is wholly in or out.
			if (dc > half + 0.71) {
				fill[j * size + i] = (poly ? insidePolygon(cx, cy, poly) : cx * cx + cy * cy <= r * r) ? 1 : 0;
				continue;
			}
			let f = 0;
			let e = 0;
			for (let sj = 0; sj < SUB; sj++) {
				for (let si = 0; si < SUB; si++) {
					const x = i + (si + 0.5) / SUB - centre;
					const y = j + (sj + 0.5) / SUB - centre;
					const inside = poly ? insidePolygon(x, y, poly) : x * x + y * y <= r * r;
					const d = poly ? distanceToPolygon(x, y, poly) : Math.abs(Math.hypot(x, y) - r);
					if (d <= half) e += w;
					else if (inside) f += w;
				}
			}
			fill[j * size + i] = f;
			edge[j * size + i] = e;
		}
	}
	const idx: number[] = [];
	for (let m = 0; m < size * size; m++) if (fill[m] > 0 || edge[m] > 0) idx.push(m);
	return { size, centre, fill, edge, covered: Uint16Array.from(idx) };
}

/** [r, g, b] of a `#rrggbb` or `#rgb` colour; grey for anything else. */
export function parseHex(css: string): [number, number, number] {
	const m = /^#([0-9a-f]{6}|[0-9a-f]{3})$/i.exec(css.trim());
	if (!m) return [128, 128, 128];
	const h = m[1].length === 3 ? [...m[1]].map((c) => c + c).join('') : m[1];
	return [parseInt(h.slice(0, 2), 16), parseInt(h.slice(2, 4), 16), parseInt(h.slice(4, 6), 16)];
}

function over(buf: Uint8ClampedArray, o: number, r: number, g: number, b: number, a: number): void {
	const da = buf[o + 3] / 255;
	const oa = a + da * (1 - a);
	if (oa <= 0) return;
	const k = (da * (1 - a)) / oa;
	const s = a / oa;
	buf[o] = r * s + buf[o] * k;
	buf[o + 1] = g * s + buf[o + 1] * k;
	buf[o + 2] = b * s + buf[o + 2] * k;
	buf[o + 3] = oa * 255;
}

/**
 * Composite `stamp` centred at pixel (x, y) into `buf` (`width` × `height` RGBA): the inside in
 * `rgb`, the outline in `edgeRgb`. Parts outside the buffer are skipped.
 */
export function stamp(
	buf: Uint8ClampedArray,
	width: number,
	height: number,
	st: Stamp,
	x: number,
	y: number,
	rgb: readonly [number, number, number],
	edgeRgb: readonly [number, number, number]
): void {
	const x0 = Math.round(x - st.centre);
	const y0 = Math.round(y - st.centre);
	const inside = x0 >= 0 && y0 >= 0 && x0 + st.size <= width && y0 + st.size <= height;
	for (let n = 0; n < st.covered.length; n++) {
		const m = st.covered[n];
		const j = (m / st.size) | 0;
		const i = m - j * st.size;
		const px = x0 + i;
		const py = y0 + j;
		if (!inside && (px < 0 || px >= width || py < 0 || py >= height)) continue;
		const o = (py * width + px) * 4;
		const f = st.fill[m];
		const e = st.edge[m];
		if (f >= 1) {
			// Fully covered: the mark replaces what is under it.
			buf[o] = rgb[0];
			buf[o + 1] = rgb[1];
			buf[o + 2] = rgb[2];
			buf[o + 3] = 255;
		} else if (f > 0) over(buf, o, rgb[0], rgb[1], rgb[2], f);
		if (e > 0) over(buf, o, edgeRgb[0], edgeRgb[1], edgeRgb[2], e);
	}
}
