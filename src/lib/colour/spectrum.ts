/**
 * Spectra: the explicit type every spectral computation takes, its validation, and the visible
 * alignment step (resampling is never silent: it returns a note saying what it did).
 *
 * Conventions: wavelengths in nm on a uniform grid (start + i·interval); values are spectral power,
 * relative (any scale) or absolute (spectral irradiance in W/m²/nm), or transmittance 0…1 for filters.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §7.2 (wavelength range 360/380–780/830 nm, summation interval).
 *   CIE 167:2005 Recommended practice for tabulating spectral data for use in colour computations
 *     (interpolation of spectral data; we use linear interpolation for measured spectra).
 */

export interface Spectrum {
	/** nm, first wavelength */
	start: number;
	/** nm, uniform step (> 0) */
	interval: number;
	/** spectral power (or transmission 0..1 for filters) */
	values: Float64Array;
	/** absolute = W/m²/nm (irradiance) */
	scale: 'relative' | 'absolute';
}

export class SpectrumError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'SpectrumError';
	}
}

/** Negative values down to this fraction of the peak are treated as measurement noise and clipped. */
export const NEGATIVE_NOISE_FRACTION = 1e-3;
/** A spectrum must span at least this band (nm) to give a usable chromaticity. */
export const MINIMUM_RANGE_NM: readonly [number, number] = [420, 680];
/** The band CIE 15:2004 §7.2 asks for; less is accepted with a warning. */
export const RECOMMENDED_RANGE_NM: readonly [number, number] = [380, 780];

const fmt = (nm: number) => String(Number(nm.toFixed(3)));

/** Wavelength (nm) of sample i. */
export function wavelengthAt(s: Spectrum, i: number): number {
	return s.start + i * s.interval;
}

/** Last wavelength (nm). */
export function spectrumEnd(s: Spectrum): number {
	return s.start + (s.values.length - 1) * s.interval;
}

/**
 * Builds a spectrum after checking it: finite start and interval > 0, at least 3 values, every
 * value finite, no negative value beyond noise (< −0.1 % of the peak), not all zero, and a range
 * spanning at least 420–680 nm. Tiny negatives are kept here; validateSpectrum clips them.
 * Throws SpectrumError with a message that says what is wrong and where.
 */
export function makeSpectrum(
	start: number,
	interval: number,
	values: ArrayLike<number>,
	scale: 'relative' | 'absolute' = 'relative'
): Spectrum {
	if (!values || values.length < 3) {
		throw new SpectrumError(`a spectrum needs at least 3 values, got ${values ? values.length : 0}`);
	}
	const s: Spectrum = { start, interval, values: Float64Array.from(values), scale };
	checkSpectrum(s);
	return s;
}

/**
 * Checks a spectrum (as makeSpectrum does), clips negative values within noise to zero, and warns
 * when 380–780 nm is not fully covered (the missing power is taken as zero).
 * Returns a new spectrum when it clipped, else the same object.
 */
export function validateSpectrum(s: Spectrum): { spectrum: Spectrum; warnings: string[] } {
	const checked = s && s.values instanceof Float64Array ? s : null;
	if (!checked) throw new SpectrumError('not a spectrum: expected { start, interval, values: Float64Array, scale }');
	checkSpectrum(s);
	const warnings: string[] = [];
	let spectrum = s;
	const v = s.values;
	let negatives = 0;
	let worst = 0;
	for (let i = 0; i < v.length; i++) {
		if (v[i] < 0) {
			negatives++;
			if (v[i] < worst) worst = v[i];
		}
	}
	if (negatives > 0) {
		const clipped = Float64Array.from(v);
		for (let i = 0; i < clipped.length; i++) if (clipped[i] < 0) clipped[i] = 0;
		spectrum = { ...s, values: clipped };
		warnings.push(
			`${negatives} slightly negative value${negatives === 1 ? '' : 's'} (down to ${worst.toPrecision(3)}, within ${NEGATIVE_NOISE_FRACTION * 100} % of the peak) set to zero as measurement noise`
		);
	}
	const end = spectrumEnd(s);
	const [lo, hi] = RECOMMENDED_RANGE_NM;
	const missing: string[] = [];
	if (s.start > lo) missing.push(`${lo}–${fmt(s.start)} nm`);
	if (end < hi) missing.push(`${fmt(end)}–${hi} nm`);
	if (missing.length > 0) {
		warnings.push(
			`the spectrum covers ${fmt(s.start)}–${fmt(end)} nm, not the full ${lo}–${hi} nm: ${missing.join(' and ')} ${missing.length === 1 ? 'is' : 'are'} missing and taken as zero power, so chromaticity and indices may be slightly off`
		);
	}
	return { spectrum, warnings };
}

