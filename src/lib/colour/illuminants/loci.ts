/**
 * Loci for chromaticity charts: the Planckian locus, the CIE daylight locus and the spectrum locus,
 * in CIE 1931 xy.
 *
 * References:
 *   Ohno, Y. (2014) LEUKOS 10(1), 47–55, doi:10.1080/15502724.2013.839020 (Planckian locus from the
 *     1 nm CIE 1931 functions, c2 = 1.4388e-2 m·K).
 *   CIE 15:2004 Colorimetry, 3rd ed., §3.1 eq. 3.3 (daylight locus), Table T.4 (spectrum locus).
 */
import { uv1960ToXy } from '../chromaticity';
import { cmfs5nm, type Observer } from '../observers';
import { planckianUvExact } from '../temperature/planckian-locus';
import { daylightXyUnchecked, DAYLIGHT_T_MAX, DAYLIGHT_T_MIN } from './daylight';

/** Planckian locus points {T, x, y} at the given temperatures (K > 0), by direct summation. */
export function planckianLocusXy(temps: readonly number[]): { T: number; x: number; y: number }[] {
	return temps.map((T) => {
		const p = planckianUvExact(T);
		return { T, ...uv1960ToXy(p) };
	});
}

/** CIE daylight locus points {T, x, y} (CIE 15:2004 eq. 3.3); each T must be in 4000–25000 K. */
export function daylightLocusXy(temps: readonly number[]): { T: number; x: number; y: number }[] {
	return temps.map((T) => {
		if (!Number.isFinite(T) || T < DAYLIGHT_T_MIN || T > DAYLIGHT_T_MAX) {
			throw new RangeError(`the CIE daylight locus is defined for ${DAYLIGHT_T_MIN}–${DAYLIGHT_T_MAX} K, got ${T}`);
		}
		return { T, ...daylightXyUnchecked(T) };
	});
}

/**
 * Spectrum locus {wavelength (nm), x, y} from the 5 nm table, 360–830 nm by default. Above about
 * 700 nm the points crowd onto one end point; charts usually stop at 380–700 nm.
 */
export function spectralLocusXy(
	options: { observer?: Observer; start?: number; end?: number } = {}
): { wavelength: number; x: number; y: number }[] {
	const c = cmfs5nm(options.observer ?? 'CIE1931_2');
	const start = options.start ?? 360;
	const end = options.end ?? 830;
	const out: { wavelength: number; x: number; y: number }[] = [];
	for (let i = 0; i < c.x.length; i++) {
		const wavelength = c.start + i * c.interval;
		if (wavelength < start || wavelength > end) continue;
		const s = c.x[i] + c.y[i] + c.z[i];
		out.push({ wavelength, x: c.x[i] / s, y: c.y[i] / s });
	}
	return out;
}
