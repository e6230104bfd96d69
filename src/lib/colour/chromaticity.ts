/**
 * Chromaticity diagrams: CIE 1931 xy, CIE 1960 UCS uv (used for CCT and Duv) and CIE 1976 UCS u'v'
 * (used for colour distances, Δu'v'). Note v' = 1.5 v and u' = u.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §8.1 (CIE 1976 UCS diagram u'v'; the CIE 1960 UCS diagram
 *     uv, with u = u' and v = 2v'/3, remains the one for correlated colour temperature).
 *   MacAdam, D. L. (1937) Projective transformations of I.C.I. color specifications. JOSA 27(8), 294–299.
 */

export interface Uv {
	u: number;
	v: number;
}
export interface UvPrime {
	u_prime: number;
	v_prime: number;
}
export interface Xy {
	x: number;
	y: number;
}

function denominatorXy(xy: Xy): number {
	const d = -2 * xy.x + 12 * xy.y + 3;
	if (!Number.isFinite(d) || d === 0) throw new RangeError(`chromaticity (${xy.x}, ${xy.y}) cannot be converted: −2x + 12y + 3 is ${d}`);
	return d;
}

/** CIE 1960 uv from xy: u = 4x/(−2x+12y+3), v = 6y/(−2x+12y+3) (CIE 15:2004 §8.1). */
export function xyToUv1960(xy: Xy): Uv {
	const d = denominatorXy(xy);
	return { u: (4 * xy.x) / d, v: (6 * xy.y) / d };
}

/** xy from CIE 1960 uv: x = 3u/(2u−8v+4), y = 2v/(2u−8v+4). */
export function uv1960ToXy(uv: Uv): Xy {
	const d = 2 * uv.u - 8 * uv.v + 4;
	if (!Number.isFinite(d) || d === 0) throw new RangeError(`uv (${uv.u}, ${uv.v}) cannot be converted: 2u − 8v + 4 is ${d}`);
	return { x: (3 * uv.u) / d, y: (2 * uv.v) / d };
}

/** CIE 1976 u'v' from xy: u' = 4x/(−2x+12y+3), v' = 9y/(−2x+12y+3) (CIE 15:2004 §8.1). */
export function xyToUvPrime(xy: Xy): UvPrime {
	const d = denominatorXy(xy);
	return { u_prime: (4 * xy.x) / d, v_prime: (9 * xy.y) / d };
}

/** xy from CIE 1976 u'v': x = 9u'/(6u'−16v'+12), y = 4v'/(6u'−16v'+12). */
export function uvPrimeToXy(uvp: UvPrime): Xy {
	const d = 6 * uvp.u_prime - 16 * uvp.v_prime + 12;
	if (!Number.isFinite(d) || d === 0) throw new RangeError(`u'v' (${uvp.u_prime}, ${uvp.v_prime}) cannot be converted: 6u' − 16v' + 12 is ${d}`);
	return { x: (9 * uvp.u_prime) / d, y: (4 * uvp.v_prime) / d };
}

/** CIE 1960 uv from u'v' (u = u', v = 2v'/3). */
export function uvPrimeToUv1960(uvp: UvPrime): Uv {
	return { u: uvp.u_prime, v: (2 * uvp.v_prime) / 3 };
}

/** CIE 1976 u'v' from CIE 1960 uv (u' = u, v' = 1.5 v). */
export function uv1960ToUvPrime(uv: Uv): UvPrime {
	return { u_prime: uv.u, v_prime: 1.5 * uv.v };
}

/** Euclidean distance Δu'v' in the CIE 1976 UCS diagram (dimensionless). */
export function deltaUvPrime(a: UvPrime, b: UvPrime): number {
	return Math.hypot(a.u_prime - b.u_prime, a.v_prime - b.v_prime);
}
