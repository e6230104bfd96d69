import { describe, expect, it } from 'vitest';
import { cieIlluminant, planckianSpectrum, spectrumToXYZ } from '$lib/colour';
import {
	availableScales,
	fmtPower,
	luminanceOf,
	markerWavelengths,
	nmAt,
	peakWavelength,
	scaleSeries,
	seriesPath,
	spectrumPlot,
	spectrumScales,
	tableRows,
	transmissionPoints,
	valueAtNm,
	visibleSamples,
	type PlotSeries
} from '$lib/charts/spectrum';

const line = (id: string, spectrum: PlotSeries['spectrum'], role: PlotSeries['role'] = 'reading'): PlotSeries => ({ id, label: `Line ${id}`, role, spectrum });
const A = () => line('A', cieIlluminant('A'));
const D65 = () => line('D65', cieIlluminant('D65'), 'reference');
const at = (s: { points: Array<[number, number]> }, nm: number) => valueAtNm(s.points, nm)!;

describe('scaleSeries', () => {
	it('CIE 15:2004 Table T.1: illuminant A is 100 at 560 nm and 241.675 at 780 nm (from memory) on the 560 nm scale', () => {
		const [a] = scaleSeries([A()], 'at560').series;
		expect(at(a, 560)).toBeCloseTo(100, 9);
		expect(at(a, 780)).toBeCloseTo(241.675, 3);
		// 380 nm: 9.7951 (CIE 15:2004 Table T.1, from memory).
		expect(at(a, 380)).toBeCloseTo(9.7951, 4);
	});

	it('CIE 15:2004 Table T.1: peak scale puts A’s top at 780 nm and 560 nm at 100 / 241.675 (from memory)', () => {
		const [a] = scaleSeries([A()], 'peak').series;
		expect(peakWavelength(a.points)).toBe(780);
		expect(at(a, 780)).toBeCloseTo(1, 12);
		expect(at(a, 560)).toBeCloseTo(100 / 241.675, 6);
	});

	it('CIE 15:2004 Table T.1: D65 peaks at 460 nm within 380–780 nm (117.812, from memory), 560 nm at 100', () => {
		const [d] = scaleSeries([D65()], 'peak').series;
		expect(peakWavelength(d.points)).toBe(460);
		expect(at(d, 560)).toBeCloseTo(100 / 117.812, 4);
	});

	it('same brightness: each line gets the first line’s luminance Y, the first line’s peak is 1 (CIE 13.3 §5 compares at equal Y)', () => {
		const set = scaleSeries([A(), D65()], 'luminance');
		const [a, d] = set.series;
		expect(Math.max(...a.points.map((p) => p[1]))).toBeCloseTo(1, 12);
		// Y of the scaled lines, recomputed from the core: equal.
		const Y = (s: typeof a) => spectrumToXYZ({ start: 380, interval: 5, values: Float64Array.from(s.points.map((p) => p[1])), scale: 'relative' }).Y;
		expect(Y(d) / Y(a)).toBeCloseTo(1, 6);
		expect(d.note).toBe('scaled to the brightness of Line A');
		expect(a.note).toBeNull();
	});

	it('absolute: W/m²/nm kept as measured, a relative line matched to its illuminance and saying so', () => {
		const abs = { ...planckianSpectrum(3200, 380, 780, 5), scale: 'absolute' as const };
		for (let i = 0; i < abs.values.length; i++) abs.values[i] *= 0.002;
		const set = scaleSeries([line('m', abs), D65()], 'absolute');
		const [m, d] = set.series;
		expect(at(m, 560)).toBeCloseTo(0.2, 9);
		expect(luminanceOf({ start: 380, interval: 5, values: d.points.map((p) => p[1]), scale: 'absolute' })).toBeCloseTo(luminanceOf(abs), 6);
		expect(d.note).toMatch(/scaled to the illuminance of Line m/);
		expect(set.axis).toBe('spectral irradiance, W/m²/nm');
	});

	it('absolute is offered only when a line is absolute; without one every line is left off it', () => {
		expect(availableScales([A()])).toEqual(['peak', 'luminance', 'at560']);
		expect(availableScales([A(), line('m', { ...cieIlluminant('A'), scale: 'absolute' })])).toContain('absolute');
		const set = scaleSeries([A()], 'absolute');
		expect(set.series).toEqual([]);
		expect(set.left[0].reason).toMatch(/no absolute scale/);
	});

	it('a sodium-like line (almost nothing at 560 nm) is left off the 560 nm scale with the reason', () => {
		const values = Array.from({ length: 401 }, (_, i) => Math.exp(-0.5 * ((380 + i - 589) / 1.2) ** 2) + 1e-6);
		const set = scaleSeries([line('na', { start: 380, interval: 1, values, scale: 'relative' })], 'at560');
		expect(set.series).toEqual([]);
		expect(set.left).toEqual([{ id: 'na', label: 'Line na', reason: expect.stringMatching(/560 nm/) }]);
	});

	it('draws only 380–780 nm and never resamples (CIE 15:2004 §7.2 range)', () => {
		const pts = visibleSamples(cieIlluminant('A'));
		expect(pts[0][0]).toBe(380);
		expect(pts[pts.length - 1][0]).toBe(780);
		expect(pts).toHaveLength(81);
	});

	it('throws a clear RangeError for data that is not a spectrum', () => {
		expect(() => scaleSeries([line('x', { start: 380, interval: 0, values: [1, 2], scale: 'relative' })], 'peak')).toThrow(/interval above 0/);
		expect(() => scaleSeries([line('y', { start: NaN, interval: 5, values: [1, 2], scale: 'relative' })], 'peak')).toThrow(RangeError);
	});

	it('a line with no power in 380–780 nm is left off, not divided by zero', () => {
		const set = scaleSeries([line('z', { start: 380, interval: 5, values: new Array(81).fill(0), scale: 'relative' })], 'peak');
		expect(set.series).toEqual([]);
		expect(set.left[0].reason).toMatch(/no power/);
	});
});

