/**
 * Shared colorimetric helpers for the solvers: one chromaticity summary (xy, u'v', CCT, Duv,
 * mired) from any input, and per-grid XYZ weights for fast spectral prediction.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §7.1–7.3 (tristimulus summation, chromaticity), §8.1 (u'v').
 *   Y. Ohno, "Practical use and calculation of CCT and Duv", LEUKOS 10(1), 47–55, 2014,
 *   doi:10.1080/15502724.2013.839020 (CCT and Duv, via the colour core's xyToCCT).
 *
 * Units: XYZ on the caller's scale (relative spectra: k = 1); CCT in K; mired = 10⁶/CCT.
 */
import {
	CCTToXy,
	spectrumToXYZ,
	uvPrimeToXy,
	XYZToXy,
	xyToCCT,
	xyToUvPrime,
	type Spectrum,
	type XYZ
} from '../colour';

/** A chromaticity from a reading: xy, u'v', CCT (+ Duv), XYZ, or a spectrum. */
export type ChromaticityInput =
	| { x: number; y: number }
	| { u_prime: number; v_prime: number }
	| { CCT: number; Duv?: number }
	| { X: number; Y: number; Z: number }
	| { spectrum: Spectrum };

export interface ChromaticitySummary {
	x: number;
	y: number;
	u_prime: number;
	v_prime: number;
	/** null where no CCT is meaningful (|Duv| > 0.05, or outside the method's range). */
	CCT: number | null;
	Duv: number | null;
	mired: number | null;
	warnings: string[];
}

/** Beyond this |Duv| a CCT says little about the colour (the ±0.05 limit used with CIE 15:2004 and by Ohno 2014; from memory). */
export const DUV_LIMIT = 0.05;

function finite(...v: number[]): boolean {
	return v.every((a) => typeof a === 'number' && Number.isFinite(a));
}

/** xy of any chromaticity input (throws RangeError on NaN or impossible values). */
export function inputToXy(input: ChromaticityInput): { x: number; y: number } {
	if (!input || typeof input !== 'object') throw new RangeError('A chromaticity is needed: xy, u′v′, CCT + Duv, XYZ or a spectrum.');
	if ('spectrum' in input) return XYZToXy(spectrumToXYZ(input.spectrum));
	if ('X' in input) {
		if (!finite(input.X, input.Y, input.Z)) throw new RangeError('XYZ must be finite numbers.');
		return XYZToXy(input);
	}
	if ('u_prime' in input) {
		if (!finite(input.u_prime, input.v_prime) || input.v_prime <= 0) throw new RangeError('u′v′ must be finite numbers with v′ > 0.');
		return uvPrimeToXy(input);
	}
	if ('CCT' in input) {
		const duv = input.Duv ?? 0;
		if (!finite(input.CCT, duv) || input.CCT <= 0) throw new RangeError('CCT must be a positive number of kelvin and Duv a finite number.');
		return CCTToXy(input.CCT, duv);
	}
	if ('x' in input) {
		if (!finite(input.x, input.y) || input.y <= 0 || input.x < 0 || input.x + input.y > 1) {
			throw new RangeError(`xy (${input.x}, ${input.y}) is not a chromaticity: x ≥ 0, y > 0, x + y ≤ 1.`);
		}
		return { x: input.x, y: input.y };
	}
	throw new RangeError('A chromaticity is needed: xy, u′v′, CCT + Duv, XYZ or a spectrum.');
}

/** xy, u'v', CCT, Duv and mired of a chromaticity (CCT by Ohno 2013 through the colour core). */
export function summariseXy(xy: { x: number; y: number }): ChromaticitySummary {
	const uvp = xyToUvPrime(xy);
	const warnings: string[] = [];
	let CCT: number | null = null;
	let Duv: number | null = null;
	try {
		const t = xyToCCT(xy);
		warnings.push(...t.warnings);
		if (Number.isFinite(t.CCT) && Number.isFinite(t.Duv)) {
			Duv = t.Duv;
			CCT = t.CCT;
			if (Math.abs(t.Duv) > DUV_LIMIT) {
				// The colour core already warns about this; add our own words only if it did not.
				if (!t.warnings.some((w) => /Duv/.test(w))) {
					warnings.push(`Duv ${t.Duv.toFixed(4)} is beyond ±${DUV_LIMIT}: this light is too far from white for a CCT to mean much.`);
				}
				CCT = null;
			}
		}
	} catch (e) {
		warnings.push(`No CCT: ${(e as Error).message}`);
	}
	return { x: xy.x, y: xy.y, u_prime: uvp.u_prime, v_prime: uvp.v_prime, CCT, Duv, mired: CCT ? 1e6 / CCT : null, warnings };
}

export function summarise(input: ChromaticityInput): ChromaticitySummary {
	return summariseXy(inputToXy(input));
}

export function summariseXYZ(c: XYZ): ChromaticitySummary {
	return summariseXy(XYZToXy(c));
}

export interface GridWeights {
	start: number;
	interval: number;
	n: number;
	x: Float64Array;
	y: Float64Array;
	z: Float64Array;
}

const weightCache = new Map<string, GridWeights>();

/**
 * The weights w such that spectrumToXYZ(S) = (Σ S_i wx_i, Σ S_i wy_i, Σ S_i wz_i) for any relative
 * spectrum S on this grid (CIE 15:2004 §7.1 summation is linear in S). Found by passing each unit
 * sample through the colour core, so the fast sums agree with it exactly; cached per grid.
 */
export function xyzWeights(start: number, interval: number, n: number): GridWeights {
	const key = `${start}|${interval}|${n}`;
	const hit = weightCache.get(key);
	if (hit) return hit;
	const w: GridWeights = { start, interval, n, x: new Float64Array(n), y: new Float64Array(n), z: new Float64Array(n) };
	const values = new Float64Array(n);
	const probe: Spectrum = { start, interval, values, scale: 'relative' };
	for (let i = 0; i < n; i++) {
		values.fill(0);
		values[i] = 1;
		let c: XYZ;
		try {
			c = spectrumToXYZ(probe);
		} catch {
			c = { X: 0, Y: 0, Z: 0 }; // a sample outside the observer's range (Y = 0) weighs nothing
		}
		w.x[i] = c.X;
		w.y[i] = c.Y;
		w.z[i] = c.Z;
	}
	if (weightCache.size > 32) weightCache.clear();
	weightCache.set(key, w);
	return w;
}
