/**
 * What the charts say about a reading: its fill (the colour core's display swatch) and the rows of
 * its details panel and table (xy, u′v′, CCT and Duv by the core's Ohno 2013 method).
 */
import { displaySwatch, xyToCCT, xyToUvPrime } from '$lib/colour';
import type { DetailRow } from './types';

const swatchCache = new Map<string, string>();

/**
 * Fill for a mark: the display swatch of its chromaticity, computed on a grid of `quantum` in x and
 * y and cached (a mark a few pixels wide cannot show finer differences; large sets use a coarser
 * grid so 5,000 marks cost a few hundred swatch computations, not 5,000). Invalid chromaticities
 * get a neutral grey.
 */
export function swatchFill(xy: { x: number; y: number }, quantum = 0.001): string {
	const qx = Math.round(xy.x / quantum) * quantum;
	const qy = Math.round(xy.y / quantum) * quantum;
	const key = `${qx.toFixed(4)},${qy.toFixed(4)}`;
	let css = swatchCache.get(key);
	if (css === undefined) {
		try {
			css = displaySwatch({ x: qx, y: qy }).css;
		} catch {
			css = '#808080';
		}
		swatchCache.set(key, css);
	}
	return css;
}

/** Swatch grid for a set of `n` marks: exact-looking for a few, coarser as marks get many and small. */
export function swatchQuantum(n: number): number {
	return n <= 24 ? 0.001 : n <= 500 ? 0.004 : 0.01;
}

export function fmt(v: number, digits: number): string {
	return Number.isFinite(v) ? v.toFixed(digits).replace('-', '−') : '—';
}

/** x, y, u′, v′, CCT and Duv of a chromaticity (CCT shown only where it is meaningful). */
export function detailRows(xy: { x: number; y: number }): DetailRow[] {
	const rows: DetailRow[] = [
		['x', fmt(xy.x, 4)],
		['y', fmt(xy.y, 4)]
	];
	try {
		const uv = xyToUvPrime(xy);
		rows.push(['u′', fmt(uv.u_prime, 4)], ['v′', fmt(uv.v_prime, 4)]);
	} catch {
		rows.push(['u′', '—'], ['v′', '—']);
	}
	try {
		const c = xyToCCT(xy);
		const meaningful = c.warnings.length === 0;
		rows.push(['CCT', meaningful ? `${Math.round(c.CCT)} K` : '— (far from the locus)'], ['Duv', Number.isFinite(c.Duv) ? fmt(c.Duv, 4) : '—']);
	} catch {
		rows.push(['CCT', '—'], ['Duv', '—']);
	}
	return rows;
}
