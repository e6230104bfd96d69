/**
 * CIE 1995 colour rendering index (CIE 13.3-1995): general index Ra, special indices R1–R14, and
 * R15 from test colour sample 15 (the extra sample colord-data ships beside CIE 13.3's fourteen).
 *
 * Method (CIE 13.3-1995 §5–6):
 *   1. CCT of the test source; reference illuminant at that CCT: Planckian radiator below 5000 K,
 *      CIE daylight (S0, S1, S2) at and above 5000 K.
 *   2. Tristimulus values (CIE 1931 2°) of both sources and of the samples under each, with the
 *      sources normalised to Y = 100.
 *   3. DC, the distance between test and reference in CIE 1960 uv; the method is meant for
 *      DC < 5.4e-3 (we warn at and above).
 *   4. Von Kries adaptation of the samples under the test source to the reference, in CIE 1960 uv
 *      (the c, d coefficients of CIE 13.3 eqs. 5–7).
 *   5. CIE 1964 U*V*W*: W* = 25 Y^(1/3) − 17, U* = 13 W*(u − u_r), V* = 13 W*(v − v_r).
 *   6. ΔEᵢ in U*V*W*, Rᵢ = 100 − 4.6 ΔEᵢ; Ra = mean of R1–R8.
 *
 * Wavelengths: the samples are used over 380–780 nm (sample 15 is only defined there; colord fills
 * the rest with zeros), so all sums here run over 380–780 nm, on the test spectrum's own grid
 * (samples Sprague-interpolated when the grid is not 5 nm).
 * colord-data rounds the samples to 2 decimals (CIE 13.3 prints 3; TCS09 keeps 3): this lowers Ra
 * by up to about 0.4 compared with the full-precision samples. Results are not rounded here.
 *
 * References:
 *   CIE 13.3-1995 Method of measuring and specifying colour rendering properties of light sources.
 *   CIE 15:2004 Colorimetry, 3rd ed. (reference illuminants, §3.1).
 *   JIS Z 8726:1990 (test colour sample 15, Japanese skin tone).
 */
import { DAYLIGHT_S0, DAYLIGHT_S1, DAYLIGHT_S2 } from '../data/daylight';
import { TEST_COLOUR_SAMPLES } from '../data/tcs';
import { linearInterpolate, spragueInterpolate } from '../interpolation';
import { daylightM, daylightXyUnchecked, DAYLIGHT_T_MAX } from '../illuminants/daylight';
import { C2_NM_K } from '../temperature/planckian-locus';
import { gridWeights, spectrumForSummation } from '../tristimulus';
import { xyToUv1960 } from '../chromaticity';
import { ohno2013Core } from '../temperature/ohno2013';
import { validateSpectrum, type Spectrum } from '../spectrum';

export interface CRIResult {
	/** general colour rendering index, mean of R1–R8 */
	Ra: number;
	/** special indices R1…R15 (index 0 is R1) */
	R: number[];
	/** distance test–reference in CIE 1960 uv */
	DC: number;
	/** CCT of the test source, K */
	CCT: number;
	/** which reference illuminant was used */
	reference: 'Planckian' | 'CIE daylight';
	warnings: string[];
}

export const CRI_DC_LIMIT = 5.4e-3;
export const CRI_DAYLIGHT_FROM_K = 5000;
const CRI_RANGE: readonly [number, number] = [380, 780];
const NS = TEST_COLOUR_SAMPLES.length;

/** Per-grid precomputation: index range within 380–780 nm and per-sample weights R·x̄Δλ etc. */
interface CriGrid {
	i0: number;
	i1: number;
	nm: Float64Array;
	wx: Float64Array;
	wy: Float64Array;
	wz: Float64Array;
	/** sample s at offset s·len: R_s·x̄Δλ */
	sx: Float64Array;
	sy: Float64Array;
	sz: Float64Array;
	/** reference-daylight components on the grid */
	S0: Float64Array;
	S1: Float64Array;
	S2: Float64Array;
	/** Planck helpers: λ⁻⁵ (λ in µm) and c2/λ */
	l5: Float64Array;
	c2l: Float64Array;
}

const gridCache = new Map<string, CriGrid>();

