/**
 * Geometry of the spectrum plot: spectral power of one or several lights over 380–780 nm, each on
 * a chosen scale, with filter transmissions on a second axis (0–100 %). Everything returns plain
 * numbers and SVG path strings; the Svelte component only draws them.
 *
 * Scales (how the left axis is read):
 *   - 'peak': each line divided by its own largest value in 380–780 nm (peak = 1). Shapes compare
 *     at a glance; heights between lines mean nothing.
 *   - 'luminance': each line scaled to the same luminance Y as the first line (CIE 1931 2°), then
 *     all divided by the first line's peak. This is the comparison the colour rendering index makes
 *     between a light and its reference, so "more power here" is real for equally bright lights.
 *   - 'at560': each line divided by its value at 560 nm, times 100, the normalisation CIE 15:2004
 *     Table T.1 uses for illuminants A and D65. A line with almost no power at 560 nm (a sodium
 *     line) cannot be scaled so and is left off with a note.
 *   - 'absolute': spectral irradiance in W/m²/nm for absolute readings; relative lines are scaled to
 *     the same illuminance as the first absolute line (and say so).
 * Nothing is resampled: each line is drawn at its own wavelengths inside 380–780 nm.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §7.1 (Y, luminance, from the CIE 1931 2° observer), Table T.1
 *     (relative spectral power of illuminants A and D65, 100 at 560 nm).
 *   CIE 13.3-1995 §5 (a light and its reference compared at equal luminance).
 */
import { scaleLinear, type ScaleLinear } from 'd3-scale';
import { line } from 'd3-shape';
import { spectrumToXYZ, type Spectrum } from '../colour';
import { round } from './viewport';

/** Wavelengths drawn, nm (CIE 15:2004 §7.2's visible range). */
export const SPECTRUM_NM: readonly [number, number] = [380, 780];

/** A spectrum as it arrives from a page or the API: plain numbers on a uniform grid. */
export interface SpectrumData {
	start: number;
	interval: number;
	values: ArrayLike<number>;
	scale: 'relative' | 'absolute';
}

export type SeriesRole = 'reading' | 'target' | 'reference' | 'predicted';

/** One light's line. */
export interface PlotSeries {
	id: string;
	label: string;
	role: SeriesRole;
	spectrum: SpectrumData;
}

/** A filter's transmission, 0–1, drawn against the right axis. */
export interface PlotTransmission {
	id: string;
	label: string;
	transmission: { start: number; interval: number; values: ArrayLike<number> };
}

export type SpectrumScale = 'peak' | 'luminance' | 'at560' | 'absolute';

export const SCALE_LABELS: Readonly<Record<SpectrumScale, string>> = {
	peak: 'Each peak = 1',
	luminance: 'Same brightness',
	at560: '100 at 560 nm',
	absolute: 'Absolute, W/m²/nm'
};

export interface ScaledSeries extends PlotSeries {
	/** [nm, value on the chosen scale] inside 380–780 nm. */
	points: Array<[number, number]>;
	/** The factor applied to the raw values. */
	factor: number;
	/** What was done to this line beyond the scale itself (e.g. matched to another's illuminance). */
	note: string | null;
}

export interface ScaledSet {
	scale: SpectrumScale;
	series: ScaledSeries[];
	/** Lines that could not be put on this scale, with why. */
	left: Array<{ id: string; label: string; reason: string }>;
	/** The left axis' name. */
	axis: string;
}

/** Which scales a set of lines can be shown on ('absolute' only when one of them is absolute). */
export function availableScales(series: readonly PlotSeries[]): SpectrumScale[] {
	const out: SpectrumScale[] = ['peak', 'luminance', 'at560'];
	if (series.some((s) => s.spectrum.scale === 'absolute')) out.push('absolute');
	return out;
}

function checkData(d: SpectrumData | PlotTransmission['transmission'], what: string): void {
	if (!d || !Number.isFinite(d.start) || !Number.isFinite(d.interval) || d.interval <= 0 || !d.values || d.values.length < 2) {
		throw new RangeError(`${what}: a spectrum needs a finite start, an interval above 0 and at least 2 values`);
	}
}

/** The samples inside 380–780 nm as [nm, value] (values not finite are skipped). */
export function visibleSamples(d: { start: number; interval: number; values: ArrayLike<number> }): Array<[number, number]> {
	const out: Array<[number, number]> = [];
	const [lo, hi] = SPECTRUM_NM;
	for (let i = 0; i < d.values.length; i++) {
		const nm = d.start + i * d.interval;
		if (nm < lo - 1e-9 || nm > hi + 1e-9) continue;
		const v = Number(d.values[i]);
		if (Number.isFinite(v)) out.push([round(nm, 3), v]);
	}
	return out;
}

