/**
 * Where CCT and Duv mean something: 1000–20000 K and |Duv| ≤ 0.05 (Ohno 2014 §1; ANSI C78.377
 * uses the same Duv sign). Outside, values are still returned, with a warning.
 *
 * References:
 *   Ohno, Y. (2014) Practical use and calculation of CCT and Duv. LEUKOS 10(1), 47–55.
 *     doi:10.1080/15502724.2013.839020
 */
export const CCT_VALID_MIN_K = 1000;
export const CCT_VALID_MAX_K = 20000;
export const DUV_VALID_MAX = 0.05;

export function cctWarnings(CCT: number, Duv: number, outsideTable: boolean): string[] {
	const w: string[] = [];
	if (!outsideTable && CCT >= CCT_VALID_MIN_K && CCT <= CCT_VALID_MAX_K && Math.abs(Duv) <= DUV_VALID_MAX) return w;
	const k = Math.round(CCT).toLocaleString('en-GB');
	if (outsideTable) {
		w.push(`the chromaticity lies beyond the end of the Planckian locus table (500–1,000,000 K): the CCT of ${k} K is not meaningful`);
	} else if (CCT < CCT_VALID_MIN_K || CCT > CCT_VALID_MAX_K) {
		w.push(`CCT ${k} K is outside ${CCT_VALID_MIN_K}–${CCT_VALID_MAX_K.toLocaleString('en-GB')} K, where CCT is defined for practical use: treat it as not meaningful`);
	}
	if (Math.abs(Duv) > DUV_VALID_MAX) {
		w.push(`Duv ${Duv.toFixed(4)} is beyond ±${DUV_VALID_MAX}: the light is too far from the Planckian locus for its CCT to be meaningful`);
	}
	return w;
}
