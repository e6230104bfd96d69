/**
 * Camera white balance that renders the target white as neutral: the colour temperature to set
 * and the green/magenta correction, given in Duv because cameras scale their tint controls in
 * their own units.
 *
 * A camera balanced to K renders light of CCT K as neutral; a target above the Planckian locus
 * (Duv > 0, greenish) needs the camera's tint moved toward magenta by that much, and below it
 * (Duv < 0) toward green. Setting the camera's kelvin higher makes the picture warmer (common
 * practice).
 *
 * References:
 *   Y. Ohno, "Practical use and calculation of CCT and Duv", LEUKOS 10(1), 47–55, 2014,
 *   doi:10.1080/15502724.2013.839020 (CCT, Duv; Duv > 0 above the locus).
 */
import type { TargetWhite } from './target';

export interface CameraWhiteBalance {
	/** Kelvin to set (rounded to 10 K, finer than cameras offer). null if the target has no CCT. */
	kelvin: number | null;
	mired: number | null;
	/** The target's Duv: the green/magenta the camera must take out. */
	duv: number | null;
	/** Which way the camera's tint control goes. */
	tint: 'magenta' | 'green' | 'none';
	note: string;
}

/** Below this |Duv| no tint correction is suggested (about a quarter of the default tolerance; ours). */
export const TINT_THRESHOLD_DUV = 0.0005;

export function cameraWhiteBalance(target: TargetWhite): CameraWhiteBalance {
	if (target.CCT === null || target.Duv === null) {
		return {
			kelvin: null,
			mired: null,
			duv: target.Duv,
			tint: 'none',
			note: 'This target is too far from white for a colour temperature: balance the camera on a grey card under it.'
		};
	}
	const kelvin = Math.round(target.CCT / 10) * 10;
	const tint = target.Duv > TINT_THRESHOLD_DUV ? 'magenta' : target.Duv < -TINT_THRESHOLD_DUV ? 'green' : 'none';
	const tintText =
		tint === 'none'
			? 'no green/magenta correction'
			: `tint toward ${tint} by ${Math.abs(target.Duv).toFixed(4)} Duv (the light is ${tint === 'magenta' ? 'greenish' : 'magenta-ish'}; cameras scale tint in their own units)`;
	return {
		kelvin,
		mired: 1e6 / target.CCT,
		duv: target.Duv,
		tint,
		note: `Set the camera to ${kelvin} K with ${tintText}.`
	};
}
