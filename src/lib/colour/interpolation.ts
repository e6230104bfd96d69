/**
 * Interpolation of tabulated spectral functions.
 *
 * Sprague (fifth-order) interpolation for smooth tabulated functions on a uniform grid — colour-
 * matching functions and reflectance factors — as CIE 167:2005 recommends for 5 nm tables; two
 * points are extrapolated at each end with the coefficients of CIE 167:2005 / Westland, Ripamonti &
 * Cheung (2012) so the end intervals use the same formula. Measured emission spectra are
 * interpolated linearly instead (spectrum.ts), because higher orders overshoot on narrow lines.
 *
 * References:
 *   CIE 167:2005 Recommended practice for tabulating spectral data for use in colour computations.
 *   Sprague, T. B. (1880) Explanation of a new formula for interpolation. J. Inst. Actuaries 22, 270–285.
 *   Westland, S., Ripamonti, C., Cheung, V. (2012) Computational Colour Science Using MATLAB, 2nd ed.,
 *     Wiley (Sprague coefficients and boundary extrapolation).
 */

const BOUNDARY = [
	[884, -1960, 3033, -2648, 1080, -180],
	[508, -540, 488, -367, 144, -24]
] as const;

/** Pads a table with two extrapolated points at each end (CIE 167:2005 Sprague boundary formula). */
function padForSprague(y: ArrayLike<number>): Float64Array {
	const n = y.length;
	if (n < 6) throw new RangeError('Sprague interpolation needs at least 6 tabulated points');
	const p = new Float64Array(n + 4);
	for (let i = 0; i < n; i++) p[i + 2] = y[i];
	let a = 0;
	let b = 0;
	let c = 0;
	let d = 0;
	for (let k = 0; k < 6; k++) {
		a += BOUNDARY[0][k] * y[k];
		b += BOUNDARY[1][k] * y[k];
		c += BOUNDARY[1][k] * y[n - 1 - k];
		d += BOUNDARY[0][k] * y[n - 1 - k];
	}
	p[0] = a / 209;
	p[1] = b / 209;
	p[n + 2] = c / 209;
	p[n + 3] = d / 209;
	return p;
}

/**
 * Sprague interpolation (CIE 167:2005) of a table y on start + i·interval, evaluated at each of
 * `at` (nm). Tabulated points are returned exactly; outside the table returns 0.
 */
export function spragueInterpolate(
	y: ArrayLike<number>,
	start: number,
	interval: number,
	at: ArrayLike<number>
): Float64Array {
	const p = padForSprague(y);
	const n = y.length;
	const out = new Float64Array(at.length);
	for (let j = 0; j < at.length; j++) {
		const f = (at[j] - start) / interval;
		if (f < -1e-9 || f > n - 1 + 1e-9) {
			out[j] = 0;
			continue;
		}
		let i = Math.floor(f + 1e-9);
		let x = f - i;
		if (x < 1e-9) x = 0;
		if (i >= n - 1) {
			i = n - 1;
			x = 0;
		}
		if (x === 0) {
			out[j] = y[i];
			continue;
		}
		const q = i + 2; // index of y[i] in the padded array
		const pm2 = p[q - 2];
		const pm1 = p[q - 1];
		const p0 = p[q];
		const p1 = p[q + 1];
		const p2 = p[q + 2];
		const p3 = p[q + 3];
		const a1 = (2 * pm2 - 16 * pm1 + 16 * p1 - 2 * p2) / 24;
		const a2 = (-pm2 + 16 * pm1 - 30 * p0 + 16 * p1 - p2) / 24;
		const a3 = (-9 * pm2 + 39 * pm1 - 70 * p0 + 66 * p1 - 33 * p2 + 7 * p3) / 24;
		const a4 = (13 * pm2 - 64 * pm1 + 126 * p0 - 124 * p1 + 61 * p2 - 12 * p3) / 24;
		const a5 = (-5 * pm2 + 25 * pm1 - 50 * p0 + 50 * p1 - 25 * p2 + 5 * p3) / 24;
		out[j] = p0 + x * (a1 + x * (a2 + x * (a3 + x * (a4 + x * a5))));
	}
	return out;
}

/** Linear interpolation of a table at each of `at` (nm); outside the table returns 0. */
export function linearInterpolate(
	y: ArrayLike<number>,
	start: number,
	interval: number,
	at: ArrayLike<number>
): Float64Array {
	const n = y.length;
	const out = new Float64Array(at.length);
	for (let j = 0; j < at.length; j++) {
		const f = (at[j] - start) / interval;
		if (f < -1e-9 || f > n - 1 + 1e-9) continue;
		const i = Math.min(Math.floor(f + 1e-9), n - 1);
		const x = f - i;
		out[j] = i >= n - 1 || x < 1e-9 ? y[i] : y[i] + (y[i + 1] - y[i]) * x;
	}
	return out;
}

/** Wavelengths start, start + step, … up to end (inclusive, nm). */
export function wavelengthGrid(start: number, end: number, step: number): Float64Array {
	const n = Math.floor((end - start) / step + 1e-9) + 1;
	const w = new Float64Array(n);
	for (let i = 0; i < n; i++) w[i] = start + i * step;
	return w;
}
