/**
 * CCT and Duv from CIE 1960 uv by Robertson's method: interpolation between isotemperature lines
 * (the normals to the Planckian locus) by the signed distances of the test point from the two
 * lines that bracket it, linearly in reciprocal temperature (mired).
 *
 * Robertson published 31 lines (0–600 mired, reprinted in Wyszecki & Stiles, 1982, Table 1(3.11),
 * whose row at 325 mired has a misprint: u = 0.24702 should read 0.24792). We do not use the
 * printed table: the lines are computed from the same Planckian locus as Ohno's method
 * (planckian-locus.ts), every 1 mired from 1 to 2000 mired (10⁶ K to 500 K), which makes the
 * interpolation error negligible and extends the method below 1667 K. Duv is the signed distance
 * from the locus point at the resulting CCT (positive above the locus, greenish).
 *
 * References:
 *   Robertson, A. R. (1968) Computation of correlated color temperature and distribution
 *     temperature. JOSA 58(11), 1528–1535. doi:10.1364/JOSA.58.001528
 *   Wyszecki, G., Stiles, W. S. (1982) Color Science, 2nd ed., Wiley, §3.11, Table 1(3.11).
 */
import type { Uv } from '../chromaticity';
import type { CCTResult } from './ohno2013';
import { planckianUvAtLnT, planckianUvExact, type LocusPoint } from './planckian-locus';
import { cctWarnings } from './validity';

export interface IsotemperatureLine {
	/** reciprocal megakelvin (mired) */
	mired: number;
	/** CIE 1960 uv of the Planckian radiator at this temperature */
	u: number;
	v: number;
	/** slope dv/du of the isotemperature line (the normal to the locus), as Robertson tabulates it */
	t: number;
	/** unit tangent of the locus towards higher mired (lower T) */
	tu: number;
	tv: number;
}

/**
 * Isotemperature lines at the given mired values, from the locus by direct summation
 * (Robertson 1968, Table 1 layout: mired, u, v, t). Mired 0 is evaluated at 10¹² K.
 */
export function robertsonIsotemperatureLines(mireds: readonly number[]): IsotemperatureLine[] {
	return mireds.map((mired) => {
		if (!(mired >= 0) || !Number.isFinite(mired)) throw new RangeError(`mired must be a non-negative number, got ${mired}`);
		const p = planckianUvExact(mired === 0 ? 1e12 : 1e6 / mired);
		return lineFrom(mired, p);
	});
}

function lineFrom(mired: number, p: LocusPoint): IsotemperatureLine {
	// d/dmired = −(1/mired)·d/dlnT: the direction towards higher mired is −(du, dv).
	const len = Math.hypot(p.du, p.dv);
	const tu = -p.du / len;
	const tv = -p.dv / len;
	return { mired, u: p.u, v: p.v, t: -tu / tv, tu, tv };
}

export const ROBERTSON_MIRED_MIN = 1;
export const ROBERTSON_MIRED_MAX = 2000;

interface Lines {
	M: Float64Array;
	u: Float64Array;
	v: Float64Array;
	tu: Float64Array;
	tv: Float64Array;
}
let dense: Lines | null = null;

function denseLines(): Lines {
	if (!dense) {
		const n = ROBERTSON_MIRED_MAX - ROBERTSON_MIRED_MIN + 1;
		const d: Lines = { M: new Float64Array(n), u: new Float64Array(n), v: new Float64Array(n), tu: new Float64Array(n), tv: new Float64Array(n) };
		const p: LocusPoint = { u: 0, v: 0, du: 0, dv: 0 };
		for (let i = 0; i < n; i++) {
			const M = ROBERTSON_MIRED_MIN + i;
			planckianUvAtLnT(Math.log(1e6 / M), p);
			const l = lineFrom(M, p);
			d.M[i] = M;
			d.u[i] = l.u;
			d.v[i] = l.v;
			d.tu[i] = l.tu;
			d.tv[i] = l.tv;
		}
		dense = d;
	}
	return dense;
}

const locusAt: LocusPoint = { u: 0, v: 0, du: 0, dv: 0 };

/**
 * CCT (K) and Duv from CIE 1960 uv by Robertson's method (Robertson 1968, eq. for interpolation
 * between isotemperature lines: M = Mᵢ + (Mᵢ₊₁ − Mᵢ)·dᵢ/(dᵢ − dᵢ₊₁), dᵢ the signed distance
 * from line i). Valid 1000–20000 K and |Duv| ≤ 0.05; outside, values come with warnings.
 */
export function uvToCCTRobertson1968(uv: Uv): CCTResult {
	if (!uv || !Number.isFinite(uv.u) || !Number.isFinite(uv.v)) {
		throw new RangeError(`uv must be two finite numbers, got (${uv?.u}, ${uv?.v})`);
	}
	if (uv.u <= 0 || uv.v <= 0 || uv.u >= 0.7 || uv.v >= 0.5) {
		throw new RangeError(`uv (${uv.u}, ${uv.v}) is not a chromaticity of a real light (expect 0 < u < 0.7, 0 < v < 0.5)`);
	}
	const L = denseLines();
	const n = L.M.length;
	const d = (i: number) => (uv.u - L.u[i]) * L.tu[i] + (uv.v - L.v[i]) * L.tv[i];
	let lo = 0;
	let hi = n - 1;
	let outside = false;
	let dlo = d(lo);
	let dhi = d(hi);
	if (dlo <= 0) {
		hi = 1;
		outside = dlo < 0;
		dhi = d(hi);
	} else if (dhi >= 0) {
		lo = n - 2;
		outside = dhi > 0;
		dlo = d(lo);
	} else {
		while (hi - lo > 1) {
			const mid = (lo + hi) >> 1;
			const dm = d(mid);
			if (dm > 0) {
				lo = mid;
				dlo = dm;
			} else {
				hi = mid;
				dhi = dm;
			}
		}
	}
	const M = L.M[lo] + ((L.M[hi] - L.M[lo]) * dlo) / (dlo - dhi);
	const CCT = 1e6 / M;
	planckianUvAtLnT(Math.log(CCT), locusAt);
	const Duv = Math.hypot(uv.u - locusAt.u, uv.v - locusAt.v) * Math.sign(uv.v - locusAt.v);
	return { CCT, Duv, warnings: cctWarnings(CCT, Duv, outside) };
}
