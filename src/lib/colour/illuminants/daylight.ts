/**
 * CIE daylight illuminants (D series) from the daylight components S0, S1, S2.
 *
 * S(λ) = S0(λ) + M1·S1(λ) + M2·S2(λ), with the chromaticity of the daylight locus at the given CCT
 * (x_D from the two cubic formulas for 4000–7000 K and 7000–25000 K, y_D = −3.000 x_D² + 2.870 x_D
 * − 0.275) and M1, M2 from x_D, y_D, rounded to 3 decimals as CIE 15:2004 does for its tables.
 * The components are tabulated at 5 nm (300–830 nm); at other wavelengths they are interpolated
 * linearly, as CIE 15:2004 recommends for the D series. D50, D55, D65, D75 use the nominal
 * temperatures times 1.4388/1.4380 (the change of c2), e.g. D65 at 6504 K.
 *
 * colord-data ships its own D50 table, rounded to 3 figures, which integrates to y = 0.35854
 * (CIE 15:2004 gives 0.35851); building from S0, S1, S2 avoids that.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §3.1, eqs. 3.3–3.4 (x_D, y_D; M1, M2), Table T.2 (S0, S1, S2).
 *   Judd, D. B., MacAdam, D. L., Wyszecki, G. (1964) Spectral distribution of typical daylight as a
 *     function of correlated color temperature. JOSA 54(8), 1031–1040.
 */
import { DAYLIGHT_S0, DAYLIGHT_S1, DAYLIGHT_S2 } from '../data/daylight';
import type { Spectrum } from '../spectrum';
import { checkGrid } from './planckian';

export const DAYLIGHT_T_MIN = 4000;
export const DAYLIGHT_T_MAX = 25000;

/** x_D, y_D of CIE daylight at CCT T (K) (CIE 15:2004 eq. 3.3). Formula for 7000–25000 K used beyond 25000 K. */
export function daylightXyUnchecked(T: number): { x: number; y: number } {
	const x =
		T <= 7000
			? -4.607e9 / T ** 3 + 2.9678e6 / T ** 2 + 0.09911e3 / T + 0.244063
			: -2.0064e9 / T ** 3 + 1.9018e6 / T ** 2 + 0.24748e3 / T + 0.23704;
	return { x, y: -3.0 * x * x + 2.87 * x - 0.275 };
}

/** M1, M2 (CIE 15:2004 eq. 3.4), rounded to 3 decimals unless round is false. */
export function daylightM(xy: { x: number; y: number }, round = true): { M1: number; M2: number } {
	const M = 0.0241 + 0.2562 * xy.x - 0.7341 * xy.y;
	let M1 = (-1.3515 - 1.7703 * xy.x + 5.9114 * xy.y) / M;
	let M2 = (0.03 - 31.4424 * xy.x + 30.0717 * xy.y) / M;
	if (round) {
		M1 = Math.round(M1 * 1000) / 1000;
		M2 = Math.round(M2 * 1000) / 1000;
	}
	return { M1, M2 };
}

function component(table: typeof DAYLIGHT_S0, nm: number): number {
	const f = (nm - table.start) / table.interval;
	const n = table.values.length;
	if (f < -1e-9 || f > n - 1 + 1e-9) return 0;
	const i = Math.min(Math.floor(f + 1e-9), n - 1);
	const t = f - i;
	return i >= n - 1 || t < 1e-9 ? table.values[i] : table.values[i] + (table.values[i + 1] - table.values[i]) * t;
}

/** Daylight at any CCT > 0 without the 4000–25000 K check (callers warn); see daylightSpectrum. */
export function daylightSpectrumUnchecked(CCT: number, start = 300, end = 830, interval = 5, options: { roundM?: boolean } = {}): Spectrum {
	if (!Number.isFinite(CCT) || CCT <= 0) throw new RangeError(`CCT must be a positive number of kelvin, got ${CCT}`);
	const n = checkGrid(start, end, interval);
	const { M1, M2 } = daylightM(daylightXyUnchecked(CCT), options.roundM ?? true);
	const values = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const nm = start + i * interval;
		values[i] = component(DAYLIGHT_S0, nm) + M1 * component(DAYLIGHT_S1, nm) + M2 * component(DAYLIGHT_S2, nm);
	}
	return { start, interval, values, scale: 'relative' };
}

/**
 * CIE daylight at CCT (K, 4000–25000) on start…end nm at interval (default 300–830 nm at 5 nm,
 * the components' own grid), relative, 100 at 560 nm (where S1 = S2 = 0) (CIE 15:2004 §3.1).
 * Throws RangeError outside 4000–25000 K.
 */
export function daylightSpectrum(CCT: number, start = 300, end = 830, interval = 5): Spectrum {
	if (!Number.isFinite(CCT) || CCT < DAYLIGHT_T_MIN || CCT > DAYLIGHT_T_MAX) {
		throw new RangeError(`CIE daylight is defined for ${DAYLIGHT_T_MIN}–${DAYLIGHT_T_MAX} K, got ${CCT}`);
	}
	return daylightSpectrumUnchecked(CCT, start, end, interval);
}
