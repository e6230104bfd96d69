/**
 * Spectral power distribution of a Planckian (black-body) radiator.
 *
 * M(λ, T) ∝ λ⁻⁵ / (exp(c2 / λT) − 1) with c2 = 1.4388e-2 m·K, normalised to 100 at 560 nm.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §3.1 (Planck's law; c2 = 1.4388e-2 m·K on ITS-90).
 */
import type { Spectrum } from '../spectrum';
import { C2_NM_K } from '../temperature/planckian-locus';

function checkGrid(start: number, end: number, interval: number): number {
	if (![start, end, interval].every(Number.isFinite) || interval <= 0 || end < start || start <= 0) {
		throw new RangeError(`wavelength grid ${start}–${end} nm at ${interval} nm is not valid: need 0 < start ≤ end and interval > 0`);
	}
	return Math.floor((end - start) / interval + 1e-9) + 1;
}

/** Relative Planckian power at λ nm and T K (Planck's law, CIE 15:2004 §3.1), 1 at 560 nm. */
export function planckianRelativePower(nm: number, T: number): number {
	return (Math.pow(560 / nm, 5) * Math.expm1(C2_NM_K / (560 * T))) / Math.expm1(C2_NM_K / (nm * T));
}

/**
 * Planckian radiator at T kelvin on start…end nm at interval (default 360–830 nm at 1 nm),
 * relative, 100 at 560 nm (CIE 15:2004 §3.1).
 */
export function planckianSpectrum(T: number, start = 360, end = 830, interval = 1): Spectrum {
	if (!Number.isFinite(T) || T <= 0) throw new RangeError(`temperature must be a positive number of kelvin, got ${T}`);
	const n = checkGrid(start, end, interval);
	const values = new Float64Array(n);
	const ref = Math.expm1(C2_NM_K / (560 * T));
	for (let i = 0; i < n; i++) {
		const nm = start + i * interval;
		const e = Math.expm1(C2_NM_K / (nm * T));
		values[i] = Number.isFinite(e) ? (100 * Math.pow(560 / nm, 5) * ref) / e : 0;
	}
	return { start, interval, values, scale: 'relative' };
}

export { checkGrid };