/** Linear interpolation at nm; null outside the data or the drawn range. */
export function valueAtNm(points: ReadonlyArray<[number, number]>, nm: number): number | null {
	if (points.length === 0 || nm < points[0][0] - 1e-9 || nm > points[points.length - 1][0] + 1e-9) return null;
	let lo = 0;
	let hi = points.length - 1;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (points[mid][0] <= nm) lo = mid;
		else hi = mid;
	}
	const [a, va] = points[lo];
	const [b, vb] = points[hi];
	if (Math.abs(b - a) < 1e-12 || Math.abs(nm - a) < 1e-9) return va;
	return va + ((vb - va) * (nm - a)) / (b - a);
}

/**
 * Luminance-weighted sum Σ S(λ) ȳ(λ) Δλ over the drawn 380–780 nm (CIE 15:2004 §7.1, CIE 1931 2°),
 * in the data's own units (no 683 lm/W), so relative and absolute lines compare by ratio.
 */
export function luminanceOf(d: SpectrumData): number {
	const pts = visibleSamples(d);
	if (pts.length < 3) return 0;
	const s: Spectrum = { start: pts[0][0], interval: d.interval, values: Float64Array.from(pts, (p) => p[1]), scale: 'relative' };
	return spectrumToXYZ(s).Y;
}

const peakOf = (pts: ReadonlyArray<[number, number]>) => pts.reduce((m, p) => Math.max(m, p[1]), 0);

/** Puts every line on one scale (see the header). Throws RangeError for data that is not a spectrum. */
export function scaleSeries(series: readonly PlotSeries[], scale: SpectrumScale): ScaledSet {
	series.forEach((s) => checkData(s.spectrum, s.label));
	const raw = series.map((s) => ({ s, pts: visibleSamples(s.spectrum) }));
	const left: ScaledSet['left'] = [];
	const out: ScaledSeries[] = [];
	const put = (s: PlotSeries, pts: Array<[number, number]>, factor: number, note: string | null) =>
		out.push({ ...s, points: pts.map(([nm, v]) => [nm, v * factor]), factor, note });
	const usable = raw.filter(({ s, pts }) => {
		if (peakOf(pts) > 0) return true;
		left.push({ id: s.id, label: s.label, reason: 'no power between 380 and 780 nm' });
		return false;
	});

	if (scale === 'peak') {
		for (const { s, pts } of usable) put(s, pts, 1 / peakOf(pts), null);
		return { scale, series: out, left, axis: 'relative power (each peak = 1)' };
	}

	if (scale === 'at560') {
		for (const { s, pts } of usable) {
			const at = valueAtNm(pts, 560);
			if (at === null || at <= 1e-3 * peakOf(pts)) {
				left.push({ id: s.id, label: s.label, reason: 'almost no power at 560 nm, so it cannot be scaled to 100 there' });
				continue;
			}
			put(s, pts, 100 / at, null);
		}
		return { scale, series: out, left, axis: 'relative power (100 at 560 nm)' };
	}

	if (scale === 'luminance') {
		const first = usable[0];
		if (!first) return { scale, series: out, left, axis: 'relative power (same brightness)' };
		const Y0 = luminanceOf(first.s.spectrum);
		const k0 = 1 / peakOf(first.pts);
		for (const { s, pts } of usable) {
			const Y = s === first.s ? Y0 : luminanceOf(s.spectrum);
			if (!(Y > 0)) {
				left.push({ id: s.id, label: s.label, reason: 'no luminance to match' });
				continue;
			}
			put(s, pts, (k0 * Y0) / Y, s === first.s ? null : `scaled to the brightness of ${first.s.label}`);
		}
		return { scale, series: out, left, axis: `relative power (same brightness; ${first.s.label} peak = 1)` };
	}

	// Absolute: W/m²/nm as measured; relative lines matched to the first absolute line's illuminance.
	const anchor = usable.find((u) => u.s.spectrum.scale === 'absolute');
	if (!anchor) {
		for (const { s } of usable) left.push({ id: s.id, label: s.label, reason: 'a relative spectrum has no absolute scale' });
		return { scale, series: out, left, axis: 'spectral irradiance, W/m²/nm' };
	}
	const Ya = luminanceOf(anchor.s.spectrum);
	for (const { s, pts } of usable) {
		if (s.spectrum.scale === 'absolute') {
			put(s, pts, 1, null);
			continue;
		}
		const Y = luminanceOf(s.spectrum);
		if (!(Y > 0)) {
			left.push({ id: s.id, label: s.label, reason: 'no luminance to match' });
			continue;
		}
		put(s, pts, Ya / Y, `relative: scaled to the illuminance of ${anchor.s.label}`);
	}
	return { scale, series: out, left, axis: 'spectral irradiance, W/m²/nm' };
}

/* ------------------------------------------------------------------ drawing */

export interface SpectrumPlot {
	width: number;
	height: number;
	margin: { top: number; right: number; bottom: number; left: number };
}

/** A plot `width` CSS pixels wide (drawn 1:1, so text keeps its size on a phone and a desk). */
export function spectrumPlot(width: number, withTransmission: boolean): SpectrumPlot {
	const w = Math.max(280, Math.round(width));
	const height = Math.round(Math.min(360, Math.max(240, w * 0.5)));
	return { width: w, height, margin: { top: 12, right: withTransmission ? 46 : 14, bottom: 46, left: 54 } };
}

