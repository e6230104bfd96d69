/**
 * From a parse report to analysed readings: each reading through the colour core's
 * `analyzeSpectrum` or `analyzeChromaticity`, and the JSON the `analyze` command prints. Pure, so
 * the upload route and the analysis API give the same numbers as the command line.
 */
import { analyzeChromaticity, analyzeSpectrum, COMPUTATION_VERSION, type ReadingAnalysis, type Spectrum } from '../colour';
import type { ImportFormat, ParsedReading, ParseReport, RowError } from './types';

export interface AnalyzedReading {
	reading: ParsedReading;
	/** Its warnings include the reading's own import warnings first. */
	analysis: ReadingAnalysis;
}

export interface AnalyzeResult {
	format: ImportFormat;
	readings: AnalyzedReading[];
	/** The report's row errors, then readings the colour core could not analyse. */
	errors: RowError[];
	warnings: string[];
	computationVersion: string;
}

/** Analyses every reading; one that the colour core refuses becomes an error, the rest still come out. */
export function analyzeReport(report: ParseReport, options: { ssiReference?: Spectrum } = {}): AnalyzeResult {
	const readings: AnalyzedReading[] = [];
	const errors: RowError[] = [...report.errors];
	for (const reading of report.readings) {
		try {
			const analysis = analyzeReading(reading, options);
			readings.push({ reading, analysis: { ...analysis, warnings: [...reading.warnings, ...analysis.warnings] } });
		} catch (e) {
			if (!(e instanceof Error)) throw e;
			const where = reading.column !== undefined ? JSON.stringify(reading.label) : `row ${reading.row}`;
			errors.push({ row: reading.column !== undefined ? 0 : reading.row, column: reading.column ?? null, message: `${where}: ${e.message}` });
		}
	}
	errors.sort((a, b) => a.row - b.row);
	return { format: report.format, readings, errors, warnings: report.warnings, computationVersion: COMPUTATION_VERSION };
}

function analyzeReading(r: ParsedReading, options: { ssiReference?: Spectrum }): ReadingAnalysis {
	const lux = r.lux ?? null;
	switch (r.kind) {
		case 'spectral': {
			const a = analyzeSpectrum(r.spectrum, options);
			return a.lux === null && lux !== null ? { ...a, lux } : a;
		}
		case 'chromaticity_xy':
			return analyzeChromaticity({ x: r.x, y: r.y }, lux);
		case 'chromaticity_uv_prime':
			return analyzeChromaticity({ u_prime: r.u_prime, v_prime: r.v_prime }, lux);
		case 'cct_duv':
			return analyzeChromaticity({ cct_k: r.cct_k, duv: r.duv }, lux);
		case 'tristimulus':
			return analyzeChromaticity({ X: r.X, Y: r.Y, Z: r.Z }, lux);
	}
}

/** One reading as the `analyze` command prints it (keys and order fixed). */
export interface AnalyzeJsonReading {
	row: number;
	label: string;
	kind: 'spectral' | 'chromaticity' | 'cct_duv' | 'tristimulus';
	x: number | null;
	y: number | null;
	u_prime: number | null;
	v_prime: number | null;
	cct_k: number | null;
	duv: number | null;
	cri: { ra: number; r: number[] } | null;
	ssi: number | null;
	warnings: string[];
}

export interface AnalyzeJson {
	readings: AnalyzeJsonReading[];
	errors: RowError[];
}

const KIND: Record<ParsedReading['kind'], AnalyzeJsonReading['kind']> = {
	spectral: 'spectral',
	chromaticity_xy: 'chromaticity',
	chromaticity_uv_prime: 'chromaticity',
	cct_duv: 'cct_duv',
	tristimulus: 'tristimulus'
};

const num = (v: number | null | undefined): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

export function toAnalyzeJson(result: AnalyzeResult): AnalyzeJson {
	return {
		readings: result.readings.map(({ reading, analysis: a }) => ({
			row: reading.row,
			label: reading.label,
			kind: KIND[reading.kind],
			x: num(a.x),
			y: num(a.y),
			u_prime: num(a.u_prime),
			v_prime: num(a.v_prime),
			cct_k: num(a.cct_k),
			duv: num(a.duv),
			cri: a.cri ? { ra: a.cri.ra, r: [...a.cri.r] } : null,
			ssi: num(a.ssi),
			warnings: [...a.warnings]
		})),
		errors: result.errors.map((e) => ({ row: e.row, column: e.column, message: e.message }))
	};
}
