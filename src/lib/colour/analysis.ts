/**
 * One call per reading: everything Chromaslate shows about a light, from a spectrum or from a
 * chromaticity, with every caveat as a plain-language warning. Used by the analyze CLI, the upload
 * route and the API; results are stored with COMPUTATION_VERSION.
 *
 * From a spectrum: CIE 1931 2° xy and u'v', CCT and Duv (Ohno 2013), mired, illuminance (absolute
 * spectra, lux), CIE 13.3 CRI (Ra, R1–R15) and the Academy SSI.
 * From a chromaticity (xy, u'v', CCT + Duv, or XYZ): the same minus CRI and SSI.
 *
 * References: see tristimulus.ts, temperature/ohno2013.ts, quality/cri.ts, quality/ssi.ts.
 */
import { uv1960ToXy, uvPrimeToXy, xyToUv1960, xyToUvPrime } from './chromaticity';
import { colourRenderingIndexAt } from './quality/cri';
import { spectralSimilarityIndex, ssiAgainstDefault } from './quality/ssi';
import { validateSpectrum, type Spectrum } from './spectrum';
import { CCTToUv } from './temperature/ohno2013';
import { ohno2013Core } from './temperature/ohno2013';
import { cctWarnings } from './temperature/validity';
import { gridWeights, K_M, spectrumForSummation, XYZToXy, type XYZ } from './tristimulus';

/** Bump when any stored result would change. */
export const COMPUTATION_VERSION = 'chromaslate-colour-1.0.0';

export interface ReadingAnalysis {
	x: number;
	y: number;
	u_prime: number;
	v_prime: number;
	cct_k: number | null;
	duv: number | null;
	mired: number | null;
	/** absolute spectra, or given */
	lux: number | null;
	/** spectra only */
	cri: { ra: number; r: number[] } | null;
	/** spectra only */
	ssi: number | null;
	warnings: string[];
}

const cctScratch = { CCT: 0, Duv: 0, outsideTable: false };

function temperatureFields(xy: { x: number; y: number }, warnings: string[]): { cct_k: number | null; duv: number | null; mired: number | null } {
	const uv = xyToUv1960(xy);
	ohno2013Core(uv.u, uv.v, cctScratch);
	const { CCT, Duv, outsideTable } = cctScratch;
	warnings.push(...cctWarnings(CCT, Duv, outsideTable));
	if (outsideTable || !Number.isFinite(CCT) || CCT <= 0) {
		return { cct_k: null, duv: null, mired: null };
	}
	return { cct_k: CCT, duv: Duv, mired: 1e6 / CCT };
}

/**
 * Full analysis of a spectrum (relative, or absolute in W/m²/nm for lux). Options: ssiReference
 * (default: Planckian < 4000 K, else CIE daylight, at the test's CCT); include.cri / include.ssi
 * (default true) to skip an index. Throws SpectrumError for spectra that cannot be analysed.
 */
export function analyzeSpectrum(
	s: Spectrum,
	options: { ssiReference?: Spectrum; include?: { cri?: boolean; ssi?: boolean } } = {}
): ReadingAnalysis {
	const v = validateSpectrum(s);
	const warnings = v.warnings;
	const { spectrum, note } = spectrumForSummation(v.spectrum);
	if (note) warnings.push(`spectrum ${note}`);
	const w = gridWeights('CIE1931_2', spectrum.start, spectrum.interval, spectrum.values.length);
	const vals = spectrum.values;
	let X = 0, Y = 0, Z = 0;
	for (let i = 0; i < vals.length; i++) {
		const p = vals[i];
		X += p * w.x[i];
		Y += p * w.y[i];
		Z += p * w.z[i];
	}
	const xy = XYZToXy({ X, Y, Z });
	const uvp = xyToUvPrime(xy);
	const t = temperatureFields(xy, warnings);
	const lux = s.scale === 'absolute' ? K_M * Y : null;
	let cri: ReadingAnalysis['cri'] = null;
	if (options.include?.cri !== false && t.cct_k !== null) {
		const r = colourRenderingIndexAt(spectrum, t.cct_k);
		warnings.push(...r.warnings.map((m) => `CRI: ${m}`));
		cri = { ra: r.Ra, r: r.R };
	}
	let ssi: number | null = null;
	if (options.include?.ssi !== false) {
		if (options.ssiReference) ssi = spectralSimilarityIndex(spectrum, options.ssiReference);
		else if (t.cct_k !== null) ssi = ssiAgainstDefault(spectrum, t.cct_k);
	}
	return { x: xy.x, y: xy.y, u_prime: uvp.u_prime, v_prime: uvp.v_prime, ...t, lux, cri, ssi, warnings };
}

