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
 * Speed: the reference side is precomputed per spectral grid. Under CIE daylight the sample and
 * white tristimulus values are exactly linear in M1 and M2, so three sets of sums (S0, S1, S2) are
 * kept. Under a Planckian reference they are tabulated against ln T (500–5000 K, 1 % steps,
 * with analytic derivatives) and read by cubic Hermite interpolation, which matches direct
 * summation within 1e-6 in every index (tests compare both; `direct: true` forces summation).
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
import { daylightM, daylightSpectrum, daylightXyUnchecked, DAYLIGHT_T_MAX } from '../illuminants/daylight';
import { planckianSpectrum } from '../illuminants/planckian';
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

/**
 * The reference illuminant CIE 13.3 §5.3 compares a light of this CCT (K) with, as a spectrum: a
 * Planckian radiator below 5000 K, CIE daylight from 5000 K up to 25 000 K (where the daylight
 * series ends); null for any other CCT. For drawing beside a reading (380–780 nm at 5 nm unless asked).
 */
export function criReferenceSpectrum(CCT: number, start = 380, end = 780, interval = 5): { spectrum: Spectrum; kind: 'Planckian' | 'CIE daylight' } | null {
	if (!Number.isFinite(CCT) || CCT <= 0 || CCT > DAYLIGHT_T_MAX) return null;
	return CCT < CRI_DAYLIGHT_FROM_K
		? { spectrum: planckianSpectrum(CCT, start, end, interval), kind: 'Planckian' }
		: { spectrum: daylightSpectrum(CCT, start, end, interval), kind: 'CIE daylight' };
}
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
	/** sums for S0, S1, S2: [white X, Y, Z, then X, Y, Z of each sample] (48 values each) */
	D0: Float64Array;
	D1: Float64Array;
	D2: Float64Array;
	/** Planckian table: per node, the 48 sums divided by the white's Y, and their d/dlnT */
	planck: { lnT0: number; h: number; n: number; q: Float64Array; dq: Float64Array } | null;
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
	g = { i0, i1, nm, wx, wy, wz, sx, sy, sz, S0, S1, S2, l5, c2l, D0: new Float64Array(NV), D1: new Float64Array(NV), D2: new Float64Array(NV), planck: null };
	sums48(g, S0, g.D0);
	sums48(g, S1, g.D1);
	sums48(g, S2, g.D2);
	if (gridCache.size > 32) gridCache.delete(gridCache.keys().next().value as string);
	gridCache.set(key, g);
	return g;
}

/** Number of reference-side values: white XYZ and 15 samples × XYZ. */
const NV = 3 + 3 * NS;
const PLANCK_LNT_MIN = Math.log(500);
const PLANCK_LNT_STEP = 0.01;

/** White and sample sums Σ S·x̄Δλ, Σ S·R·x̄Δλ… of a spectrum on the grid (values from the grid's first wavelength ≥ 380 nm). */
function sums48(g: CriGrid, S: Float64Array, out: Float64Array): void {
	const len = g.i1 - g.i0 + 1;
	const wx = g.wx;
	const wy = g.wy;
	const wz = g.wz;
	const sx = g.sx;
	const sy = g.sy;
	const sz = g.sz;
	let X = 0, Y = 0, Z = 0;
	for (let k = 0; k < len; k++) {
		const v = S[k];
		X += v * wx[k];
		Y += v * wy[k];
		Z += v * wz[k];
	}
	out[0] = X;
	out[1] = Y;
	out[2] = Z;
	for (let s = 0; s < NS; s++) {
		const o = s * len;
		let x = 0, y = 0, z = 0;
		for (let k = 0; k < len; k++) {
			const v = S[k];
			x += v * sx[o + k];
			y += v * sy[o + k];
			z += v * sz[o + k];
		}
		out[3 + 3 * s] = x;
		out[4 + 3 * s] = y;
		out[5 + 3 * s] = z;
	}
}

/** Planckian table for one grid, built on first use: q = sums / Y_white and dq/dlnT at each node. */
function planckTable(g: CriGrid): NonNullable<CriGrid['planck']> {
	if (g.planck) return g.planck;
	const len = g.i1 - g.i0 + 1;
	const n = Math.ceil((Math.log(CRI_DAYLIGHT_FROM_K) - PLANCK_LNT_MIN) / PLANCK_LNT_STEP) + 2;
	const q = new Float64Array(n * NV);
	const dq = new Float64Array(n * NV);
	const M = new Float64Array(len);
	const dM = new Float64Array(len);
	const a = new Float64Array(NV);
	const da = new Float64Array(NV);
	for (let i = 0; i < n; i++) {
		const T = Math.exp(PLANCK_LNT_MIN + i * PLANCK_LNT_STEP);
		for (let k = 0; k < len; k++) {
			const x = g.c2l[k] / T;
			const m = 1 / Math.expm1(x);
			M[k] = g.l5[k] * m;
			dM[k] = M[k] * x * (1 + m); // d/dlnT of λ⁻⁵/(eˣ − 1)
		}
		sums48(g, M, a);
		sums48(g, dM, da);
		const Y = a[1];
		const dY = da[1];
		for (let j = 0; j < NV; j++) {
			q[i * NV + j] = a[j] / Y;
			dq[i * NV + j] = (da[j] * Y - a[j] * dY) / (Y * Y);
		}
	}
	g.planck = { lnT0: PLANCK_LNT_MIN, h: PLANCK_LNT_STEP, n, q, dq };
	return g.planck;
}

