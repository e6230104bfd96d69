/**
 * Mired (micro reciprocal degree) arithmetic: M = 10⁶ / T, the scale on which gels shift a source's
 * colour temperature by about the same amount whatever the source (common practice), and
 * differences between two readings' Duv.
 *
 * References:
 *   Wyszecki, G., Stiles, W. S. (1982) Color Science, 2nd ed., Wiley, §3.11 (reciprocal colour
 *     temperature, mired).
 *   Ohno, Y. (2014) LEUKOS 10(1), 47–55, doi:10.1080/15502724.2013.839020 (Duv).
 */

function checkKelvin(K: number, what: string): void {
	if (!Number.isFinite(K) || K <= 0) throw new RangeError(`${what} must be a positive number of kelvin, got ${K}`);
}

/** Mired from kelvin: 10⁶ / K. */
export function kelvinToMired(K: number): number {
	checkKelvin(K, 'temperature');
	return 1e6 / K;
}

/** Kelvin from mired: 10⁶ / M (M > 0). */
export function miredToKelvin(M: number): number {
	if (!Number.isFinite(M) || M <= 0) throw new RangeError(`mired must be a positive number, got ${M}`);
	return 1e6 / M;
}

/** Mired shift that takes fromK to toK: 10⁶/to − 10⁶/from (positive = warmer, as a CTO gel). */
export function miredShift(fromK: number, toK: number): number {
	checkKelvin(fromK, 'fromK');
	checkKelvin(toK, 'toK');
	return 1e6 / toK - 1e6 / fromK;
}

/** ΔDuv from a to b: Duv_b − Duv_a (positive = b is greener). */
export function deltaDuv(a: number, b: number): number {
	if (!Number.isFinite(a) || !Number.isFinite(b)) throw new RangeError(`Duv values must be finite numbers, got ${a} and ${b}`);
	return b - a;
}
