/**
 * Spectral Similarity Index (SSI) of the Academy of Motion Picture Arts and Sciences (2020): how
 * closely a test spectrum follows a reference spectrum, on a 0–100 scale (100 = identical shape).
 *
 * Procedure (Academy SSI overview, 2020):
 *   1. Both spectra linearly interpolated to 1 nm over 375–675 nm (zero outside their data).
 *   2. Integrated into 30 bins 10 nm wide, centred 380…670 nm (trapezoid: half weight at each edge).
 *   3. Each normalised to sum 1.
 *   4. Relative difference per bin, with an offset: (tᵢ − rᵢ) / (rᵢ + mean(r)).
 *   5. Weighted to de-emphasise the ends: 12/45, 22/45, 32/45, 40/45, 44/45, 1 × 23, 11/15, 3/15.
 *   6. Padded with a zero at each end and smoothed with the kernel (0.22, 0.56, 0.22).
 *   7. SSI = 100 − 32·√(Σ cᵢ²), rounded to an integer.
 * Default reference: a Planckian radiator below 4000 K, CIE daylight at and above, at the test's CCT.
 *
 * References:
 *   The Academy of Motion Picture Arts and Sciences (2020) Academy Spectral Similarity Index (SSI):
 *     Overview. Science and Technology Council, 2020-09-16.
 *   Holm, J. et al. (2016) A cinematographic spectral similarity index.
 *     SMPTE 2016 Annual Technical Conference and Exhibition.
 *   colour-science (Mansencal, T. et al.) colour/quality/ssi.py, consulted for the bin layout.
 */
import { DAYLIGHT_S0, DAYLIGHT_S1, DAYLIGHT_S2 } from '../data/daylight';
import { daylightM, daylightXyUnchecked } from '../illuminants/daylight';
import { C2_NM_K } from '../temperature/planckian-locus';
import { validateSpectrum, type Spectrum } from '../spectrum';
import { linearInterpolate, wavelengthGrid } from '../interpolation';
import { spectrumToXYZ, XYZToXy } from '../tristimulus';
import { xyToCCT } from '../temperature';

const SSI_START = 375;
const SSI_END = 675;
const BINS = 30;
const WEIGHTS = [12 / 45, 22 / 45, 32 / 45, 40 / 45, 44 / 45, ...new Array(23).fill(1), 11 / 15, 3 / 15];
export const SSI_DAYLIGHT_FROM_K = 4000;

const NM = wavelengthGrid(SSI_START, SSI_END, 1);
const C2L = NM.map((nm) => C2_NM_K / nm);
const L5 = NM.map((nm) => 1 / Math.pow(nm / 1000, 5));

/** Step 2: 30 trapezoid bins of 10 nm from 1 nm values 375–675 nm. */
function binsOf1nm(v: ArrayLike<number>, out: Float64Array): Float64Array {
	for (let b = 0; b < BINS; b++) {
		let s = 0.5 * (v[10 * b] + v[10 * b + 10]);
		for (let j = 1; j < 10; j++) s += v[10 * b + j];
		out[b] = s;
	}
	return out;
}

/** Step 3: normalise to sum 1 (all zero stays zero). */
function normalise(b: Float64Array): Float64Array {
	let total = 0;
	for (let i = 0; i < BINS; i++) total += b[i];
	if (total > 0) for (let i = 0; i < BINS; i++) b[i] /= total;
	return b;
}

/**
 * Steps 1–2 as one linear map per spectral grid: bin b = Σᵢ W[b][i]·Sᵢ, where W combines the
 * linear interpolation to 1 nm (zero outside the data) with the trapezoid bins. Cached per grid.
 */
interface BinMap {
	first: Int32Array;
	count: Int32Array;
	weights: Float64Array[];
}
const binMaps = new Map<string, BinMap>();

