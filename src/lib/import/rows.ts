/**
 * From split CSV records to readings: the header picks a layout, every later record is checked
 * cell by cell, and each problem becomes a `RowError` naming the row, the column and the reason.
 * Good rows still come out. Records arrive one at a time (`push`), so the same code serves a whole
 * file, a stream and a worker.
 */
import { z } from 'zod';
import { spectrumFromSamples, SpectrumError } from '../colour';
import { ImportError } from './errors';
import {
	guessMapping,
	resolveLayout,
	STEP_RANGE_NM,
	type ColumnMapping,
	type ColumnMappingInput,
	type FieldColumns,
	type Layout
} from './mapping';
import { fmt, numberCellMessage, parseNumberCell, plainNumber, type NumberCell } from './numbers';
import type { Delimiter, Encoding, ImportLimits, ParsedReading, ParseReport, RowError, SpectralUnit } from './types';

/** Spectral values above this (relative or W/m²/nm) are refused as implausible. */
export const MAX_SPECTRAL_VALUE = 1e9;
/**
 * Negative spectral values no deeper than this share of the reading's peak (0.1 %, the colour
 * core's noise allowance) are meter noise and are passed on (the colour core clips them and says
 * so); deeper ones are refused here with a row error.
 */
export const NEGATIVE_NOISE_SHARE = 1e-3;
/** Largest illuminance accepted, lux (full sun is about 100,000 lux, from memory). */
export const MAX_LUX = 1e6;
const MAX_TRISTIMULUS = 1e9;
const MAX_ERRORS_PER_ROW = 5;
const TEXT_LIMITS = { label: 200, meter: 100, notes: 2000 } as const;

const outside = (text: string) => ({ error: `outside ${text}` });

/**
 * Range checks for the point layouts. A non-custom issue's message is a phrase completing
 * `<column> = <value> is …`; a custom issue's message is a whole sentence.
 */
export const pointValueSchemas = {
	chromaticity_xy: z
		.object({
			x: z.number().min(0, outside('0–1')).max(1, outside('0–1')),
			y: z.number().gt(0, outside('0–1 (it must be above 0)')).max(1, outside('0–1'))
		})
		.superRefine((v, ctx) => {
			if (v.x >= 0 && v.y > 0 && v.x <= 1 && v.y <= 1 && v.x + v.y > 1) {
				ctx.addIssue({ code: 'custom', path: ['y'], message: `x + y = ${fmt(v.x + v.y)} is over 1` });
			}
		}),
	chromaticity_uv_prime: z.object({
		u_prime: z.number().min(0, outside('0–1')).max(1, outside('0–1')),
		v_prime: z.number().gt(0, outside('0–1 (it must be above 0)')).max(1, outside('0–1'))
	}),
	cct_duv: z.object({
		cct: z.number().min(1000, outside('1000–100000 K')).max(100000, outside('1000–100000 K')),
		// ANSI C78.377 uses CCT only within |Duv| ≤ 0.05 (common practice); typed ×1000 by mistake, it lands here.
		duv: z.number().min(-0.05, outside('−0.05 to 0.05 (Duv is small, e.g. 0.003)')).max(0.05, outside('−0.05 to 0.05 (Duv is small, e.g. 0.003)'))
	}),
	tristimulus: z.object({
			X: z.number().min(0, { error: 'negative' }).max(MAX_TRISTIMULUS, { error: 'implausibly large (over 1e9)' }),
			Y: z.number().gt(0, { error: 'not above 0 (a light has Y > 0)' }).max(MAX_TRISTIMULUS, { error: 'implausibly large (over 1e9)' }),
			Z: z.number().min(0, { error: 'negative' }).max(MAX_TRISTIMULUS, { error: 'implausibly large (over 1e9)' })
		}),
	lux: z.number().min(0, { error: 'negative' }).max(MAX_LUX, { error: 'implausibly large (over 1,000,000 lux)' })
} as const;

export interface BuilderOptions {
	mapping?: ColumnMapping | ColumnMappingInput;
	/** Scale of spectral values when no mapping says; default relative. */
	spectralScale?: SpectralUnit;
	limits: ImportLimits;
	/** Errors listed before the rest are only counted; default 1000. */
	maxErrors?: number;
	delimiter: Delimiter;
	encoding: Encoding;
}

type PointLayout = Exclude<Layout, { format: 'wide_spectral' | 'long_spectral' }>;
type CellResult = number | Exclude<NumberCell, { ok: true }>;
interface LongRow {
	row: number;
	nm: number;
	cells: CellResult[];
}

