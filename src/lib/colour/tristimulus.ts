/**
 * CIE tristimulus values XYZ of a spectrum, and XYZ ↔ xy.
 *
 * Summation (CIE 15:2004 §7.1–7.2): X = k Σ S(λ) x̄(λ) Δλ over the wavelengths the spectrum
 * and the observer share (360–830 nm), at the data's own interval:
 *   - 5 nm data on multiples of 5 nm: the CIE 5 nm table as is;
 *   - 1 nm data on whole nm, and any other interval below 5 nm: the functions at the data's own
 *     wavelengths (Sprague-interpolated from the 5 nm table, see observers.ts), so no line is lost;
 *   - intervals above 5 nm (e.g. 10 nm): the spectrum is linearly interpolated to 5 nm first
 *     (linear, because splines overshoot on line spectra) and the result says so in a note.
 * k = 683 lm/W for absolute spectra (W/m²/nm → Y in lux), 1 for relative spectra (raw sum), or
 * chosen so that Y = 100 when normalise is true.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §7.1–7.2 (tristimulus values), §7.3 (chromaticity coordinates).
 *   CIE 167:2005 Recommended practice for tabulating spectral data for use in colour computations.
 */
import { checkObserver, cmfs5nm, cmfsAt, CMF_END_NM, CMF_START_NM, type Observer } from './observers';
import { alignSpectrum, spectrumEnd, SpectrumError, type Spectrum } from './spectrum';

export type { Observer } from './observers';

export interface XYZ {
	X: number;
	Y: number;
	Z: number;
}

/** Maximum luminous efficacy for photopic vision, lm/W (CIE 15:2004 §7.1). */
export const K_M = 683;

/** Weights x̄Δλ, ȳΔλ, z̄Δλ for one spectral grid, zero where the observer is not defined. */
export interface GridWeights {
	x: Float64Array;
	y: Float64Array;
	z: Float64Array;
}

const weightCache = new Map<string, GridWeights>();
const WEIGHT_CACHE_LIMIT = 64;

const isWhole = (v: number) => Math.abs(v - Math.round(v)) < 1e-9;

/** Whether spectrumToXYZ sums a spectrum with this interval directly (true) or aligns it to 5 nm first. */
export function sumsAtOwnInterval(interval: number): boolean {
	return interval <= 5 + 1e-9;
}

/** x̄Δλ, ȳΔλ, z̄Δλ at the grid start + i·interval (i < n); cached per grid. */
export function gridWeights(observer: Observer, start: number, interval: number, n: number): GridWeights {
	const key = `${observer}|${start}|${interval}|${n}`;
	let w = weightCache.get(key);
	if (w) return w;
	w = { x: new Float64Array(n), y: new Float64Array(n), z: new Float64Array(n) };
	const t = cmfs5nm(observer);
	if (Math.abs(interval - 5) < 1e-9 && isWhole(start / 5)) {
		// 5 nm on the table's own grid: the table values, no interpolation.
		for (let i = 0; i < n; i++) {
			const k = Math.round((start + i * 5 - t.start) / 5);
			if (k < 0 || k >= t.x.length) continue;
			w.x[i] = t.x[k] * 5;
			w.y[i] = t.y[k] * 5;
			w.z[i] = t.z[k] * 5;
		}
	} else {
		const nm = new Float64Array(n);
		for (let i = 0; i < n; i++) nm[i] = start + i * interval;
		const c = cmfsAt(observer, nm);
		for (let i = 0; i < n; i++) {
			w.x[i] = c.x[i] * interval;
			w.y[i] = c.y[i] * interval;
			w.z[i] = c.z[i] * interval;
		}
	}
	if (weightCache.size >= WEIGHT_CACHE_LIMIT) weightCache.delete(weightCache.keys().next().value as string);
	weightCache.set(key, w);
	return w;
}

/** Raw sums Σ S·x̄·Δλ etc. of values on a grid with these weights. */
export function sumWithWeights(values: Float64Array, w: GridWeights): XYZ {
	let X = 0;
	let Y = 0;
	let Z = 0;
	const wx = w.x;
	const wy = w.y;
	const wz = w.z;
	for (let i = 0; i < values.length; i++) {
		const s = values[i];
		X += s * wx[i];
		Y += s * wy[i];
		Z += s * wz[i];
	}
	return { X, Y, Z };
}