function binMap(start: number, interval: number, n: number): BinMap {
	const key = `${start}|${interval}|${n}`;
	let m = binMaps.get(key);
	if (m) return m;
	const first = new Int32Array(BINS);
	const count = new Int32Array(BINS);
	const weights: Float64Array[] = [];
	const dense = new Float64Array(n);
	for (let b = 0; b < BINS; b++) {
		dense.fill(0);
		for (let j = 0; j <= 10; j++) {
			const w = j === 0 || j === 10 ? 0.5 : 1;
			const f = (NM[10 * b + j] - start) / interval;
			if (f < -1e-9 || f > n - 1 + 1e-9) continue;
			const i = Math.min(Math.floor(f + 1e-9), n - 1);
			const x = f - i;
			if (i >= n - 1 || x < 1e-9) dense[i] += w;
			else {
				dense[i] += w * (1 - x);
				dense[i + 1] += w * x;
			}
		}
		let lo = n;
		let hi = -1;
		for (let i = 0; i < n; i++) {
			if (dense[i] !== 0) {
				if (i < lo) lo = i;
				hi = i;
			}
		}
		if (hi < 0) {
			first[b] = 0;
			count[b] = 0;
			weights.push(new Float64Array(0));
		} else {
			first[b] = lo;
			count[b] = hi - lo + 1;
			weights.push(dense.slice(lo, hi + 1));
		}
	}
	m = { first, count, weights };
	if (binMaps.size > 32) binMaps.delete(binMaps.keys().next().value as string);
	binMaps.set(key, m);
	return m;
}

function binsOf(s: Spectrum, out: Float64Array): Float64Array {
	const m = binMap(s.start, s.interval, s.values.length);
	const v = s.values;
	for (let b = 0; b < BINS; b++) {
		const w = m.weights[b];
		const o = m.first[b];
		let sum = 0;
		for (let k = 0; k < w.length; k++) sum += w[k] * v[o + k];
		out[b] = sum;
	}
	return out;
}

// Default references, precomputed: daylight bins are linear in M1, M2 (exact); Planckian bins
// (normalised) are tabulated against ln T, 500–4000 K at 1 % steps, with analytic derivatives
// and read by cubic Hermite interpolation (SSI within 1e-7 of direct evaluation; tested).
let dayBins: Float64Array[] | null = null;
const P_LNT0 = Math.log(500);
const P_H = 0.01;
let planckBins: { n: number; q: Float64Array; dq: Float64Array } | null = null;

function daylightBins(): Float64Array[] {
	if (!dayBins) {
		dayBins = [DAYLIGHT_S0, DAYLIGHT_S1, DAYLIGHT_S2].map((c) => binsOf1nm(linearInterpolate(c.values, c.start, c.interval, NM), new Float64Array(BINS)));
	}
	return dayBins;
}

function planckBinTable(): { n: number; q: Float64Array; dq: Float64Array } {
	if (!planckBins) {
		const n = Math.ceil((Math.log(SSI_DAYLIGHT_FROM_K) - P_LNT0) / P_H) + 2;
		const q = new Float64Array(n * BINS);
		const dq = new Float64Array(n * BINS);
		const M = new Float64Array(NM.length);
		const dM = new Float64Array(NM.length);
		const B = new Float64Array(BINS);
		const dB = new Float64Array(BINS);
		for (let i = 0; i < n; i++) {
			const T = Math.exp(P_LNT0 + i * P_H);
			for (let k = 0; k < NM.length; k++) {
				const x = C2L[k] / T;
				const e = 1 / Math.expm1(x);
				M[k] = L5[k] * e;
				dM[k] = M[k] * x * (1 + e);
			}
			binsOf1nm(M, B);
			binsOf1nm(dM, dB);
			let S = 0;
			let dS = 0;
			for (let b = 0; b < BINS; b++) {
				S += B[b];
				dS += dB[b];
			}
			for (let b = 0; b < BINS; b++) {
				q[i * BINS + b] = B[b] / S;
				dq[i * BINS + b] = (dB[b] * S - B[b] * dS) / (S * S);
			}
		}
		planckBins = { n, q, dq };
	}
	return planckBins;
}