export interface SpectrumScales {
	x: ScaleLinear<number, number>;
	/** Left axis: power on the chosen scale. */
	y: ScaleLinear<number, number>;
	/** Right axis: transmission 0–1 (drawn as 0–100 %). */
	t: ScaleLinear<number, number>;
}

/** Scales for a plot: x over 380–780 nm, y from 0 to a nice top above every line, t over 0–1. */
export function spectrumScales(plot: SpectrumPlot, series: readonly ScaledSeries[]): SpectrumScales {
	const top = Math.max(0, ...series.map((s) => peakOf(s.points)));
	const left = plot.margin.left;
	const right = plot.width - plot.margin.right;
	const bottom = plot.height - plot.margin.bottom;
	const x = scaleLinear().domain([SPECTRUM_NM[0], SPECTRUM_NM[1]]).range([left, right]);
	const y = scaleLinear()
		.domain([0, top > 0 ? top * 1.05 : 1])
		.range([bottom, plot.margin.top])
		.nice(5);
	const t = scaleLinear().domain([0, 1]).range([bottom, plot.margin.top]);
	return { x, y, t };
}

const pathOf = line<[number, number]>();

/** SVG path through [nm, value] points on the given y scale. */
export function seriesPath(points: ReadonlyArray<[number, number]>, s: SpectrumScales, axis: 'y' | 't' = 'y'): string {
	const ys = axis === 'y' ? s.y : s.t;
	return pathOf.x((p) => round(s.x(p[0]))).y((p) => round(ys(p[1])))(points as Array<[number, number]>) ?? '';
}

/** Transmission samples inside 380–780 nm, clamped to 0–1. */
export function transmissionPoints(t: PlotTransmission): Array<[number, number]> {
	checkData(t.transmission, t.label);
	return visibleSamples(t.transmission).map(([nm, v]) => [nm, Math.min(1, Math.max(0, v))]);
}

/** Line styles: every line differs by dash pattern and marker shape, not by colour alone. */
export const LINE_STYLES = [
	{ dash: '', marker: 'circle' },
	{ dash: '9 4', marker: 'square' },
	{ dash: '2 3', marker: 'triangle' },
	{ dash: '12 3 3 3', marker: 'diamond' },
	{ dash: '5 3', marker: 'cross' },
	{ dash: '1 4', marker: 'star' },
	{ dash: '14 5', marker: 'wye' }
] as const;

/** Wavelengths where line `index` of `count` carries its markers: every 80 nm, staggered so marks of different lines do not sit on one another. */
export function markerWavelengths(index: number, count: number): number[] {
	const step = 80;
	const offset = 20 + ((index * step) / Math.max(1, count)) % step;
	const out: number[] = [];
	for (let nm = SPECTRUM_NM[0] + offset; nm <= SPECTRUM_NM[1] - 10; nm += step) out.push(round(nm, 3));
	return out;
}

/** Tick wavelengths: every 50 nm, or every 100 nm when the plot is narrow. */
export function wavelengthTicks(plot: SpectrumPlot): number[] {
	const inner = plot.width - plot.margin.left - plot.margin.right;
	const step = inner < 360 ? 100 : 50;
	const out: number[] = [];
	for (let nm = 400; nm <= SPECTRUM_NM[1]; nm += step) out.push(nm);
	return out;
}

/** The wavelength a pointer at viewBox x points to, snapped to `step` nm and kept inside 380–780. */
export function nmAt(s: SpectrumScales, x: number, step = 1): number {
	const nm = Math.round(s.x.invert(x) / step) * step;
	return Math.min(SPECTRUM_NM[1], Math.max(SPECTRUM_NM[0], nm));
}

/** Rows of the data table: every `step` nm, each line's value there (null where it has none). */
export function tableRows(series: readonly ScaledSeries[], transmissions: ReadonlyArray<{ points: Array<[number, number]> }>, step = 10): Array<{ nm: number; values: Array<number | null>; transmissions: Array<number | null> }> {
	const rows = [];
	for (let nm = SPECTRUM_NM[0]; nm <= SPECTRUM_NM[1]; nm += step) {
		rows.push({ nm, values: series.map((s) => valueAtNm(s.points, nm)), transmissions: transmissions.map((t) => valueAtNm(t.points, nm)) });
	}
	return rows;
}

/** Wavelength of a line's largest value (the first, if several are equal). */
export function peakWavelength(points: ReadonlyArray<[number, number]>): number | null {
	let best: [number, number] | null = null;
	for (const p of points) if (!best || p[1] > best[1]) best = p;
	return best ? best[0] : null;
}

/** Numbers for the axes: up to 3 significant digits, a real minus sign. */
export function fmtPower(v: number): string {
	if (!Number.isFinite(v)) return '–';
	if (v === 0) return '0';
	const a = Math.abs(v);
	const s = a >= 100 ? v.toFixed(0) : a >= 1 ? String(Number(v.toPrecision(3))) : a >= 0.001 ? String(Number(v.toPrecision(3))) : v.toExponential(1);
	return s.replace('-', '−');
}
