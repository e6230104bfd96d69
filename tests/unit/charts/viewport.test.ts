import { describe, expect, it } from 'vitest';
import { clampDomain, domainAround, insideYLabels, panBy, planeScales, yAxisLabels, zoomAt, zoomLevel, type Domain, type Plot } from '$lib/charts/viewport';

const plot = (w = 500, h = 400): Plot => ({ width: w + 20, height: h + 20, margin: { top: 10, right: 10, bottom: 10, left: 10 } });
const full: Domain = { x0: 0, x1: 1, y0: 0, y1: 0.8 };
const limits = { full, minWidth: 0.01 };

describe('planeScales', () => {
	it('maps the domain corners onto the inner plot with y pointing up (plane geometry)', () => {
		const s = planeScales(full, plot());
		expect(s.x(0)).toBe(10);
		expect(s.x(1)).toBe(510);
		expect(s.y(0)).toBe(410);
		expect(s.y(0.8)).toBe(10);
		expect(s.unit).toBe(500);
	});
});

describe('zoomAt', () => {
	it('keeps the zoom point fixed on screen and divides the width by the factor', () => {
		const at = { x: 0.3, y: 0.2 };
		const s0 = planeScales(full, plot());
		const d = zoomAt(full, 4, at, limits);
		const s1 = planeScales(d, plot());
		expect(d.x1 - d.x0).toBeCloseTo(0.25, 12);
		expect(d.y1 - d.y0).toBeCloseTo(0.2, 12);
		expect(s1.x(at.x)).toBeCloseTo(s0.x(at.x), 9);
		expect(s1.y(at.y)).toBeCloseTo(s0.y(at.y), 9);
	});

	it('stops at the narrowest width and at the full view', () => {
		expect(zoomAt(full, 1e6, { x: 0.5, y: 0.4 }, limits).x1 - zoomAt(full, 1e6, { x: 0.5, y: 0.4 }, limits).x0).toBeCloseTo(0.01, 12);
		expect(zoomAt(full, 0.01, { x: 0.5, y: 0.4 }, limits)).toEqual(full);
	});

	it('ignores zero, negative and NaN factors', () => {
		const d = zoomAt(full, 2, { x: 0.5, y: 0.4 }, limits);
		expect(zoomAt(d, 0, { x: 0.5, y: 0.4 }, limits)).toBe(d);
		expect(zoomAt(d, -1, { x: 0.5, y: 0.4 }, limits)).toBe(d);
		expect(zoomAt(d, Number.NaN, { x: 0.5, y: 0.4 }, limits)).toBe(d);
	});

	it('reports the zoom level relative to the full view', () => {
		expect(zoomLevel(zoomAt(full, 2.5, { x: 0.5, y: 0.4 }, limits), full)).toBeCloseTo(2.5, 12);
	});
});

describe('panBy and clampDomain', () => {
	it('moves a zoomed view and keeps it inside the limits', () => {
		const d = zoomAt(full, 4, { x: 0.5, y: 0.4 }, limits);
		const moved = panBy(d, 0.1, -0.05, full);
		expect(moved.x0 - d.x0).toBeCloseTo(0.1, 12);
		expect(moved.y0 - d.y0).toBeCloseTo(-0.05, 12);
		const far = panBy(d, 10, 10, full);
		expect(far.x1).toBeCloseTo(1, 12);
		expect(far.y1).toBeCloseTo(0.8, 12);
		expect(far.x1 - far.x0).toBeCloseTo(d.x1 - d.x0, 12);
	});

	it('centres a view larger than the limits', () => {
		expect(clampDomain({ x0: -1, x1: 3, y0: 0, y1: 0.4 }, full)).toEqual({ x0: -1.5, x1: 2.5, y0: 0, y1: 0.4 });
	});

	it('ignores a NaN pan', () => {
		expect(panBy(full, Number.NaN, 0, full)).toBe(full);
	});
});

describe('domainAround', () => {
	it('keeps the plot ratio so both axes share one scale', () => {
		const d = domainAround({ x: 0.2, y: 0.45 }, 0.05, plot(500, 400));
		expect(d.x1 - d.x0).toBeCloseTo(0.05, 12);
		expect(d.y1 - d.y0).toBeCloseTo(0.04, 12);
		const s = planeScales(d, plot(500, 400));
		expect((s.x(d.x1) - s.x(d.x0)) / (d.x1 - d.x0)).toBeCloseTo((s.y(d.y0) - s.y(d.y1)) / (d.y1 - d.y0), 6);
	});
});

describe('y axis labels inside the plot', () => {
	const xyPlot = { width: 540, height: 592, margin: { top: 12, right: 12, bottom: 40, left: 48 } };
	const s = planeScales({ x0: 0.33, x1: 0.41, y0: 0.33, y1: 0.42 }, xyPlot);
	it('stay in the margin on a wide screen and go inside on a phone, where other labels must avoid them', () => {
		// 1 viewBox unit per CSS px: "0.35" is 4 × 11 × 0.58 ≈ 25.5 units, inside a 48-unit margin.
		expect(yAxisLabels(s, xyPlot, 1).inside).toBe(false);
		expect(insideYLabels(s, xyPlot, 1)).toEqual([]);
		// 540 units drawn 318 px wide (a 360 px phone): 1.7 units per px, and the labels no longer fit.
		const px = 540 / 318;
		expect(yAxisLabels(s, xyPlot, px).inside).toBe(true);
		const labels = insideYLabels(s, xyPlot, px);
		expect(labels.length).toBeGreaterThan(2);
		for (const l of labels) {
			expect(l.x).toBeCloseTo(48 + 4 * px, 6);
			expect(l.y).toBeGreaterThan(12 + 24 * px);
		}
		expect(labels.map((l) => l.text)).toContain('0.35');
	});
});
