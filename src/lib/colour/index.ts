/**
 * Chromaslate's colour core: the public surface. Pure TypeScript (numbers and typed arrays in,
 * plain objects out), the same in a server route, a CLI and the browser. See README.md beside
 * this file for conventions, modules and references.
 */
export {
	makeSpectrum,
	validateSpectrum,
	spectrumFromSamples,
	alignSpectrum,
	multiplySpectra,
	wavelengthAt,
	spectrumEnd,
	valueAt,
	SpectrumError,
	type Spectrum
} from './spectrum';
export { spectrumToXYZ, spectrumToXYZWithNote, XYZToXy, xyToXYZ, K_M, type XYZ, type Observer } from './tristimulus';
export {
	xyToUv1960,
	uv1960ToXy,
	xyToUvPrime,
	uvPrimeToXy,
	uvPrimeToUv1960,
	uv1960ToUvPrime,
	deltaUvPrime,
	type Uv,
	type UvPrime,
	type Xy
} from './chromaticity';
export {
	uvToCCTOhno2013,
	uvToCCTRobertson1968,
	robertsonIsotemperatureLines,
	CCTToUv,
	CCTToXy,
	xyToCCT,
	kelvinToMired,
	miredToKelvin,
	miredShift,
	deltaDuv,
	planckianUv,
	CCT_METHODS,
	CCT_VALID_MIN_K,
	CCT_VALID_MAX_K,
	DUV_VALID_MAX,
	type CCTResult,
	type CCTMethod
} from './temperature';
export {
	planckianSpectrum,
	daylightSpectrum,
	cieIlluminant,
	CIE_ILLUMINANT_NAMES,
	planckianLocusXy,
	daylightLocusXy,
	spectralLocusXy,
	type CieIlluminantName
} from './illuminants';
export { colourRenderingIndex, criReferenceSpectrum, spectralSimilarityIndex, CRI_DC_LIMIT, CRI_DAYLIGHT_FROM_K, type CRIResult } from './quality';
export { displaySwatch, type DisplaySwatch } from './display';
export { analyzeSpectrum, analyzeChromaticity, COMPUTATION_VERSION, type ReadingAnalysis, type ChromaticityInput } from './analysis';
