/**
 * The nominal-CCT quadrangles of ANSI C78.377 (chromaticity of solid-state lighting products): for
 * each nominal CCT a target CCT ± tolerance and a target Duv ± 0.006. A quadrangle's corners are the
 * four (CCT, Duv) combinations of those limits; its long sides lie on the isotemperature lines at the
 * CCT limits, and it is drawn with straight sides between the corners, as the standard draws it.
 *
 * The figures below are the standard's Table 1 for its eight original nominal CCTs (2700–6500 K),
 * quoted from memory, not from a copy in our references: treat the drawing as a guide. The corners
 * are computed here from (CCT, Duv) with Ohno's inverse (via the colour core), so they may differ
 * from the standard's tabulated corner coordinates in the fourth decimal. A check that they are
 * self-consistent: each quadrangle's upper CCT limit is the next one's lower limit (within 1 K).
 * Later editions keep these quadrangles, give the target Duv to four decimals (e.g. 6532 K,
 * +0.0031 for 6500 K, as the colour core's tests use) and add warmer classes; the 2008 figures are
 * drawn here.
 *
 * References:
 *   ANSI C78.377-2008 Specifications for the Chromaticity of Solid State Lighting Products,
 *     Table 1 (nominal CCT, target CCT and tolerance, target Duv and tolerance), from memory.
 *   Y. Ohno, LEUKOS 10(1), 47–55, 2014 (CCT and Duv to chromaticity), via `planckian.ts`.
 */
import { CCTDuvToXy } from './planckian';
import { planePath, type PlaneScales, type Point } from './cie1931';

export interface NominalQuadrangle {
	/** Nominal CCT, K (the name of the class). */
	nominalK: number;
	targetK: number;
	/** Half-width of the CCT range, K. */
	toleranceK: number;
	targetDuv: number;
	/** Half-width of the Duv range. */
	toleranceDuv: number;
}

/** ANSI C78.377-2008 Table 1 (from memory; see header). */
export const ANSI_C78377_QUADRANGLES: readonly NominalQuadrangle[] = Object.freeze([
	{ nominalK: 2700, targetK: 2725, toleranceK: 145, targetDuv: 0.0, toleranceDuv: 0.006 },
	{ nominalK: 3000, targetK: 3045, toleranceK: 175, targetDuv: 0.0, toleranceDuv: 0.006 },
	{ nominalK: 3500, targetK: 3465, toleranceK: 245, targetDuv: 0.0, toleranceDuv: 0.006 },
	{ nominalK: 4000, targetK: 3985, toleranceK: 275, targetDuv: 0.001, toleranceDuv: 0.006 },
	{ nominalK: 4500, targetK: 4503, toleranceK: 243, targetDuv: 0.001, toleranceDuv: 0.006 },
	{ nominalK: 5000, targetK: 5028, toleranceK: 283, targetDuv: 0.002, toleranceDuv: 0.006 },
	{ nominalK: 5700, targetK: 5665, toleranceK: 355, targetDuv: 0.002, toleranceDuv: 0.006 },
	{ nominalK: 6500, targetK: 6530, toleranceK: 510, targetDuv: 0.003, toleranceDuv: 0.006 }
]);

/**
 * The four corners in CIE 1931 xy, going round: (warm end, low Duv), (warm, high), (cool, high),
 * (cool, low). The warm end is the lower CCT (larger x).
 */
export function quadrangleCorners(q: NominalQuadrangle): Point[] {
	const warm = q.targetK - q.toleranceK;
	const cool = q.targetK + q.toleranceK;
	const lo = q.targetDuv - q.toleranceDuv;
	const hi = q.targetDuv + q.toleranceDuv;
	return [CCTDuvToXy(warm, lo), CCTDuvToXy(warm, hi), CCTDuvToXy(cool, hi), CCTDuvToXy(cool, lo)];
}

/** Whether a chromaticity lies inside a quadrangle (inside the convex polygon of its corners). */
export function insideQuadrangle(p: Point, q: NominalQuadrangle): boolean {
	const c = quadrangleCorners(q);
	let sign = 0;
	for (let i = 0; i < c.length; i++) {
		const a = c[i];
		const b = c[(i + 1) % c.length];
		const cross = (b.x - a.x) * (p.y - a.y) - (b.y - a.y) * (p.x - a.x);
		if (cross === 0) continue;
		const s = Math.sign(cross);
		if (sign === 0) sign = s;
		else if (s !== sign) return false;
	}
	return true;
}

export interface QuadrangleShape {
	nominalK: number;
	/** Closed SVG path in viewBox units. */
	path: string;
	/** Where the label goes: the quadrangle's centre (target CCT and Duv), in viewBox units. */
	label: Point;
	/** Width on screen (viewBox units) between the middles of its warm and cool sides: room for a label. */
	width: number;
}

/** Every quadrangle as a closed path on the chart, with a label position. */
export function quadranglePaths(s: PlaneScales, quadrangles: readonly NominalQuadrangle[] = ANSI_C78377_QUADRANGLES): QuadrangleShape[] {
	return quadrangles.map((q) => {
		const centre = CCTDuvToXy(q.targetK, q.targetDuv);
		const warm = CCTDuvToXy(q.targetK - q.toleranceK, q.targetDuv);
		const cool = CCTDuvToXy(q.targetK + q.toleranceK, q.targetDuv);
		return {
			nominalK: q.nominalK,
			path: planePath(quadrangleCorners(q), s, true),
			label: { x: s.x(centre.x), y: s.y(centre.y) },
			width: Math.hypot(s.x(warm.x) - s.x(cool.x), s.y(warm.y) - s.y(cool.y))
		};
	});
}