/**
 * Reference-side sums for the reference illuminant at CCT, scaled so that only ratios matter:
 * out[1] (white Y) may be any positive number. Planckian below 5000 K, CIE daylight at and above.
 */
function referenceSums(g: CriGrid, CCT: number, out: Float64Array, direct: boolean): void {
	if (CCT >= CRI_DAYLIGHT_FROM_K) {
		const { M1, M2 } = daylightM(daylightXyUnchecked(CCT));
		if (direct) {
			const len = g.i1 - g.i0 + 1;
			const S = new Float64Array(len);
			for (let k = 0; k < len; k++) S[k] = g.S0[k] + M1 * g.S1[k] + M2 * g.S2[k];
			sums48(g, S, out);
			return;
		}
		for (let j = 0; j < NV; j++) out[j] = g.D0[j] + M1 * g.D1[j] + M2 * g.D2[j];
		return;
	}
	const lnT = Math.log(CCT);
	const f = (lnT - PLANCK_LNT_MIN) / PLANCK_LNT_STEP;
	// Very fine grids (> 1000 points in 380–780 nm) sum directly: a table would cost more to build.
	if (direct || f < 0 || g.i1 - g.i0 + 1 > 1000) {
		const len = g.i1 - g.i0 + 1;
		const S = new Float64Array(len);
		for (let k = 0; k < len; k++) {
			const e = Math.expm1(g.c2l[k] / CCT);
			S[k] = Number.isFinite(e) ? g.l5[k] / e : 0;
		}
		sums48(g, S, out);
		return;
	}
	const P = planckTable(g);
	let i = Math.floor(f);
	if (i > P.n - 2) i = P.n - 2;
	const s = f - i;
	const s2 = s * s;
	const s3 = s2 * s;
	const h00 = 2 * s3 - 3 * s2 + 1;
	const h10 = (s3 - 2 * s2 + s) * P.h;
	const h01 = -2 * s3 + 3 * s2;
	const h11 = (s3 - s2) * P.h;
	const a = i * NV;
	const b = a + NV;
	const q = P.q;
	const dq = P.dq;
	for (let j = 0; j < NV; j++) out[j] = h00 * q[a + j] + h10 * dq[a + j] + h01 * q[b + j] + h11 * dq[b + j];
}

const refSums = new Float64Array(NV);

// Scratch buffers.
const sampleK = new Float64Array(3 * NS);
const sampleR = new Float64Array(3 * NS);

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
export function colourRenderingIndexAt(s: Spectrum, CCT: number, options: { direct?: boolean } = {}): CRIResult {
	const warnings: string[] = [];
	const g = criGrid(s.start, s.interval, s.values.length);
	const len = g.i1 - g.i0 + 1;
	const reference: CRIResult['reference'] = CCT < CRI_DAYLIGHT_FROM_K ? 'Planckian' : 'CIE daylight';
	if (CCT > DAYLIGHT_T_MAX) {
		warnings.push(`CCT ${Math.round(CCT)} K is above 25000 K, where CIE daylight is defined: the daylight reference was extrapolated`);
	}
	referenceSums(g, CCT, refSums, options.direct === true);
	const test = s.values;
	const i0 = g.i0;
	const wx = g.wx;
	const wy = g.wy;
	const wz = g.wz;
	const sx = g.sx;
	const sy = g.sy;
	const sz = g.sz;
	// Test source white point.
	let Xk = 0, Yk = 0, Zk = 0;
	for (let k = 0; k < len; k++) {
		const t = test[i0 + k];
		Xk += t * wx[k];
		Yk += t * wy[k];
		Zk += t * wz[k];
	}
	const Xr = refSums[0];
	const Yr = refSums[1];
	const Zr = refSums[2];
	const nk = 100 / Yk;
	const nr = 100 / Yr;
	const kX = sampleK;
	const rX = sampleR;
	for (let si = 0; si < NS; si++) {
		const o = si * len;
		let xk = 0, yk = 0, zk = 0;
		for (let k = 0; k < len; k++) {
			const t = test[i0 + k];
			xk += t * sx[o + k];
			yk += t * sy[o + k];
			zk += t * sz[o + k];
		}
		kX[3 * si] = xk * nk;
		kX[3 * si + 1] = yk * nk;
		kX[3 * si + 2] = zk * nk;
		rX[3 * si] = refSums[3 + 3 * si] * nr;
		rX[3 * si + 1] = refSums[4 + 3 * si] * nr;
		rX[3 * si + 2] = refSums[5 + 3 * si] * nr;
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
		const X = sampleK[3 * si];
		const Y = sampleK[3 * si + 1];
		const Z = sampleK[3 * si + 2];
		const den = X + 15 * Y + 3 * Z;
		const u = (4 * X) / den;
		const v = (6 * Y) / den;
		const cki = (cr / ck) * cOf(u, v);
		const dki = (drv / dkv) * dOf(u, v);
		const q = 16.518 + 1.481 * cki - dki;
		const ua = (10.872 + 0.404 * cki - 4 * dki) / q;
		const va = 5.52 / q;
		// Sample under the reference.
		const Xr2 = sampleR[3 * si];
		const Yr2 = sampleR[3 * si + 1];
		const Zr2 = sampleR[3 * si + 2];
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