/** Normalised bins of the default reference at CCT (steps 1–3), fast path unless direct. */
function defaultReferenceBins(CCT: number, out: Float64Array, direct = false): Float64Array {
	if (CCT >= SSI_DAYLIGHT_FROM_K) {
		const d = daylightBins();
		const { M1, M2 } = daylightM(daylightXyUnchecked(CCT));
		for (let b = 0; b < BINS; b++) out[b] = d[0][b] + M1 * d[1][b] + M2 * d[2][b];
		return normalise(out);
	}
	const f = (Math.log(CCT) - P_LNT0) / P_H;
	if (direct || f < 0) return normalise(binsOf1nm(ssiDefaultReference(CCT).values, out));
	const P = planckBinTable();
	let i = Math.floor(f);
	if (i > P.n - 2) i = P.n - 2;
	const s = f - i;
	const s2 = s * s;
	const s3 = s2 * s;
	const h00 = 2 * s3 - 3 * s2 + 1;
	const h10 = (s3 - 2 * s2 + s) * P_H;
	const h01 = -2 * s3 + 3 * s2;
	const h11 = (s3 - s2) * P_H;
	const a = i * BINS;
	const c = a + BINS;
	for (let b = 0; b < BINS; b++) out[b] = h00 * P.q[a + b] + h10 * P.dq[a + b] + h01 * P.q[c + b] + h11 * P.dq[c + b];
	return out;
}

/** The default SSI reference at CCT (K) on 375–675 nm at 1 nm: Planckian < 4000 K, else CIE daylight. */
export function ssiDefaultReference(CCT: number): Spectrum {
	if (!Number.isFinite(CCT) || CCT <= 0) throw new RangeError(`CCT must be a positive number of kelvin, got ${CCT}`);
	const values = new Float64Array(NM.length);
	if (CCT < SSI_DAYLIGHT_FROM_K) {
		for (let i = 0; i < NM.length; i++) {
			const e = Math.expm1(C2L[i] / CCT);
			values[i] = Number.isFinite(e) ? L5[i] / e : 0;
		}
	} else {
		const c = [DAYLIGHT_S0, DAYLIGHT_S1, DAYLIGHT_S2].map((t) => linearInterpolate(t.values, t.start, t.interval, NM));
		const { M1, M2 } = daylightM(daylightXyUnchecked(CCT));
		for (let i = 0; i < NM.length; i++) values[i] = c[0][i] + M1 * c[1][i] + M2 * c[2][i];
	}
	return { start: SSI_START, interval: 1, values, scale: 'relative' };
}

const binT = new Float64Array(BINS);
const binR = new Float64Array(BINS);
const wdr = new Float64Array(BINS + 2);

/** Steps 4–7 on normalised bins. */
function ssiFromBins(t: Float64Array, r: Float64Array): number {
	const mean = 1 / BINS;
	wdr[0] = 0;
	wdr[BINS + 1] = 0;
	for (let b = 0; b < BINS; b++) wdr[b + 1] = ((t[b] - r[b]) / (r[b] + mean)) * WEIGHTS[b];
	let m = 0;
	for (let i = 0; i < BINS + 2; i++) {
		const c = 0.22 * (i > 0 ? wdr[i - 1] : 0) + 0.56 * wdr[i] + 0.22 * (i < BINS + 1 ? wdr[i + 1] : 0);
		m += c * c;
	}
	return 100 - 32 * Math.sqrt(m);
}

/** SSI of an already validated spectrum against the default reference at CCT (analysis hot path). */
export function ssiAgainstDefault(test: Spectrum, CCT: number, options: { round?: boolean; direct?: boolean } = {}): number {
	normalise(binsOf(test, binT));
	defaultReferenceBins(CCT, binR, options.direct);
	const ssi = ssiFromBins(binT, binR);
	return options.round === false ? ssi : Math.round(ssi);
}

/**
 * Academy SSI of `test` against `reference` (default: Planckian < 4000 K, else CIE daylight, at the
 * test's CCT). Both spectra on any scale. Returns an integer unless options.round is false.
 * `testCCT` (K) may be given to skip recomputing it.
 */
export function spectralSimilarityIndex(
	test: Spectrum,
	reference?: Spectrum,
	options: { round?: boolean; testCCT?: number } = {}
): number {
	const t = validateSpectrum(test).spectrum;
	if (!reference) {
		const CCT = options.testCCT ?? xyToCCT(XYZToXy(spectrumToXYZ(t))).CCT;
		return ssiAgainstDefault(t, CCT, { round: options.round });
	}
	const ref = validateSpectrum(reference).spectrum;
	normalise(binsOf(t, binT));
	normalise(binsOf(ref, binR));
	const ssi = ssiFromBins(binT, binR);
	return options.round === false ? ssi : Math.round(ssi);
}
