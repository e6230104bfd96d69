/**
 * Target white: what a setup aims for, resolved to one chromaticity with its CCT, Duv and mired,
 * and the distance of a reading from it.
 *
 * A target is a stored reading (its spectrum or xy), a CCT with Duv, xy, u'v', a CIE illuminant,
 * or the average of several readings. Averages are taken in CIE 1976 u'v' by default: each
 * reading counts once whatever its illuminance (meters read at different distances), and u'v' is
 * the near-uniform space the distance is measured in, so the average sits in the middle of the
 * readings as the eye sees them. The alternative, 'XYZ', averages tristimulus values normalised to
 * Y = 1, which is the chromaticity of an additive mixture of the lights at equal luminance (what
 * overlapping sources would produce); it differs from the u'v' mean by under 10⁻⁴ for whites a
 * few hundred kelvin apart and by about 0.001 for 3200 K with 5600 K (regression).
 *
 * The default tolerance, Δu'v' ≤ 0.002, is a trade rule of thumb for a mismatch that becomes
 * visible side by side (common practice); a production can set its own.
 *
 * References:
 *   CIE 15:2004 Colorimetry, 3rd ed., §8.1 (CIE 1976 UCS, u'v').
 *   Y. Ohno, "Practical use and calculation of CCT and Duv", LEUKOS 10(1), 47–55, 2014,
 *   doi:10.1080/15502724.2013.839020 (Duv > 0 above the Planckian locus).
 */
import { cieIlluminant, deltaUvPrime, spectrumToXYZ, XYZToXy, xyToUvPrime, uvPrimeToXy, type Spectrum } from '../colour';
import { inputToXy, summariseXy, type ChromaticityInput, type ChromaticitySummary } from './chromaticity';

/** Default target tolerance in Δu'v' (common practice: visible side by side). */
export const DEFAULT_TOLERANCE_DUV_PRIME = 0.002;

export type IlluminantName = Parameters<typeof cieIlluminant>[0];

export type TargetSpec =
	| { kind: 'reading'; label?: string; spectrum?: Spectrum; x?: number; y?: number }
	| { kind: 'cct'; label?: string; CCT: number; Duv?: number }
	| { kind: 'xy'; label?: string; x: number; y: number }
	| { kind: 'uvPrime'; label?: string; u_prime: number; v_prime: number }
	| { kind: 'illuminant'; label?: string; name: IlluminantName }
	| { kind: 'average'; label?: string; readings: ChromaticityInput[]; space?: 'uvPrime' | 'XYZ' };

export interface TargetWhite extends ChromaticitySummary {
	resolved: true;
	kind: TargetSpec['kind'];
	label: string;
	/** Δu'v' within which a light counts as matched. */
	tolerance: number;
	/** The target's spectrum where it has one (a reading with a spectrum, an illuminant). */
	spectrum: Spectrum | null;
}

export interface TargetOptions {
	tolerance?: number;
}

function checkTolerance(t: number): number {
	if (!Number.isFinite(t) || t <= 0 || t > 0.1) throw new RangeError(`Tolerance must be a Δu′v′ above 0 and at most 0.1, got ${t}.`);
	return t;
}

function averageXy(readings: ChromaticityInput[], space: 'uvPrime' | 'XYZ'): { x: number; y: number } {
	if (!Array.isArray(readings) || readings.length === 0) throw new RangeError('An average target needs at least one reading.');
	const xys = readings.map(inputToXy);
	if (space === 'XYZ') {
		// Each reading normalised to Y = 1: X = x/y, Z = (1 − x − y)/y.
		let X = 0;
		let Z = 0;
		for (const c of xys) {
			X += c.x / c.y;
			Z += (1 - c.x - c.y) / c.y;
		}
		const n = xys.length;
		return XYZToXy({ X: X / n, Y: 1, Z: Z / n });
	}
	let u = 0;
	let v = 0;
	for (const c of xys) {
		const p = xyToUvPrime(c);
		u += p.u_prime;
		v += p.v_prime;
	}
	return uvPrimeToXy({ u_prime: u / xys.length, v_prime: v / xys.length });
}