export class ReadingsBuilder {
	private layout: Layout | null = null;
	private row = 0;
	private dataRows = 0;
	private decimalComma = false;
	private overflow = 0;
	private readonly allowComma: boolean;
	private readonly readings: ParsedReading[] = [];
	private readonly errors: RowError[] = [];
	private readonly warnings: string[] = [];
	private readonly longRows: LongRow[] = [];
	private bandNm: Float64Array = new Float64Array(0);

	constructor(private readonly options: BuilderOptions) {
		this.allowComma = options.delimiter === ';';
	}

	/** Adds warnings found before the records (e.g. by the decoder). */
	warn(message: string): void {
		this.warnings.push(message);
	}

	get hasHeader(): boolean {
		return this.layout !== null;
	}

	/**
	 * One record. The first non-blank record is the header; `problem` marks a record the CSV
	 * splitter could not read cleanly (e.g. an unclosed quote), which is then refused.
	 */
	push(cells: string[], problem?: string): void {
		if (!this.layout) {
			if (isBlank(cells)) return;
			this.readHeader(cells);
			return;
		}
		const row = ++this.row;
		if (isBlank(cells)) return;
		if (++this.dataRows > this.options.limits.maxRows) {
			throw new ImportError(
				'too_many_rows',
				`The file has more than ${this.options.limits.maxRows.toLocaleString('en-GB')} data rows; split it into smaller files.`
			);
		}
		if (problem) {
			this.error(row, null, `row ${row}: ${problem}`);
			return;
		}
		const width = this.layout.header.length;
		if (cells.length < width || (cells.length > width && lastFilled(cells) >= width)) {
			const n = cells.length < width ? cells.length : lastFilled(cells) + 1;
			this.error(row, null, `row ${row}: has ${n} cells, the header has ${width}`);
			return;
		}
		switch (this.layout.format) {
			case 'wide_spectral':
				return this.wideRow(this.layout, cells, row);
			case 'long_spectral':
				return this.longRow(this.layout, cells, row);
			default:
				return this.pointRow(this.layout, cells, row);
		}
	}

	/** `encoding` overrides the one given at the start (a stream may fall back to Latin-1 late). */
	finish(overrides: { encoding?: Encoding } = {}): ParseReport {
		if (!this.layout) throw new ImportError('empty', 'The file is empty.');
		if (this.dataRows === 0) throw new ImportError('empty', 'The file has a header line but no data rows.');
		if (this.layout.format === 'long_spectral') this.finishLong(this.layout);
		this.errors.sort((a, b) => a.row - b.row);
		if (this.overflow > 0) {
			this.warnings.push(`${this.overflow.toLocaleString('en-GB')} more row problems were found but not listed.`);
		}
		return {
			format: this.layout.format,
			delimiter: this.options.delimiter,
			encoding: overrides.encoding ?? this.options.encoding,
			decimalComma: this.decimalComma,
			readings: this.readings,
			errors: this.errors,
			warnings: this.warnings
		};
	}

	// -------------------------------------------------------------------------------------------

	private readHeader(cells: string[]) {
		const { limits } = this.options;
		const width = lastFilled(cells) + 1;
		if (width > limits.maxColumns) {
			throw new ImportError(
				'too_many_columns',
				`The header has ${width.toLocaleString('en-GB')} columns; the limit is ${limits.maxColumns.toLocaleString('en-GB')}.`
			);
		}
		const header = cells.slice(0, width);
		let mapping = this.options.mapping;
		if (!mapping) {
			const guess = guessMapping(header, { decimalComma: this.allowComma, spectral: this.options.spectralScale });
			if (guess.problem) throw new ImportError('unrecognised', guess.problem);
			mapping = guess.mapping;
		}
		this.layout = resolveLayout(header, mapping as ColumnMapping);
		if (this.layout.unused.length > 0) {
			const names = this.layout.unused.map((i) => JSON.stringify(header[i].trim()));
			const shown = names.length > 10 ? `${names.slice(0, 10).join(', ')} and ${names.length - 10} more` : names.join(', ');
			this.warnings.push(`${names.length === 1 ? 'Column' : 'Columns'} not used: ${shown}.`);
		}
		if (this.layout.format === 'wide_spectral') this.bandNm = Float64Array.from(this.layout.bands, (b) => b.nm);
	}

	private error(row: number, column: string | null, message: string) {
		if (this.errors.length >= (this.options.maxErrors ?? 1000)) this.overflow++;
		else this.errors.push({ row, column, message });
	}

	private colName(index: number): string {
		return this.layout!.header[index].trim();
	}