/** The hard checks shared by makeSpectrum and validateSpectrum (in place, no copy). */
function checkSpectrum(s: Spectrum): void {
	if (!Number.isFinite(s.start)) throw new SpectrumError(`start wavelength must be a finite number of nm, got ${s.start}`);
	if (!Number.isFinite(s.interval) || s.interval <= 0) {
		throw new SpectrumError(`interval must be a positive number of nm, got ${s.interval}`);
	}
	if (s.scale !== 'relative' && s.scale !== 'absolute') {
		throw new SpectrumError(`scale must be 'relative' or 'absolute', got ${String(s.scale)}`);
	}
	const v = s.values;
	if (v.length < 3) throw new SpectrumError(`a spectrum needs at least 3 values, got ${v.length}`);
	let peak = -Infinity;
	let min = Infinity;
	let minAt = 0;
	for (let i = 0; i < v.length; i++) {
		const x = v[i];
		if (!Number.isFinite(x)) {
			throw new SpectrumError(`value at ${fmt(s.start + i * s.interval)} nm (index ${i}) is ${x}: every value must be a finite number`);
		}
		if (x > peak) peak = x;
		if (x < min) {
			min = x;
			minAt = i;
		}
	}
	if (peak <= 0) throw new SpectrumError('the spectrum has no positive value: all values are zero or negative');
	if (min < -NEGATIVE_NOISE_FRACTION * peak) {
		throw new SpectrumError(
			`negative power ${min} at ${fmt(s.start + minAt * s.interval)} nm is more than ${NEGATIVE_NOISE_FRACTION * 100} % of the peak (${peak}); ` +
				'spectral power cannot be negative: check the dark reference or the baseline of the measurement'
		);
	}
	const end = spectrumEnd(s);
	const [lo, hi] = MINIMUM_RANGE_NM;
	if (s.start > lo || end < hi) {
		throw new SpectrumError(
			`too short a range: the spectrum covers ${fmt(s.start)}–${fmt(end)} nm; it must span at least ${lo}–${hi} nm (ideally ${RECOMMENDED_RANGE_NM[0]}–${RECOMMENDED_RANGE_NM[1]} nm)`
		);
	}
}

/**
 * Builds a spectrum from (wavelength, value) pairs, e.g. a meter's CSV export. Wavelengths must be
 * finite, strictly increasing (no duplicates) and uniformly spaced; otherwise SpectrumError.
 * Then validated as validateSpectrum does.
 */
export function spectrumFromSamples(
	wavelengths: ArrayLike<number>,
	values: ArrayLike<number>,
	scale: 'relative' | 'absolute' = 'relative'
): { spectrum: Spectrum; warnings: string[] } {
	if (!wavelengths || !values) throw new SpectrumError('wavelengths and values are both required');
	if (wavelengths.length !== values.length) {
		throw new SpectrumError(`${wavelengths.length} wavelengths but ${values.length} values: each wavelength needs one value`);
	}
	if (wavelengths.length < 3) throw new SpectrumError(`a spectrum needs at least 3 samples, got ${wavelengths.length}`);
	for (let i = 0; i < wavelengths.length; i++) {
		if (!Number.isFinite(wavelengths[i])) {
			throw new SpectrumError(`wavelength at row ${i + 1} is ${wavelengths[i]}: every wavelength must be a finite number of nm`);
		}
	}
	for (let i = 1; i < wavelengths.length; i++) {
		const a = wavelengths[i - 1];
		const b = wavelengths[i];
		if (b === a) throw new SpectrumError(`duplicate wavelength ${fmt(b)} nm at rows ${i} and ${i + 1}: each wavelength may appear once`);
		if (b < a) {
			throw new SpectrumError(`wavelengths must increase: ${fmt(b)} nm at row ${i + 1} follows ${fmt(a)} nm; sort the samples by wavelength first`);
		}
	}
	const n = wavelengths.length;
	const start = wavelengths[0];
	const interval = (wavelengths[n - 1] - start) / (n - 1);
	const tolerance = Math.max(1e-6, 1e-3 * interval);
	for (let i = 1; i < n; i++) {
		const step = wavelengths[i] - wavelengths[i - 1];
		if (Math.abs(step - interval) > tolerance) {
			throw new SpectrumError(
				`wavelengths are not evenly spaced: step of ${fmt(step)} nm at ${fmt(wavelengths[i])} nm where the average step is ${fmt(interval)} nm; resample to a uniform step first`
			);
		}
	}
	// Snap a step like 0.99999 nm to 1 nm so the grid matches the tables.
	const snapped = Math.abs(interval - Math.round(interval)) < tolerance ? Math.round(interval) : interval;
	const snappedStart = Math.abs(start - Math.round(start)) < tolerance ? Math.round(start) : start;
	return validateSpectrum(makeSpectrum(snappedStart, snapped, values, scale));
}