/** Resolve a target description to one chromaticity with CCT, Duv, mired and tolerance. */
export function resolveTargetWhite(spec: TargetSpec, options: TargetOptions = {}): TargetWhite {
	const tolerance = checkTolerance(options.tolerance ?? DEFAULT_TOLERANCE_DUV_PRIME);
	let xy: { x: number; y: number };
	let spectrum: Spectrum | null = null;
	let label: string;
	switch (spec?.kind) {
		case 'reading':
			if (spec.spectrum) {
				spectrum = spec.spectrum;
				xy = XYZToXy(spectrumToXYZ(spec.spectrum));
			} else if (spec.x !== undefined && spec.y !== undefined) {
				xy = inputToXy({ x: spec.x, y: spec.y });
			} else {
				throw new RangeError('A reading target needs its spectrum or its xy.');
			}
			label = spec.label ?? 'reading';
			break;
		case 'cct':
			xy = inputToXy({ CCT: spec.CCT, Duv: spec.Duv ?? 0 });
			label = spec.label ?? `${Math.round(spec.CCT)} K${spec.Duv ? `, Duv ${spec.Duv >= 0 ? '+' : ''}${spec.Duv.toFixed(4)}` : ''}`;
			break;
		case 'xy':
			xy = inputToXy({ x: spec.x, y: spec.y });
			label = spec.label ?? `x ${spec.x.toFixed(4)}, y ${spec.y.toFixed(4)}`;
			break;
		case 'uvPrime':
			xy = inputToXy({ u_prime: spec.u_prime, v_prime: spec.v_prime });
			label = spec.label ?? `u′ ${spec.u_prime.toFixed(4)}, v′ ${spec.v_prime.toFixed(4)}`;
			break;
		case 'illuminant':
			spectrum = cieIlluminant(spec.name);
			xy = XYZToXy(spectrumToXYZ(spectrum));
			label = spec.label ?? `CIE illuminant ${spec.name}`;
			break;
		case 'average': {
			const space = spec.space ?? 'uvPrime';
			if (space !== 'uvPrime' && space !== 'XYZ') throw new RangeError(`Average space must be 'uvPrime' or 'XYZ', got ${String(space)}.`);
			xy = averageXy(spec.readings, space);
			label = spec.label ?? `average of ${spec.readings.length} readings (${space === 'uvPrime' ? 'u′v′' : 'XYZ'})`;
			break;
		}
		default:
			throw new RangeError(`Unknown target kind ${String((spec as { kind?: unknown })?.kind)}.`);
	}
	return { resolved: true, kind: spec.kind, label, tolerance, spectrum, ...summariseXy(xy) };
}

export function isTargetWhite(t: unknown): t is TargetWhite {
	return typeof t === 'object' && t !== null && (t as TargetWhite).resolved === true;
}

export interface Distance {
	/** Δu'v' between reading and target (CIE 1976 UCS Euclidean distance). */
	duv_prime: number;
	/** Mired shift the reading needs to reach the target: M_target − M_reading (> 0: warmer, CTO; < 0: cooler, CTB). null without CCTs. */
	mired: number | null;
	/** Duv the reading needs to gain: Duv_target − Duv_reading (> 0: toward green, plus green; < 0: minus green). null without CCTs. */
	dDuv: number | null;
	/** duv_prime ≤ target tolerance. */
	within: boolean;
}

/** The distance of a reading from the target (see Distance for signs). */
export function distance(reading: ChromaticityInput | ChromaticitySummary, target: TargetWhite): Distance {
	const r = 'u_prime' in reading && 'mired' in reading ? (reading as ChromaticitySummary) : summariseXy(inputToXy(reading));
	const duv_prime = deltaUvPrime(r, target);
	return {
		duv_prime,
		mired: r.mired !== null && target.mired !== null ? target.mired - r.mired : null,
		// Without a CCT (far from the locus) a Duv difference is no guide to a green/magenta fix.
		dDuv: r.Duv !== null && target.Duv !== null && r.CCT !== null && target.CCT !== null ? target.Duv - r.Duv : null,
		within: duv_prime <= target.tolerance
	};
}