	private number(cells: string[], index: number): NumberCell {
		const c = parseNumberCell(cells[index], this.allowComma);
		if (c.ok && c.decimalComma) this.decimalComma = true;
		return c;
	}

	/** label, taken_at, meter, notes, lux; returns null (after reporting) when lux is unusable. */
	private fields(layout: { fields: FieldColumns }, cells: string[], row: number) {
		const f = layout.fields;
		const warnings: string[] = [];
		const out: Pick<ParsedReading, 'label' | 'taken_at' | 'meter' | 'notes' | 'lux' | 'warnings'> = {
			label: `Reading ${row}`,
			warnings
		};
		if (f.label !== undefined) {
			const t = cleanText(cells[f.label], TEXT_LIMITS.label, 'label', warnings);
			if (t) out.label = t;
		}
		if (f.meter !== undefined) {
			const t = cleanText(cells[f.meter], TEXT_LIMITS.meter, 'meter', warnings);
			if (t) out.meter = t;
		}
		if (f.notes !== undefined) {
			const t = cleanText(cells[f.notes], TEXT_LIMITS.notes, 'notes', warnings);
			if (t) out.notes = t;
		}
		if (f.taken_at !== undefined) {
			const raw = (cells[f.taken_at] ?? '').trim();
			if (raw !== '') {
				const iso = isoDateTime(raw);
				if (iso) out.taken_at = iso;
				else warnings.push(`taken_at ${JSON.stringify(raw.slice(0, 40))} is not an ISO 8601 date (YYYY-MM-DD or YYYY-MM-DDThh:mm), so it was left out`);
			}
		}
		if (f.lux !== undefined && (cells[f.lux] ?? '').trim() !== '') {
			const col = this.colName(f.lux);
			const c = this.number(cells, f.lux);
			if (!c.ok) {
				this.error(row, col, numberCellMessage(row, col, c));
				return null;
			}
			const r = pointValueSchemas.lux.safeParse(c.value);
			if (!r.success) {
				this.error(row, col, `row ${row}: ${col} = ${(cells[f.lux] ?? '').trim()} is ${r.error.issues[0].message}`);
				return null;
			}
			out.lux = c.value;
		}
		return out;
	}

	private pointRow(layout: PointLayout, cells: string[], row: number) {
		const values: Record<string, number> = {};
		const texts: Record<string, string> = {};
		let bad = false;
		for (const [name, index] of Object.entries(layout.columns) as [string, number][]) {
			const c = this.number(cells, index);
			const col = this.colName(index);
			if (!c.ok) {
				this.error(row, col, numberCellMessage(row, col, c));
				bad = true;
				continue;
			}
			values[name] = c.value;
			texts[name] = (cells[index] ?? '').trim();
		}
		const fields = this.fields(layout, cells, row);
		if (bad || !fields) return;
		const schema = pointValueSchemas[layout.format];
		const r = schema.safeParse(values);
		if (!r.success) {
			const columns = layout.columns as Record<string, number>;
			for (const issue of r.error.issues) {
				const key = String(issue.path[0]);
				const col = this.colName(columns[key]);
				this.error(
					row,
					col,
					issue.code === 'custom' ? `row ${row}: ${issue.message}` : `row ${row}: ${col} = ${texts[key]} is ${issue.message}`
				);
			}
			return;
		}
		const base = { row, ...fields };
		switch (layout.format) {
			case 'chromaticity_xy':
				this.readings.push({ ...base, kind: 'chromaticity_xy', x: values.x, y: values.y });
				break;
			case 'chromaticity_uv_prime':
				this.readings.push({ ...base, kind: 'chromaticity_uv_prime', u_prime: values.u_prime, v_prime: values.v_prime });
				break;
			case 'cct_duv':
				this.readings.push({ ...base, kind: 'cct_duv', cct_k: values.cct, duv: values.duv });
				break;
			case 'tristimulus':
				this.readings.push({ ...base, kind: 'tristimulus', X: values.X, Y: values.Y, Z: values.Z });
				break;
		}
	}

