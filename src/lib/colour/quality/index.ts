/** Light quality indices: the public surface of the quality folder. References: see each file. */
export { colourRenderingIndex, colourRenderingIndexAt, criReferenceSpectrum, CRI_DC_LIMIT, CRI_DAYLIGHT_FROM_K, type CRIResult } from './cri';
export { spectralSimilarityIndex, ssiDefaultReference, ssiAgainstDefault } from './ssi';