/** Linear interpolation of s at wavelength nm; outside the spectrum's range returns `outside`. */
export function valueAt(s: Spectrum, nm: number, outside: 'zero' | 'hold' = 'zero'): number {
	const f = (nm - s.start) / s.interval;
	const n = s.values.length;
	if (f < -1e-9 || f > n - 1 + 1e-9) {
		if (outside === 'zero') return 0;
		return f < 0 ? s.values[0] : s.values[n - 1];
	}
	const i = Math.min(Math.max(Math.floor(f + 1e-9), 0), n - 1);
	const t = f - i;
	if (i >= n - 1 || t <= 1e-9) return s.values[i];
	return s.values[i] + (s.values[i + 1] - s.values[i]) * t;
}

/**
 * Resamples s onto start…end (nm) at interval by linear interpolation (no overshoot on line
 * spectra). Outside s's range: zero (default) or the end values held.
 * Returns the spectrum and a note describing the change, or note null if the grid was already that.
 */
export function alignSpectrum(
	s: Spectrum,
	start: number,
	end: number,
	interval: number,
	options: { outside?: 'zero' | 'hold' } = {}
): { spectrum: Spectrum; note: string | null } {
	if (!Number.isFinite(start) || !Number.isFinite(end) || !Number.isFinite(interval) || interval <= 0 || end < start) {
		throw new SpectrumError(`cannot align to ${start}–${end} nm at ${interval} nm: need finite start ≤ end and interval > 0`);
	}
	const n = Math.floor((end - start) / interval + 1e-9) + 1;
	const sEnd = spectrumEnd(s);
	if (Math.abs(s.start - start) < 1e-9 && Math.abs(s.interval - interval) < 1e-9 && s.values.length === n) {
		return { spectrum: s, note: null };
	}
	const outside = options.outside ?? 'zero';
	const values = new Float64Array(n);
	for (let i = 0; i < n; i++) values[i] = valueAt(s, start + i * interval, outside);
	const parts = [`resampled from ${fmt(s.start)}–${fmt(sEnd)} nm at ${fmt(s.interval)} nm to ${fmt(start)}–${fmt(start + (n - 1) * interval)} nm at ${fmt(interval)} nm by linear interpolation`];
	if (start < s.start - 1e-9 || start + (n - 1) * interval > sEnd + 1e-9) {
		parts.push(outside === 'zero' ? 'values outside the original range set to zero' : 'end values held outside the original range');
	}
	return { spectrum: { start, interval, values, scale: s.scale }, note: parts.join('; ') };
}

/**
 * Product a(λ)·b(λ) on a's grid, e.g. a source times a filter's transmittance. b is linearly
 * interpolated onto a's wavelengths, with b's end values held beyond its range (a filter measured
 * over 380–730 nm is assumed flat beyond). Keeps a's scale.
 */
export function multiplySpectra(a: Spectrum, b: Spectrum): Spectrum {
	const values = new Float64Array(a.values.length);
	for (let i = 0; i < values.length; i++) values[i] = a.values[i] * valueAt(b, a.start + i * a.interval, 'hold');
	return { start: a.start, interval: a.interval, values, scale: a.scale };
}