	private wideRow(layout: Extract<Layout, { format: 'wide_spectral' }>, cells: string[], row: number) {
		const bands = layout.bands;
		const values = new Float64Array(bands.length);
		let problems = 0;
		let peak = 0;
		const report = (k: number, message: string) => {
			problems++;
			if (problems <= MAX_ERRORS_PER_ROW) this.error(row, this.colName(bands[k].index), message);
			else if (problems === MAX_ERRORS_PER_ROW + 1) this.error(row, null, `row ${row}: more bad cells not listed`);
		};
		for (let k = 0; k < bands.length; k++) {
			const raw = cells[bands[k].index];
			// Hot loop (81 cells × 10,000 rows is usual): the allocation-free reader first.
			let v = plainNumber(raw);
			if (v !== v) {
				const c = parseNumberCell(raw, this.allowComma);
				if (!c.ok) {
					report(k, numberCellMessage(row, `${fmt(bands[k].nm)} nm`, c));
					continue;
				}
				if (c.decimalComma) this.decimalComma = true;
				v = c.value;
			}
			if (v > MAX_SPECTRAL_VALUE) {
				report(k, `row ${row}: ${fmt(bands[k].nm)} nm = ${(raw ?? '').trim()} is implausibly large (over 1e9)`);
				continue;
			}
			values[k] = v;
			if (v > peak) peak = v;
		}
		for (let k = 0; k < bands.length && problems === 0; k++) {
			if (values[k] < 0 && -values[k] > NEGATIVE_NOISE_SHARE * peak) {
				report(k, `row ${row}: ${fmt(bands[k].nm)} nm = ${(cells[bands[k].index] ?? '').trim()} is negative`);
			}
		}
		const fields = this.fields(layout, cells, row);
		if (problems > 0 || !fields) return;
		if (peak <= 0) {
			this.error(row, null, `row ${row}: every spectral value is 0 or below`);
			return;
		}
		this.pushSpectrum({ row, ...fields }, this.bandNm, values, layout.spectral, row);
	}

	private pushSpectrum(
		base: Omit<ParsedReading, 'kind' | 'spectrum'>,
		nm: ArrayLike<number>,
		values: ArrayLike<number>,
		unit: SpectralUnit,
		errorRow: number
	) {
		try {
			const { spectrum, warnings } = spectrumFromSamples(nm, values, unit === 'relative' ? 'relative' : 'absolute');
			this.readings.push({ ...base, warnings: [...base.warnings, ...warnings], kind: 'spectral', spectrum });
		} catch (e) {
			if (!(e instanceof SpectrumError)) throw e;
			const where = base.column !== undefined ? `${JSON.stringify(base.column)}: ` : `row ${errorRow}: `;
			this.error(errorRow, base.column ?? null, `${where}${e.message}`);
		}
	}

	private longRow(layout: Extract<Layout, { format: 'long_spectral' }>, cells: string[], row: number) {
		const wlCol = this.colName(layout.wavelength);
		const w = this.number(cells, layout.wavelength);
		if (!w.ok) {
			this.error(row, wlCol, numberCellMessage(row, wlCol, w));
			return;
		}
		if (w.value < 200 || w.value > 1100) {
			this.error(row, wlCol, `row ${row}: ${wlCol} = ${(cells[layout.wavelength] ?? '').trim()} is outside 200–1100 nm`);
			return;
		}
		const parsed: CellResult[] = layout.readings.map((r) => {
			const c = this.number(cells, r.index);
			return c.ok ? c.value : c;
		});
		this.longRows.push({ row, nm: w.value, cells: parsed });
	}