function criGrid(start: number, interval: number, n: number): CriGrid {
	const key = `${start}|${interval}|${n}`;
	let g = gridCache.get(key);
	if (g) return g;
	const i0 = Math.max(0, Math.ceil((CRI_RANGE[0] - start) / interval - 1e-9));
	const i1 = Math.min(n - 1, Math.floor((CRI_RANGE[1] - start) / interval + 1e-9));
	const len = i1 - i0 + 1;
	const nm = new Float64Array(len);
	for (let k = 0; k < len; k++) nm[k] = start + (i0 + k) * interval;
	const all = gridWeights('CIE1931_2', start, interval, n);
	const wx = all.x.slice(i0, i1 + 1);
	const wy = all.y.slice(i0, i1 + 1);
	const wz = all.z.slice(i0, i1 + 1);
	const sx = new Float64Array(NS * len);
	const sy = new Float64Array(NS * len);
	const sz = new Float64Array(NS * len);
	for (let s = 0; s < NS; s++) {
		// Trim to 380–780 nm first: colord's zeros outside that range for sample 15 are not data
		// and would bend the interpolation near the ends.
		const t = TEST_COLOUR_SAMPLES[s];
		const a = Math.round((CRI_RANGE[0] - t.start) / t.interval);
		const b = Math.round((CRI_RANGE[1] - t.start) / t.interval);
		const r = spragueInterpolate(t.values.slice(a, b + 1), CRI_RANGE[0], t.interval, nm);
		for (let k = 0; k < len; k++) {
			sx[s * len + k] = r[k] * wx[k];
			sy[s * len + k] = r[k] * wy[k];
			sz[s * len + k] = r[k] * wz[k];
		}
	}
	// Daylight components on the grid, linearly interpolated (CIE 15:2004 §3.1).
	const [S0, S1, S2] = [DAYLIGHT_S0, DAYLIGHT_S1, DAYLIGHT_S2].map((c) => linearInterpolate(c.values, c.start, c.interval, nm));
	const l5 = new Float64Array(len);
	const c2l = new Float64Array(len);
	for (let k = 0; k < len; k++) {
		l5[k] = 1 / Math.pow(nm[k] / 1000, 5);
		c2l[k] = C2_NM_K / nm[k];
	}
	g = { i0, i1, nm, wx, wy, wz, sx, sy, sz, S0, S1, S2, l5, c2l };
	if (gridCache.size > 32) gridCache.delete(gridCache.keys().next().value as string);
	gridCache.set(key, g);
	return g;
}

// Scratch buffers, grown as needed.
let refBuf = new Float64Array(0);
const sampleXYZ = { k: new Float64Array(3 * NS), r: new Float64Array(3 * NS) };

/** CIE 13.3 eq. for c and d in the von Kries transform, from CIE 1960 uv. */
function cOf(u: number, v: number): number {
	return (4 - u - 10 * v) / v;
}
function dOf(u: number, v: number): number {
	return (1.708 * v + 0.404 - 1.481 * u) / v;
}

/**
 * Colour rendering of a spectrum at a known CCT (K); the core of colourRenderingIndex, used by
 * analysis to avoid computing the CCT twice. `s` must be validated and on a grid of ≤ 5 nm.
 */
