/**
 * Modelled LED emission spectra: single-colour LEDs after Ohno's model, and phosphor-converted
 * whites as a blue pump peak plus broad phosphor bands drawn with the same shape.
 *
 * References:
 *   Y. Ohno, "Spectral design considerations for white LED color rendering", Optical Engineering
 *   44(11), 111302, 2005, doi:10.1117/1.2130694 — eq. (1): S(λ) = [g(λ) + 2 g(λ)⁵] / 3 with
 *   g(λ) = exp(−((λ − λ0) / Δλ)²), λ0 the peak wavelength and Δλ the half spectral width.
 *
 * Units: wavelengths and widths in nm; values relative, peak 1 for a single LED.
 * With this shape the full width at half maximum is 0.922·Δλ (solved numerically), so Δλ is close
 * to the width at half maximum that data sheets quote.
 */
import { makeSpectrum, type Spectrum } from '../../colour';

export interface SpectralGrid {
	start: number;
	end: number;
	interval: number;
}

/** Default grid for modelled emitters: 380–780 nm at 5 nm (CIE 15:2004 §7.2 summation). */
export const LED_GRID: SpectralGrid = Object.freeze({ start: 380, end: 780, interval: 5 });

/** Ohno 2005 eq. (1): relative emission at λ (nm) of an LED peaking at peak with half width halfWidth (nm). */
export function ohno2005Value(lambda: number, peak: number, halfWidth: number): number {
	const g = Math.exp(-(((lambda - peak) / halfWidth) ** 2));
	return (g + 2 * g ** 5) / 3;
}

function checkPeak(peak: number, halfWidth: number): void {
	if (!Number.isFinite(peak) || peak < 300 || peak > 900) throw new RangeError(`LED peak wavelength must be 300–900 nm, got ${peak}.`);
	if (!Number.isFinite(halfWidth) || halfWidth <= 0 || halfWidth > 300) {
		throw new RangeError(`LED half spectral width must be above 0 and at most 300 nm, got ${halfWidth}.`);
	}
}

function gridLength(grid: SpectralGrid): number {
	const n = Math.round((grid.end - grid.start) / grid.interval) + 1;
	if (!Number.isFinite(n) || n < 3) throw new RangeError('Spectral grid needs start < end and a positive interval.');
	return n;
}

/** A single LED after Ohno 2005 eq. (1), peak value 1, relative scale. */
export function ledSpectrumOhno2005(peak: number, halfWidth: number, grid: SpectralGrid = LED_GRID): Spectrum {
	checkPeak(peak, halfWidth);
	const n = gridLength(grid);
	const v = new Float64Array(n);
	for (let i = 0; i < n; i++) v[i] = ohno2005Value(grid.start + i * grid.interval, peak, halfWidth);
	return makeSpectrum(grid.start, grid.interval, v);
}

export interface EmissionBand {
	peak: number; // nm
	halfWidth: number; // nm (Δλ of Ohno 2005 eq. 1)
	weight: number; // relative height of this band's peak
}

/**
 * A phosphor-converted LED: the blue pump as one Ohno peak plus one or more broad phosphor bands
 * of the same shape (Ohno 2005 models phosphor emission with the same function and a wide Δλ).
 * Relative scale; the tallest band has weight as given.
 */
export function phosphorLedSpectrum(bands: readonly EmissionBand[], grid: SpectralGrid = LED_GRID): Spectrum {
	if (bands.length === 0) throw new RangeError('A phosphor LED needs at least one band.');
	for (const b of bands) {
		checkPeak(b.peak, b.halfWidth);
		if (!Number.isFinite(b.weight) || b.weight < 0) throw new RangeError(`Band weight must be ≥ 0, got ${b.weight}.`);
	}
	const n = gridLength(grid);
	const v = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const l = grid.start + i * grid.interval;
		let s = 0;
		for (const b of bands) s += b.weight * ohno2005Value(l, b.peak, b.halfWidth);
		v[i] = s;
	}
	return makeSpectrum(grid.start, grid.interval, v);
}