	private finishLong(layout: Extract<Layout, { format: 'long_spectral' }>) {
		const wlCol = this.colName(layout.wavelength);
		// Direction: the way most steps go.
		let ups = 0;
		let downs = 0;
		for (let k = 1; k < this.longRows.length; k++) {
			const d = this.longRows[k].nm - this.longRows[k - 1].nm;
			if (d > 0) ups++;
			else if (d < 0) downs++;
		}
		const rising = ups >= downs;
		const kept: LongRow[] = [];
		for (const r of this.longRows) {
			const last = kept[kept.length - 1];
			if (last && r.nm === last.nm) {
				this.error(r.row, wlCol, `row ${r.row}: wavelength ${fmt(r.nm)} nm repeats row ${last.row}`);
			} else if (last && (rising ? r.nm < last.nm : r.nm > last.nm)) {
				const dupe = kept.find((k) => k.nm === r.nm);
				this.error(
					r.row,
					wlCol,
					dupe
						? `row ${r.row}: wavelength ${fmt(r.nm)} nm repeats row ${dupe.row}`
						: `row ${r.row}: wavelength ${fmt(r.nm)} nm is out of order (after ${fmt(last.nm)} nm on row ${last.row}); wavelengths must ${rising ? 'rise' : 'fall'} steadily`
				);
			} else kept.push(r);
		}
		if (!rising) {
			kept.reverse();
			this.warnings.push('Wavelengths run from long to short; they were read in reverse order.');
		}
		if (kept.length < 3) {
			this.error(0, wlCol, `${wlCol}: fewer than 3 usable wavelengths, so no spectrum could be built`);
			return;
		}
		const interval = kept[1].nm - kept[0].nm;
		for (let k = 1; k < kept.length; k++) {
			const step = kept[k].nm - kept[k - 1].nm;
			if (Math.abs(step - interval) > 1e-6) {
				this.error(
					kept[k].row,
					wlCol,
					`row ${kept[k].row}: wavelength ${fmt(kept[k].nm)} nm breaks the ${fmt(interval)} nm step (after ${fmt(kept[k - 1].nm)} nm), so no spectrum could be built`
				);
				return;
			}
		}
		if (interval < STEP_RANGE_NM.min - 1e-9 || interval > STEP_RANGE_NM.max + 1e-9) {
			this.error(0, wlCol, `${wlCol}: the wavelength step is ${fmt(interval)} nm; steps from 1 to 10 nm can be read`);
			return;
		}
		layout.readings.forEach((r, j) => {
			const label = r.label || `Reading ${j + 1}`;
			const col = r.label || `column ${r.index + 1}`;
			// A reading may cover part of the range: empty cells before its first and after its last value are not errors.
			let first = 0;
			let last = kept.length - 1;
			const isEmpty = (c: CellResult) => typeof c !== 'number' && c.reason === 'empty';
			while (first <= last && isEmpty(kept[first].cells[j])) first++;
			while (last >= first && isEmpty(kept[last].cells[j])) last--;
			if (first > last) {
				this.error(0, col, `${JSON.stringify(label)}: the column has no values`);
				return;
			}
			const nm: number[] = [];
			const values: number[] = [];
			let bad = 0;
			let peak = 0;
			for (let k = first; k <= last; k++) {
				const c = kept[k].cells[j];
				const row = kept[k].row;
				if (typeof c !== 'number') {
					if (++bad <= MAX_ERRORS_PER_ROW) this.error(row, col, `${numberCellMessage(row, col, c)}${bad === 1 ? ` (reading ${JSON.stringify(label)} left out)` : ''}`);
					continue;
				}
				if (c > MAX_SPECTRAL_VALUE) {
					if (++bad <= MAX_ERRORS_PER_ROW) this.error(row, col, `row ${row}: ${col} = ${fmt(c)} is implausibly large (over 1e9)${bad === 1 ? ` (reading ${JSON.stringify(label)} left out)` : ''}`);
					continue;
				}
				nm.push(kept[k].nm);
				values.push(c);
				if (c > peak) peak = c;
			}
			if (bad === 0) {
				for (let k = 0; k < values.length; k++) {
					if (values[k] < 0 && -values[k] > NEGATIVE_NOISE_SHARE * peak) {
						const row = kept[first + k].row;
						if (++bad <= MAX_ERRORS_PER_ROW) this.error(row, col, `row ${row}: ${col} = ${fmt(values[k])} is negative${bad === 1 ? ` (reading ${JSON.stringify(label)} left out)` : ''}`);
					}
				}
			}
			if (bad > 0) return;
			if (peak <= 0) {
				this.error(0, col, `${JSON.stringify(label)}: every spectral value is 0 or below`);
				return;
			}
			this.pushSpectrum({ row: j + 1, column: r.label, label, warnings: [] }, nm, values, layout.spectral, 0);
		});
	}
}

function isBlank(cells: string[]): boolean {
	for (const c of cells) if (c.trim() !== '') return false;
	return true;
}

function lastFilled(cells: string[]): number {
	for (let i = cells.length - 1; i >= 0; i--) if (cells[i].trim() !== '') return i;
	return -1;
}

// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001f\u007f-\u009f]+/g;

/** Plain text: control characters become spaces, trimmed, cut at `max` characters (with a warning). */
function cleanText(raw: string | undefined, max: number, what: string, warnings: string[]): string {
	let t = (raw ?? '').replace(CONTROL, ' ').trim();
	if (t.length > max) {
		t = t.slice(0, max);
		warnings.push(`${what} was cut to ${max} characters`);
	}
	return t;
}

const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.\d{1,6})?)?(Z|[+-]\d{2}:?\d{2})?)?$/;

/** An ISO 8601 date or date-time with real calendar values, space replaced by `T`; else null. */
export function isoDateTime(raw: string): string | null {
	const m = ISO.exec(raw);
	if (!m) return null;
	const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
	const days = new Date(Date.UTC(y, mo, 0)).getUTCDate();
	if (mo < 1 || mo > 12 || d < 1 || d > days) return null;
	if (m[4] !== undefined && (Number(m[4]) > 23 || Number(m[5]) > 59 || (m[6] !== undefined && Number(m[6]) > 59))) return null;
	return raw.replace(' ', 'T');
}