describe('drawing', () => {
	it('puts 380 nm at the left edge, 780 nm at the right, 0 at the bottom and a line’s top inside the plot', () => {
		const plot = spectrumPlot(640, true);
		const set = scaleSeries([A()], 'peak');
		const s = spectrumScales(plot, set.series);
		expect(s.x(380)).toBe(plot.margin.left);
		expect(s.x(780)).toBe(plot.width - plot.margin.right);
		expect(s.y(0)).toBe(plot.height - plot.margin.bottom);
		expect(s.y(1)).toBeGreaterThanOrEqual(plot.margin.top);
		expect(s.t(1)).toBe(plot.margin.top);
		expect(seriesPath(set.series[0].points, s).startsWith(`M${s.x(380)},`)).toBe(true);
	});

	it('nmAt snaps to whole nm inside 380–780; markers are staggered per line', () => {
		const plot = spectrumPlot(500, false);
		const s = spectrumScales(plot, []);
		expect(nmAt(s, s.x(551.3))).toBe(551);
		expect(nmAt(s, -100)).toBe(380);
		expect(nmAt(s, 10_000)).toBe(780);
		const a = markerWavelengths(0, 3);
		const b = markerWavelengths(1, 3);
		expect(a.every((nm) => !b.includes(nm))).toBe(true);
		expect(a.every((nm) => nm >= 380 && nm <= 780)).toBe(true);
	});

	it('table rows every 10 nm carry each line and transmission (as 0–1)', () => {
		const set = scaleSeries([A()], 'at560');
		const t = transmissionPoints({ id: 't', label: 'half', transmission: { start: 380, interval: 200, values: [0.2, 0.6, 1.4] } });
		const rows = tableRows(set.series, [{ points: t }]);
		expect(rows).toHaveLength(41);
		expect(rows.find((r) => r.nm === 560)!.values[0]).toBeCloseTo(100, 9);
		expect(rows[0].transmissions[0]).toBeCloseTo(0.2, 12);
		// Transmission above 1 is clamped (no filter passes more than all the light).
		expect(rows[40].transmissions[0]).toBe(1);
	});

	it('formats axis numbers with a real minus and few digits', () => {
		expect(fmtPower(0)).toBe('0');
		expect(fmtPower(241.675)).toBe('242');
		expect(fmtPower(0.01234)).toBe('0.0123');
		expect(fmtPower(-1.5)).toBe('−1.5');
		expect(fmtPower(NaN)).toBe('–');
	});
});
