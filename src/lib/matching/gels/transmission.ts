/**
 * Modelled filter transmission spectra.
 *
 * Conversion filters (CTO, CTB): τ(λ) = k · P(λ, T_to) / P(λ, T_from), the ratio of two Planckian
 * radiators, so that the filter turns a Planckian at T_from exactly into one at T_to. Under Wien's
 * approximation P ∝ λ⁻⁵ exp(−c2 / λT) the ratio is exp(−c2 · ΔM · 10⁻⁶ / λ) with ΔM the mired
 * shift: it depends only on ΔM, which is why a filter's shift is nearly the same on any warm
 * source. With Planck's full law the ratio carries the factor (e^{c2/λT_from} − 1)/(e^{c2/λT_to} − 1)
 * and the shift drifts a little with the source, as real filters' shifts do. k scales the peak over
 * the grid to `peak` (default 0.9, a plausible clear-base transmission, ours).
 *
 * Band filters (plus green, minus green, our own design): optical density
 * D(λ) = Σ D_i exp(−½((λ − λ_i)/σ_i)²) and τ(λ) = peak · 10^(−D(λ)).
 *
 * Neutral density: τ = 10^(−D) at every wavelength.
 *
 * References:
 *   Planck's law and Wien's approximation, c2 = 1.4388 × 10⁻² m·K as CIE 15:2004 Colorimetry,
 *   3rd ed., uses for the Planckian radiator (the colour core's `planckianSpectrum` supplies P).
 *   Optical density D = −log10 τ (the definition of transmission density).
 *
 * Units: nm; transmission 0..1 (relative scale), default grid 360–830 nm at 1 nm.
 */
import { makeSpectrum, planckianSpectrum, type Spectrum } from '../../colour';
import { CLEAR_BASE_TRANSMISSION, type AbsorptionBand } from './definitions';

export interface FilterGrid {
	start: number;
	end: number;
	interval: number;
}

/** The grid of every modelled transmission: the CIE 1931 observer's range at 1 nm. */
export const FILTER_GRID: FilterGrid = Object.freeze({ start: 360, end: 830, interval: 1 });
/** Peak transmission of the modelled filters: the clear base's (ours). */
export const MODEL_PEAK_TRANSMISSION = CLEAR_BASE_TRANSMISSION;

/** Colour temperature a conversion filter of shift ΔM (mired) reaches from fromK: 10⁶ / (10⁶/T + ΔM). */
export function conversionTargetK(fromK: number, miredShift: number): number {
	const m = 1e6 / fromK + miredShift;
	if (!(m > 0)) throw new RangeError(`A shift of ${miredShift} mired from ${fromK} K leaves no colour temperature.`);
	return 1e6 / m;
}

/** τ(λ) ∝ P(λ, T_to)/P(λ, T_from) scaled to `peak` (see header); Planck from the colour core. */
export function conversionTransmission(
	fromK: number,
	miredShift: number,
	options: { peak?: number; grid?: FilterGrid } = {}
): Spectrum {
	const grid = options.grid ?? FILTER_GRID;
	const peak = options.peak ?? MODEL_PEAK_TRANSMISSION;
	if (!Number.isFinite(fromK) || fromK <= 0) throw new RangeError(`Reference colour temperature must be above 0 K, got ${fromK}.`);
	if (!(peak > 0 && peak <= 1)) throw new RangeError(`Peak transmission must be in (0, 1], got ${peak}.`);
	const toK = conversionTargetK(fromK, miredShift);
	const from = planckianSpectrum(fromK, grid.start, grid.end, grid.interval).values;
	const to = planckianSpectrum(toK, grid.start, grid.end, grid.interval).values;
	const v = new Float64Array(from.length);
	let max = 0;
	for (let i = 0; i < v.length; i++) {
		v[i] = to[i] / from[i];
		if (v[i] > max) max = v[i];
	}
	for (let i = 0; i < v.length; i++) v[i] = (v[i] / max) * peak;
	return makeSpectrum(grid.start, grid.interval, v);
}

/** Optical density of absorption bands at λ (nm): Σ D_i exp(−½((λ − λ_i)/σ_i)²). */
export function bandDensity(lambda: number, bands: readonly AbsorptionBand[]): number {
	let d = 0;
	for (const b of bands) d += b.peakDensity * Math.exp(-0.5 * ((lambda - b.centre) / b.sigma) ** 2);
	return d;
}

/** τ(λ) = peak · 10^(−D(λ)) for absorption bands (see header). */
export function bandTransmission(
	bands: readonly AbsorptionBand[],
	options: { peak?: number; grid?: FilterGrid } = {}
): Spectrum {
	const grid = options.grid ?? FILTER_GRID;
	const peak = options.peak ?? MODEL_PEAK_TRANSMISSION;
	for (const b of bands) {
		if (!(b.sigma > 0) || !(b.peakDensity >= 0) || !Number.isFinite(b.centre)) {
			throw new RangeError('Each absorption band needs a centre (nm), a width σ > 0 and a density ≥ 0.');
		}
	}
	const n = Math.round((grid.end - grid.start) / grid.interval) + 1;
	const v = new Float64Array(n);
	for (let i = 0; i < n; i++) v[i] = peak * 10 ** -bandDensity(grid.start + i * grid.interval, bands);
	return makeSpectrum(grid.start, grid.interval, v);
}

/** τ = 10^(−D) at every wavelength. */
export function neutralTransmission(density: number, grid: FilterGrid = FILTER_GRID): Spectrum {
	if (!Number.isFinite(density) || density < 0) throw new RangeError(`Density must be ≥ 0, got ${density}.`);
	const n = Math.round((grid.end - grid.start) / grid.interval) + 1;
	return makeSpectrum(grid.start, grid.interval, new Float64Array(n).fill(10 ** -density));
}
