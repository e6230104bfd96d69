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
import { validateSpectrum, valueAt, type Spectrum } from '../spectrum';
import { linearInterpolate, wavelengthGrid } from '../interpolation';
import { spectrumToXYZ, XYZToXy } from '../tristimulus';
import { xyToCCT } from '../temperature';

const SSI_START = 375;
const SSI_END = 675;
const BINS = 30;
const WEIGHTS = [12 / 45, 22 / 45, 32 / 45, 40 / 45, 44 / 45, ...new Array(23).fill(1), 11 / 15, 3 / 15];
export const SSI_DAYLIGHT_FROM_K = 4000;

const NM = wavelengthGrid(SSI_START, SSI_END, 1);
let components: Float64Array[] | null = null;

/** 1 nm values 375–675 nm of a spectrum, linear, zero outside its range (step 1). */
function at1nm(s: Spectrum, out: Float64Array): Float64Array {
	for (let i = 0; i < NM.length; i++) out[i] = valueAt(s, NM[i], 'zero');
	return out;
}

/** Step 2–3: 30 trapezoid bins of 10 nm, normalised to sum 1. */
function bins(v: Float64Array, out: Float64Array): Float64Array {
	let total = 0;
	for (let b = 0; b < BINS; b++) {
		let s = 0.5 * (v[10 * b] + v[10 * b + 10]);
		for (let j = 1; j < 10; j++) s += v[10 * b + j];
		out[b] = s;
		total += s;
	}
	for (let b = 0; b < BINS; b++) out[b] = total > 0 ? out[b] / total : 0;
	return out;
}

/** The default SSI reference at CCT (K) on 375–675 nm at 1 nm: Planckian < 4000 K, else CIE daylight. */
export function ssiDefaultReference(CCT: number): Spectrum {
	const values = new Float64Array(NM.length);
	if (CCT < SSI_DAYLIGHT_FROM_K) {
		for (let i = 0; i < NM.length; i++) {
			const e = Math.expm1(C2_NM_K / (NM[i] * CCT));
			values[i] = Number.isFinite(e) ? 1 / (Math.pow(NM[i] / 1000, 5) * e) : 0;
		}
	} else {
		if (!components) components = [DAYLIGHT_S0, DAYLIGHT_S1, DAYLIGHT_S2].map((c) => linearInterpolate(c.values, c.start, c.interval, NM));
		const { M1, M2 } = daylightM(daylightXyUnchecked(CCT));
		for (let i = 0; i < NM.length; i++) values[i] = components[0][i] + M1 * components[1][i] + M2 * components[2][i];
	}
	return { start: SSI_START, interval: 1, values, scale: 'relative' };
}

const bufT = new Float64Array(NM.length);
const bufR = new Float64Array(NM.length);
const binT = new Float64Array(BINS);
const binR = new Float64Array(BINS);

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
	let ref: Spectrum;
	if (reference) ref = validateSpectrum(reference).spectrum;
	else {
		const CCT = options.testCCT ?? xyToCCT(XYZToXy(spectrumToXYZ(t))).CCT;
		ref = ssiDefaultReference(CCT);
	}
	bins(at1nm(t, bufT), binT);
	bins(at1nm(ref, bufR), binR);
	const mean = 1 / BINS;
	// Steps 4–6: relative difference, weights, zero-padded smoothing; then step 7.
	const wdr = new Float64Array(BINS + 2);
	for (let b = 0; b < BINS; b++) wdr[b + 1] = ((binT[b] - binR[b]) / (binR[b] + mean)) * WEIGHTS[b];
	let m = 0;
	for (let i = 0; i < BINS + 2; i++) {
		const c = 0.22 * (i > 0 ? wdr[i - 1] : 0) + 0.56 * wdr[i] + 0.22 * (i < BINS + 1 ? wdr[i + 1] : 0);
		m += c * c;
	}
	const ssi = 100 - 32 * Math.sqrt(m);
	return options.round === false ? ssi : Math.round(ssi);
}