/**
 * The spectrum as it is summed: itself when its interval is ≤ 5 nm, else linearly interpolated to
 * 5 nm over the multiples of 5 nm inside its range (with a note saying so).
 */
export function spectrumForSummation(s: Spectrum): { spectrum: Spectrum; note: string | null } {
	if (sumsAtOwnInterval(s.interval)) return { spectrum: s, note: null };
	const start = Math.ceil(s.start / 5 - 1e-9) * 5;
	const end = Math.floor(spectrumEnd(s) / 5 + 1e-9) * 5;
	const aligned = alignSpectrum(s, start, end, 5);
	return {
		spectrum: aligned.spectrum,
		note: `${aligned.note} before summing, because CIE 15:2004 §7.2 sums at 1 or 5 nm (the result may differ slightly from a finer measurement)`
	};
}

/**
 * Tristimulus values with the note of any resampling (CIE 15:2004 §7.1).
 * Units: absolute spectra (W/m²/nm) give Y in lux (k = 683 lm/W); relative spectra give the raw
 * sum Σ S ȳ Δλ (k = 1); normalise: true scales to Y = 100.
 */
export function spectrumToXYZWithNote(
	s: Spectrum,
	options: { observer?: Observer; normalise?: boolean } = {}
): { XYZ: XYZ; note: string | null } {
	const observer = checkObserver(options.observer ?? 'CIE1931_2');
	if (!s || !(s.values instanceof Float64Array)) throw new SpectrumError('not a spectrum: expected { start, interval, values: Float64Array, scale }');
	const { spectrum, note } = spectrumForSummation(s);
	const w = gridWeights(observer, spectrum.start, spectrum.interval, spectrum.values.length);
	const raw = sumWithWeights(spectrum.values, w);
	if (!(raw.Y > 0)) {
		const end = spectrumEnd(spectrum);
		throw new SpectrumError(
			end < CMF_START_NM || spectrum.start > CMF_END_NM
				? `the spectrum (${spectrum.start}–${end} nm) lies outside the visible range ${CMF_START_NM}–${CMF_END_NM} nm`
				: 'the spectrum has no visible power (Y = 0)'
		);
	}
	const k = options.normalise ? 100 / raw.Y : s.scale === 'absolute' ? K_M : 1;
	return { XYZ: { X: raw.X * k, Y: raw.Y * k, Z: raw.Z * k }, note };
}

/** Tristimulus values (CIE 15:2004 §7.1); see spectrumToXYZWithNote for units and grids. */
export function spectrumToXYZ(s: Spectrum, options: { observer?: Observer; normalise?: boolean } = {}): XYZ {
	return spectrumToXYZWithNote(s, options).XYZ;
}

/** Chromaticity x = X/(X+Y+Z), y = Y/(X+Y+Z) (CIE 15:2004 §7.3). Throws when X+Y+Z is not > 0. */
export function XYZToXy(c: XYZ): { x: number; y: number } {
	const sum = c.X + c.Y + c.Z;
	if (!Number.isFinite(sum) || !(sum > 0)) throw new RangeError(`XYZ (${c.X}, ${c.Y}, ${c.Z}) has no chromaticity: X+Y+Z must be a positive number`);
	return { x: c.X / sum, y: c.Y / sum };
}

/** XYZ with the given luminance Y (default 100) from chromaticity xy (CIE 15:2004 §7.3, inverted). */
export function xyToXYZ(xy: { x: number; y: number }, Y = 100): XYZ {
	if (!Number.isFinite(xy.x) || !Number.isFinite(xy.y) || !(xy.y > 0)) {
		throw new RangeError(`chromaticity (${xy.x}, ${xy.y}) is not valid: x and y must be finite and y > 0`);
	}
	return { X: (xy.x * Y) / xy.y, Y, Z: ((1 - xy.x - xy.y) * Y) / xy.y };
}
