/** Illuminants and loci: the public surface of the illuminants folder. References: see each file. */
export { planckianSpectrum, planckianRelativePower } from './planckian';
export { daylightSpectrum, daylightM, DAYLIGHT_T_MIN, DAYLIGHT_T_MAX } from './daylight';
export { cieIlluminant, CIE_ILLUMINANT_NAMES, D_SERIES_C2_RATIO, type CieIlluminantName } from './cie';
export { planckianLocusXy, daylightLocusXy, spectralLocusXy } from './loci';
