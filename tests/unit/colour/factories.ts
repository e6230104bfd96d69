/** Small factories for colour tests (invented spectra, built from models; not measured data). */
import { makeSpectrum, type Spectrum } from '../../../src/lib/colour/spectrum';

/** Values f(λ) on start…end nm at step. */
export function spectrumOf(f: (nm: number) => number, start = 380, end = 780, step = 5, scale: 'relative' | 'absolute' = 'relative'): Spectrum {
	const n = Math.round((end - start) / step) + 1;
	const v: number[] = [];
	for (let i = 0; i < n; i++) v.push(f(start + i * step));
	return makeSpectrum(start, step, v, scale);
}

/** A Gaussian band: peak 1 at centre (nm), full width at half maximum fwhm (nm). */
export function gaussian(centre: number, fwhm: number): (nm: number) => number {
	const s = fwhm / 2.3548;
	return (nm) => Math.exp(-0.5 * ((nm - centre) / s) ** 2);
}

/** A phosphor-converted white LED model (invented): blue pump, broad yellow-green and red phosphor bands (Ra ≈ 88 at about 3100 K). */
export function whiteLed(): (nm: number) => number {
	const pump = gaussian(450, 20);
	const yellow = gaussian(560, 140);
	const red = gaussian(640, 110);
	return (nm) => 0.5 * pump(nm) + yellow(nm) + red(nm);
}

/** Plain array of a spectrum's values (for building bad inputs). */
export function valuesOf(s: Spectrum): number[] {
	return Array.from(s.values);
}