export type ChromaticityInput =
	| { x: number; y: number }
	| { u_prime: number; v_prime: number }
	| { cct_k: number; duv: number }
	| XYZ;

function finite(...v: unknown[]): boolean {
	return v.every((n) => typeof n === 'number' && Number.isFinite(n));
}

/**
 * Analysis of a reading given as chromaticity (xy, u'v'), as CCT (K) + Duv, or as XYZ (any
 * scale), with an optional illuminance in lux. CRI and SSI need a spectrum and are null.
 * Throws RangeError with a clear message for invalid input.
 */
export function analyzeChromaticity(input: ChromaticityInput, lux: number | null = null): ReadingAnalysis {
	if (lux !== null && lux !== undefined && (!Number.isFinite(lux) || lux < 0)) {
		throw new RangeError(`illuminance must be a non-negative number of lux, got ${lux}`);
	}
	const warnings: string[] = [];
	let xy: { x: number; y: number };
	const i = input as Record<string, unknown>;
	if (!input || typeof input !== 'object') throw new RangeError('give a chromaticity: { x, y }, { u_prime, v_prime }, { cct_k, duv } or { X, Y, Z }');
	if ('x' in i && 'y' in i) {
		if (!finite(i.x, i.y)) throw new RangeError(`x and y must be finite numbers, got (${i.x}, ${i.y})`);
		xy = { x: i.x as number, y: i.y as number };
	} else if ('u_prime' in i && 'v_prime' in i) {
		if (!finite(i.u_prime, i.v_prime)) throw new RangeError(`u' and v' must be finite numbers, got (${i.u_prime}, ${i.v_prime})`);
		if ((i.u_prime as number) < 0 || (i.v_prime as number) <= 0) throw new RangeError(`u'v' (${i.u_prime}, ${i.v_prime}) is not a chromaticity: need u' ≥ 0 and v' > 0`);
		xy = uvPrimeToXy({ u_prime: i.u_prime as number, v_prime: i.v_prime as number });
	} else if ('cct_k' in i && 'duv' in i) {
		if (!finite(i.cct_k, i.duv) || (i.cct_k as number) <= 0) throw new RangeError(`CCT must be a positive number of kelvin and Duv a finite number, got ${i.cct_k} K, ${i.duv}`);
		xy = uv1960ToXy(CCTToUv(i.cct_k as number, i.duv as number));
	} else if ('X' in i && 'Y' in i && 'Z' in i) {
		if (!finite(i.X, i.Y, i.Z)) throw new RangeError(`X, Y and Z must be finite numbers, got (${i.X}, ${i.Y}, ${i.Z})`);
		if ((i.X as number) < 0 || (i.Y as number) <= 0 || (i.Z as number) < 0) throw new RangeError(`XYZ (${i.X}, ${i.Y}, ${i.Z}) is not a light: need X, Z ≥ 0 and Y > 0`);
		xy = XYZToXy(input as XYZ);
	} else {
		throw new RangeError('give a chromaticity: { x, y }, { u_prime, v_prime }, { cct_k, duv } or { X, Y, Z }');
	}
	if (xy.x < 0 || xy.y <= 0 || xy.x + xy.y > 1) {
		throw new RangeError(`chromaticity (${xy.x}, ${xy.y}) is not valid: need x ≥ 0, y > 0 and x + y ≤ 1`);
	}
	const uvp = xyToUvPrime(xy);
	const t = temperatureFields(xy, warnings);
	return { x: xy.x, y: xy.y, u_prime: uvp.u_prime, v_prime: uvp.v_prime, ...t, lux: lux ?? null, cri: null, ssi: null, warnings };
}