export function colourRenderingIndexAt(s: Spectrum, CCT: number): CRIResult {
	const warnings: string[] = [];
	const g = criGrid(s.start, s.interval, s.values.length);
	const len = g.i1 - g.i0 + 1;
	if (refBuf.length < len) refBuf = new Float64Array(len);
	const ref = refBuf;
	let reference: CRIResult['reference'];
	if (CCT < CRI_DAYLIGHT_FROM_K) {
		reference = 'Planckian';
		for (let k = 0; k < len; k++) {
			const e = Math.expm1(g.c2l[k] / CCT);
			ref[k] = Number.isFinite(e) ? g.l5[k] / e : 0;
		}
	} else {
		reference = 'CIE daylight';
		if (CCT > DAYLIGHT_T_MAX) {
			warnings.push(`CCT ${Math.round(CCT)} K is above 25000 K, where CIE daylight is defined: the daylight reference was extrapolated`);
		}
		const { M1, M2 } = daylightM(daylightXyUnchecked(CCT));
		for (let k = 0; k < len; k++) ref[k] = g.S0[k] + M1 * g.S1[k] + M2 * g.S2[k];
	}
	const test = s.values;
	const i0 = g.i0;
	// Source white points.
	let Xk = 0, Yk = 0, Zk = 0, Xr = 0, Yr = 0, Zr = 0;
	for (let k = 0; k < len; k++) {
		const t = test[i0 + k];
		const r = ref[k];
		Xk += t * g.wx[k];
		Yk += t * g.wy[k];
		Zk += t * g.wz[k];
		Xr += r * g.wx[k];
		Yr += r * g.wy[k];
		Zr += r * g.wz[k];
	}
	const nk = 100 / Yk;
	const nr = 100 / Yr;
	for (let si = 0; si < NS; si++) {
		const o = si * len;
		let xk = 0, yk = 0, zk = 0, xr = 0, yr = 0, zr = 0;
		for (let k = 0; k < len; k++) {
			const t = test[i0 + k];
			const r = ref[k];
			const a = g.sx[o + k];
			const b = g.sy[o + k];
			const c = g.sz[o + k];
			xk += t * a;
			yk += t * b;
			zk += t * c;
			xr += r * a;
			yr += r * b;
			zr += r * c;
		}
		sampleXYZ.k[3 * si] = xk * nk;
		sampleXYZ.k[3 * si + 1] = yk * nk;
		sampleXYZ.k[3 * si + 2] = zk * nk;
		sampleXYZ.r[3 * si] = xr * nr;
		sampleXYZ.r[3 * si + 1] = yr * nr;
		sampleXYZ.r[3 * si + 2] = zr * nr;
	}
	// CIE 1960 uv of the sources.
	const dk = Xk + 15 * Yk + 3 * Zk;
	const uk = (4 * Xk) / dk;
	const vk = (6 * Yk) / dk;
	const dr = Xr + 15 * Yr + 3 * Zr;
	const ur = (4 * Xr) / dr;
	const vr = (6 * Yr) / dr;
	const DC = Math.hypot(uk - ur, vk - vr);
	if (DC >= CRI_DC_LIMIT) {
		warnings.push(
			`the test source is ${DC.toFixed(4)} from its reference white in CIE 1960 uv (DC ≥ ${CRI_DC_LIMIT}): outside the validity of CIE 13.3, so CRI is not meaningful`
		);
	}
	const ck = cOf(uk, vk);
	const dkv = dOf(uk, vk);
	const cr = cOf(ur, vr);
	const drv = dOf(ur, vr);
	const R: number[] = new Array(NS);
	for (let si = 0; si < NS; si++) {
		// Sample under the test source, von Kries-adapted to the reference (CIE 13.3 §5.5).
		const X = sampleXYZ.k[3 * si];
		const Y = sampleXYZ.k[3 * si + 1];
		const Z = sampleXYZ.k[3 * si + 2];
		const den = X + 15 * Y + 3 * Z;
		const u = (4 * X) / den;
		const v = (6 * Y) / den;
		const cki = (cr / ck) * cOf(u, v);
		const dki = (drv / dkv) * dOf(u, v);
		const q = 16.518 + 1.481 * cki - dki;
		const ua = (10.872 + 0.404 * cki - 4 * dki) / q;
		const va = 5.52 / q;
		// Sample under the reference.
		const Xr2 = sampleXYZ.r[3 * si];
		const Yr2 = sampleXYZ.r[3 * si + 1];
		const Zr2 = sampleXYZ.r[3 * si + 2];
		const den2 = Xr2 + 15 * Yr2 + 3 * Zr2;
		const ur2 = (4 * Xr2) / den2;
		const vr2 = (6 * Yr2) / den2;
		// CIE 1964 U*V*W* (CIE 13.3 §5.6), white (u_r, v_r).
		const Wk = 25 * Math.cbrt(Y) - 17;
		const Wr = 25 * Math.cbrt(Yr2) - 17;
		const dU = 13 * Wk * (ua - ur) - 13 * Wr * (ur2 - ur);
		const dV = 13 * Wk * (va - vr) - 13 * Wr * (vr2 - vr);
		const dW = Wk - Wr;
		R[si] = 100 - 4.6 * Math.sqrt(dU * dU + dV * dV + dW * dW);
	}
	let Ra = 0;
	for (let i = 0; i < 8; i++) Ra += R[i];
	Ra /= 8;
	return { Ra, R, DC, CCT, reference, warnings };
}

/**
 * CIE 13.3-1995 colour rendering index of a light source spectrum (any scale). Returns Ra, R1–R15,
 * DC, the CCT used (K) and warnings (coverage, resampling, DC ≥ 5.4e-3, CCT validity).
 */
export function colourRenderingIndex(s: Spectrum): CRIResult & { warnings: string[] } {
	const v = validateSpectrum(s);
	const { spectrum, note } = spectrumForSummation(v.spectrum);
	const warnings = [...v.warnings];
	if (note) warnings.push(note);
	// CCT from the full-range chromaticity (what a reading shows).
	const w = gridWeights('CIE1931_2', spectrum.start, spectrum.interval, spectrum.values.length);
	let X = 0, Y = 0, Z = 0;
	for (let i = 0; i < spectrum.values.length; i++) {
		X += spectrum.values[i] * w.x[i];
		Y += spectrum.values[i] * w.y[i];
		Z += spectrum.values[i] * w.z[i];
	}
	const uv = xyToUv1960({ x: X / (X + Y + Z), y: Y / (X + Y + Z) });
	const c = { CCT: 0, Duv: 0, outsideTable: false };
	ohno2013Core(uv.u, uv.v, c);
	const r = colourRenderingIndexAt(spectrum, c.CCT);
	return { ...r, warnings: [...warnings, ...r.warnings] };
}
