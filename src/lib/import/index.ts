/**
 * Readings importer: CSV files of spectra, chromaticity, CCT + Duv or tristimulus values in,
 * validated readings and per-row errors out. Pure (no server, no DOM); formats in README.md.
 */
export { ImportError, isImportError, type ImportErrorCode } from './errors';
export {
	createReadingsParser,
	detectDelimiter,
	parseReadings,
	parseRows,
	parseRowsAsync,
	previewReadings,
	readRecords,
	type ParseOptions,
	type Records,
	type PreviewResult,
	type ReadingsParser,
	type RowsOptions
} from './csv';
export {
	columnMappingSchema,
	columnMeaningSchema,
	COLUMN_MEANINGS,
	guessMapping,
	type ColumnMapping,
	type ColumnMappingInput,
	type ColumnMeaning,
	type GuessedMapping
} from './mapping';
export { pointValueSchemas } from './rows';
export {
	DEFAULT_LIMITS,
	type Delimiter,
	type Encoding,
	type ImportFormat,
	type ImportLimits,
	type ParsedReading,
	type ParseReport,
	type ReadingInput,
	type ReadingKind,
	type RowError,
	type SpectralUnit
} from './types';
export { analyzeReport, toAnalyzeJson, type AnalyzedReading, type AnalyzeJson, type AnalyzeResult } from './analyze-report';
