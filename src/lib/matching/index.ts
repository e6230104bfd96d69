/**
 * Chromaslate's matching solvers: the public surface. Target whites and the distance of a reading,
 * mired arithmetic explained, the filter library with modelled spectra, gel fixes (both ways),
 * LED fixes (brightest, or best Ra/SSI at a floor), DMX values, and the camera white balance.
 * Pure TypeScript with relative imports only; see README.md beside this file.
 */
export {
	DEFAULT_TOLERANCE_DUV_PRIME,
	resolveTargetWhite,
	isTargetWhite,
	distance,
	type TargetSpec,
	type TargetWhite,
	type TargetOptions,
	type Distance,
	type IlluminantName
} from './target';
export { inputToXy, summarise, summariseXy, DUV_LIMIT, type ChromaticityInput, type ChromaticitySummary } from './chromaticity';
export {
	explainMiredArithmetic,
	miredLibrary,
	type MiredExplanation,
	type MiredExplainOptions,
	type MiredStep,
	type MiredStackCandidate,
	type MiredGel
} from './mired';
export {
	GEL_DEFINITIONS,
	gelDefinition,
	validateGelOverrides,
	FULL_CTO_MIRED,
	FULL_CTB_MIRED,
	FULL_GREEN_PEAK_DENSITY,
	CLEAR_BASE_TRANSMISSION,
	type GelDefinition,
	type GelFamily,
	type GelOverride,
	type GelOverrides,
	type ValueRange
} from './gels/definitions';
export { conversionTransmission, bandTransmission, neutralTransmission, conversionTargetK, FILTER_GRID } from './gels/transmission';
export { stackTransmission } from './gels/stack';
export {
	gelLibrary,
	getGel,
	gelEffectsTable,
	greenFilterDuvEffects,
	arithmeticShift,
	effectOnPlanckian,
	EFFECT_SOURCES_K,
	type Gel,
	type GelEffect,
	type GelEffectRow
} from './gels/library';
export {
	characteriseTransmission,
	customGel,
	normaliseTransmission,
	TransmissionError,
	type MeasuredTransmissionOptions,
	type TransmissionCharacterisation
} from './gels/custom';
export {
	proposeGelsForSourceToTarget,
	proposeGelsForLamp,
	proposeGelsForHouseLight,
	enumerateStacks,
	ESTIMATE_NOTE,
	SPECTRAL_NOTE,
	MAX_STACK,
	type GelSource,
	type GelSearchOptions,
	type GelProposal,
	type GelProposalResult,
	type GelDirection
} from './gels/propose';
export { ledSpectrumOhno2005, phosphorLedSpectrum, ohno2005Value, LED_GRID, type EmissionBand, type SpectralGrid } from './led/ohno2005';
export {
	GENERIC_FIXTURES,
	genericFixture,
	resolveFixture,
	type FixtureProfile,
	type FixtureKind,
	type ChannelDefinition,
	type ChannelEmitter,
	type ResolvedFixture,
	type ResolvedChannel
} from './led/profiles';
export { solveLedFix, type LedFix, type LedSolveOptions, type LedTarget, type ChannelSetting } from './led/solve';
export { solveLedQualityFix, type LedQualityFix, type LedQualityOptions } from './led/quality';
export { locateInGamut, convexHull, type GamutLocation } from './led/gamut';
export { levelToDmx8, levelToDmx16, dmx8ToLevel, dmx16ToLevel, levelToPercent, DmxError, DMX8_MAX, DMX16_MAX } from './dmx';
export { cameraWhiteBalance, TINT_THRESHOLD_DUV, type CameraWhiteBalance } from './camera';
export { GEL_HEAT_CAUTION, HOUSE_LIGHT_CAUTION, LED_CAUTION } from './cautions';
export { solveLinearProgramme, type LinearProgramme, type LinearProgrammeResult } from './lp';
