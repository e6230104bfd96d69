/**
 * Shapes produced by the readings importer. Plain data only, so a report can cross a worker
 * boundary or be stored as JSON (a `Spectrum` holds a Float64Array, which structured clone keeps).
 */
import type { Spectrum } from '../colour';

/** The layouts the importer understands (see README.md in this folder). */
export type ImportFormat =
	| 'wide_spectral'
	| 'long_spectral'
	| 'chromaticity_xy'
	| 'chromaticity_uv_prime'
	| 'cct_duv'
	| 'tristimulus';

export type Delimiter = ',' | ';' | '\t';

/** `utf-8-bom`: UTF-8 that starts with a byte order mark; `text`: the input was already a string. */
export type Encoding = 'utf-8' | 'utf-8-bom' | 'latin1' | 'text';

/** Spectral values are relative (any scale) or absolute spectral irradiance in W/m²/nm. */
export type SpectralUnit = 'relative' | 'W/m²/nm';

/**
 * A rejected row or cell. `row` counts data records after the header, starting at 1 (blank lines
 * count too, so without multi-line quoted cells row n is line n + 1 of the file); `row` 0 is the
 * header line itself. `column` is the header text of the cell at fault, or null for the whole row.
 */
export interface RowError {
	row: number;
	column: string | null;
	message: string;
}

interface ReadingBase {
	/**
	 * Wide and point layouts: the data row (1 = first row after the header, as in `RowError`).
	 * Long spectral layout, where a reading is a column: its position among the reading columns
	 * (1 = first column after the wavelength column), and `column` holds its header.
	 */
	row: number;
	column?: string;
	/** Plain text, never interpreted. `Reading <row>` when the file has no label. */
	label: string;
	/** ISO 8601 as written (a space between date and time becomes `T`); no time zone is added. */
	taken_at?: string;
	meter?: string;
	notes?: string;
	/** Illuminance in lux, as given in the file. */
	lux?: number;
	/** Things worth knowing that did not stop the reading (e.g. a date that could not be read). */
	warnings: string[];
}

export type ReadingInput =
	| { kind: 'spectral'; spectrum: Spectrum }
	| { kind: 'chromaticity_xy'; x: number; y: number }
	| { kind: 'chromaticity_uv_prime'; u_prime: number; v_prime: number }
	| { kind: 'cct_duv'; cct_k: number; duv: number }
	| { kind: 'tristimulus'; X: number; Y: number; Z: number };

export type ParsedReading = ReadingBase & ReadingInput;
export type ReadingKind = ReadingInput['kind'];

export interface ParseReport {
	format: ImportFormat;
	delimiter: Delimiter;
	encoding: Encoding;
	/** True when at least one number was written with a decimal comma (only read in `;` files). */
	decimalComma: boolean;
	readings: ParsedReading[];
	errors: RowError[];
	/** File-level notes: unused columns, reversed wavelength order, mixed encodings… */
	warnings: string[];
}

export interface ImportLimits {
	/** Bytes (characters when the input is already text); default 20 MB (20 × 1024 × 1024). */
	maxBytes: number;
	/** Data rows after the header, blank ones not counted; default 50,000. */
	maxRows: number;
	/** Header cells; default 2,000. */
	maxColumns: number;
}

export const DEFAULT_LIMITS: ImportLimits = {
	maxBytes: 20 * 1024 * 1024,
	maxRows: 50_000,
	maxColumns: 2_000
};
