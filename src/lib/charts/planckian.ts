/**
 * Points at a given CCT and Duv for drawing, fast enough to redraw loci, ticks and Duv grids on every
 * zoom. Duv offsets run along the normal to the Planckian locus in CIE 1960 uv, linearly in Duv
 * (u = u₀ − Duv·sin θ, v = v₀ + Duv·cos θ), so one call of the colour core's CCTToUv at Duv 0 and
 * one at Duv 1 give every Duv at that CCT; those two are cached per temperature. The results equal
 * the core's CCTToXy(CCT, Duv) to rounding (checked in the tests).
 *
 * References:
 *   Y. Ohno, "Practical use and calculation of CCT and Duv", LEUKOS 10(1), 47–55, 2014,
 *     doi:10.1080/15502724.2013.839020, §4 (uv from CCT and Duv).
 *   CIE 15:2004 Colorimetry, 3rd ed., §8.1 (CIE 1960 uv ↔ xy).
 */
import { CCTToUv, uv1960ToXy } from '../colour';

interface Frame {
	u: number;
	v: number;
	/** d(u, v)/dDuv: the unit normal, toward positive Duv. */
	nu: number;
	nv: number;
}

const frames = new Map<number, Frame>();
const MAX_FRAMES = 4096;

/** CIE 1960 uv on the locus at CCT (K) and the unit normal toward positive Duv (cached). */
export function planckianFrame(CCT: number): Frame {
	let f = frames.get(CCT);
	if (!f) {
		const a = CCTToUv(CCT, 0);
		const b = CCTToUv(CCT, 1);
		f = { u: a.u, v: a.v, nu: b.u - a.u, nv: b.v - a.v };
		if (frames.size >= MAX_FRAMES) frames.clear();
		frames.set(CCT, f);
	}
	return f;
}

/** CIE 1960 uv at CCT (K) and Duv (Ohno 2014 §4). */
export function CCTDuvToUv(CCT: number, Duv = 0): { u: number; v: number } {
	if (!Number.isFinite(Duv)) throw new RangeError(`Duv must be a finite number, got ${Duv}`);
	const f = planckianFrame(CCT);
	return { u: f.u + Duv * f.nu, v: f.v + Duv * f.nv };
}

/** CIE 1931 xy at CCT (K) and Duv: the same point as the core's CCTToXy, from cached frames. */
export function CCTDuvToXy(CCT: number, Duv = 0): { x: number; y: number } {
	return uv1960ToXy(CCTDuvToUv(CCT, Duv));
}
