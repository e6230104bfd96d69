/**
 * Correlated colour temperature, Duv and mired: the public surface of the temperature folder, with
 * a small registry of CCT methods.
 *
 * References: see ohno2013.ts, robertson1968.ts, planckian-locus.ts, mired.ts.
 */
import { uv1960ToXy, xyToUv1960, type Uv, type Xy } from '../chromaticity';
import { CCTToUv, uvToCCTOhno2013, type CCTResult } from './ohno2013';
import { uvToCCTRobertson1968 } from './robertson1968';

export { CCTToUv, uvToCCTOhno2013, type CCTResult } from './ohno2013';
export { uvToCCTRobertson1968, robertsonIsotemperatureLines, type IsotemperatureLine } from './robertson1968';
export { kelvinToMired, miredToKelvin, miredShift, deltaDuv } from './mired';
export { planckianUv, planckianUvExact, C2_NM_K } from './planckian-locus';
export { CCT_VALID_MIN_K, CCT_VALID_MAX_K, DUV_VALID_MAX } from './validity';

export type CCTMethod = 'Ohno 2013' | 'Robertson 1968';

export const CCT_METHODS: Record<CCTMethod, (uv: Uv) => CCTResult> = {
	'Ohno 2013': uvToCCTOhno2013,
	'Robertson 1968': uvToCCTRobertson1968
};

/** CCT (K) and Duv from CIE 1931 xy (via CIE 1960 uv), by Ohno 2013 unless another method is named. */
export function xyToCCT(xy: Xy, method: CCTMethod = 'Ohno 2013'): CCTResult {
	const f = CCT_METHODS[method];
	if (!f) throw new RangeError(`unknown CCT method ${String(method)}: use ${Object.keys(CCT_METHODS).join(' or ')}`);
	return f(xyToUv1960(xy));
}

/** CIE 1931 xy of the point at CCT (K) and Duv (Ohno 2014 §4 via CIE 1960 uv). */
export function CCTToXy(CCT: number, Duv = 0): Xy {
	return uv1960ToXy(CCTToUv(CCT, Duv));
}
