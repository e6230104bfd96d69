/**
 * Columns: what each header means. Two ways in, one way out:
 *  - `guessMapping(header)` recognises our own layouts by their header names (README.md here);
 *  - a `ColumnMapping` chosen by the user for any other layout (validated by `columnMappingSchema`).
 * Either way `resolveLayout(header, mapping)` turns it into column indices the row reader uses.
 */
import { z } from 'zod';
import { ImportError } from './errors';
import type { ImportFormat, SpectralUnit } from './types';

/** Wavelengths outside this range (nm) are not read as spectral bands. */
export const BAND_RANGE_NM = { min: 200, max: 1100 } as const;
/** Uniform steps (nm) accepted between spectral bands. */
export const STEP_RANGE_NM = { min: 1, max: 10 } as const;

export const COLUMN_MEANINGS = [
	'label',
	'x',
	'y',
	'u_prime',
	'v_prime',
	'cct',
	'duv',
	'X',
	'Y',
	'Z',
	'lux',
	'taken_at',
	'meter',
	'notes',
	'wavelength',
	'spectrum',
	'ignore'
] as const;
export type NamedMeaning = (typeof COLUMN_MEANINGS)[number];

/**
 * What one column holds. `spectrum`: in a long layout (with a `wavelength` column), one reading's
 * values by wavelength, its header being the label. `{ band_nm }`: in a wide layout, the value
 * at that wavelength. `ignore`: not read.
 */
export const columnMeaningSchema = z.union([
	z.enum(COLUMN_MEANINGS),
	z.object({ band_nm: z.number().finite().min(BAND_RANGE_NM.min).max(BAND_RANGE_NM.max) })
]);
export type ColumnMeaning = z.infer<typeof columnMeaningSchema>;

const SINGLE_MEANINGS = COLUMN_MEANINGS.filter((m) => m !== 'spectrum' && m !== 'ignore');
const POINT_SETS: { format: ImportFormat; needs: NamedMeaning[] }[] = [
	{ format: 'tristimulus', needs: ['X', 'Y', 'Z'] },
	{ format: 'chromaticity_xy', needs: ['x', 'y'] },
	{ format: 'chromaticity_uv_prime', needs: ['u_prime', 'v_prime'] },
	{ format: 'cct_duv', needs: ['cct', 'duv'] }
];
const READING_FIELDS = ['label', 'lux', 'taken_at', 'meter', 'notes'] as const;
type ReadingField = (typeof READING_FIELDS)[number];

/**
 * A column is named by its header text (matched exactly first, then ignoring case and surrounding
 * spaces) or by its 0-based position.
 */
export const columnRefSchema = z.union([z.string().trim().min(1).max(200), z.number().int().min(0).max(9999)]);

const spectralUnitSchema = z
	.enum(['relative', 'W/m²/nm', 'W/m2/nm'])
	.transform((u): SpectralUnit => (u === 'relative' ? 'relative' : 'W/m²/nm'));

export const columnMappingSchema = z
	.object({
		columns: z.array(z.object({ column: columnRefSchema, meaning: columnMeaningSchema })).min(1).max(10000),
		units: z
			.object({
				wavelength: z.literal('nm').default('nm'),
				spectral: spectralUnitSchema.default('relative')
			})
			.default({ wavelength: 'nm', spectral: 'relative' })
	})
	.superRefine((m, ctx) => {
		const problem = mappingProblem(m.columns.map((c) => c.meaning));
		if (problem) ctx.addIssue({ code: 'custom', path: ['columns'], message: problem });
	});

export type ColumnMapping = z.output<typeof columnMappingSchema>;
export type ColumnMappingInput = z.input<typeof columnMappingSchema>;

/** The layout a set of meanings describes, or why it describes none. */
export function mappingFormat(meanings: ColumnMeaning[]): { format: ImportFormat } | { problem: string } {
	const named = new Map<NamedMeaning, number>();
	const bands: number[] = [];
	for (const m of meanings) {
		if (typeof m === 'string') named.set(m, (named.get(m) ?? 0) + 1);
		else bands.push(m.band_nm);
	}
	for (const m of SINGLE_MEANINGS) {
		if ((named.get(m) ?? 0) > 1) return { problem: `${m} is given to more than one column` };
	}
	const seen = new Set<number>();
	for (const nm of bands) {
		if (seen.has(nm)) return { problem: `the wavelength ${nm} nm appears in two columns` };
		seen.add(nm);
	}
	const has = (m: NamedMeaning) => named.has(m);
	const complete = POINT_SETS.filter((s) => s.needs.every(has));
	const spectral = has('wavelength') || has('spectrum') || bands.length > 0;
	const kinds = complete.length + (spectral ? 1 : 0);
	if (kinds > 1) {
		const names = [...(spectral ? ['spectral values'] : []), ...complete.map((s) => s.needs.join(', '))];
		return { problem: `map one kind of reading only (found ${names.join(' and ')})` };
	}
	if (has('wavelength') || has('spectrum')) {
		if (!has('wavelength')) return { problem: 'spectrum columns need a wavelength column' };
		if (!has('spectrum')) return { problem: 'a wavelength column needs at least one spectrum column' };
		if (bands.length > 0) return { problem: 'use either a wavelength column or band columns, not both' };
		const perColumn = READING_FIELDS.filter(has);
		if (perColumn.length > 0) {
			return { problem: `in a layout with a wavelength column each reading is a column, so ${perColumn.join(', ')} cannot be mapped` };
		}
		return { format: 'long_spectral' };
	}
	if (bands.length > 0) {
		if (bands.length < 3) return { problem: 'a spectrum needs at least 3 band columns' };
		return { format: 'wide_spectral' };
	}
	if (complete.length === 1) return { format: complete[0].format };
	for (const s of POINT_SETS) {
		const got = s.needs.filter(has);
		if (got.length > 0) {
			const missing = s.needs.filter((m) => !has(m));
			return { problem: `${got.join(', ')} ${got.length > 1 ? 'are' : 'is'} mapped but ${missing.join(', ')} ${missing.length > 1 ? 'are' : 'is'} not` };
		}
	}
	return { problem: 'no column holds a reading (wavelength bands, x and y, u_prime and v_prime, cct and duv, or X, Y and Z)' };
}

function mappingProblem(meanings: ColumnMeaning[]): string | null {
	const r = mappingFormat(meanings);
	return 'problem' in r ? r.problem : null;
}

// ---------------------------------------------------------------------------------------------
// Recognising our own layouts from the header

/** Header text as compared: trimmed, lower case, inner runs of spaces made one. */
export function normaliseHeader(h: string): string {
	return h.trim().replace(/\s+/g, ' ').toLowerCase();
}

const SYNONYMS: Record<string, NamedMeaning> = {};
function names(meaning: NamedMeaning, list: string[]) {
	for (const n of list) SYNONYMS[n] = meaning;
}
names('label', ['label', 'name', 'reading']);
names('taken_at', ['taken_at', 'taken at', 'timestamp', 'datetime']);
names('meter', ['meter', 'instrument']);
names('notes', ['notes', 'note', 'comment', 'comments']);
names('lux', ['lux', 'lx', 'illuminance', 'illuminance_lux', 'illuminance (lx)', 'lux (lx)']);
names('cct', ['cct', 'cct_k', 'cct (k)', 'cct_kelvin']);
names('duv', ['duv', 'δuv', 'Δuv']);
names('u_prime', ['u_prime', "u'", 'u’', 'u′']);
names('v_prime', ['v_prime', "v'", 'v’', 'v′']);
names('wavelength', ['wavelength', 'wavelength_nm', 'wavelength (nm)', 'nm', 'λ', 'lambda']);

/**
 * A header that names a wavelength in nm: `380`, `380nm`, `380 nm`, `380.0` (and `380,0` in a
 * semicolon file). Returns the wavelength, or null.
 */
export function bandHeaderNm(h: string, decimalComma: boolean): number | null {
	const t = normaliseHeader(h);
	const m = (decimalComma ? /^(\d+(?:[.,]\d+)?) ?(?:nm)?$/ : /^(\d+(?:\.\d+)?) ?(?:nm)?$/).exec(t);
	if (!m) return null;
	return Number(m[1].replace(',', '.'));
}

export interface GuessedMapping {
	/** The mapping our rules read from the header (possibly incomplete: see `problem`). */
	mapping: { columns: { column: string | number; meaning: ColumnMeaning }[]; units: { wavelength: 'nm'; spectral: SpectralUnit } };
	format: ImportFormat | null;
	/** Why no layout was recognised, in one sentence; null when `format` is set. */
	problem: string | null;
	/** Header cells not used (not empty). */
	unused: string[];
}

/**
 * Reads the header by our naming rules. Case is ignored except for one rule: a column called `z`
 * or `Z` means the file holds tristimulus X, Y, Z; without one, x and y are CIE 1931 chromaticity
 * (and an upper-case `Y` next to a lower-case `y` is luminance, not used).
 */
export function guessMapping(header: string[], options: { decimalComma?: boolean; spectral?: SpectralUnit } = {}): GuessedMapping {
	const decimalComma = options.decimalComma ?? false;
	const meanings: (ColumnMeaning | null)[] = header.map(() => null);
	const norm = header.map(normaliseHeader);
	const taken = new Set<NamedMeaning>();
	const claim = (i: number, m: NamedMeaning) => {
		if (taken.has(m) && m !== 'spectrum') return;
		meanings[i] = m;
		taken.add(m);
	};

	const wavelengthCol = norm.findIndex((n) => SYNONYMS[n] === 'wavelength');
	const bandCols = norm
		.map((_, i) => i)
		.filter((i) => {
			const nm = bandHeaderNm(header[i], decimalComma);
			return nm !== null && nm >= BAND_RANGE_NM.min && nm <= BAND_RANGE_NM.max;
		});

	if (wavelengthCol >= 0) {
		meanings[wavelengthCol] = 'wavelength';
		header.forEach((h, i) => {
			if (i !== wavelengthCol && h.trim() !== '') meanings[i] = 'spectrum';
		});
	} else {
		for (let i = 0; i < header.length; i++) {
			const m = SYNONYMS[norm[i]];
			if (m && (READING_FIELDS as readonly string[]).includes(m)) claim(i, m);
		}
		if (bandCols.length >= 3) {
			for (const i of bandCols) meanings[i] = { band_nm: bandHeaderNm(header[i], decimalComma)! };
		} else {
			claimPointColumns(header, norm, meanings, taken);
		}
	}

	const columns: GuessedMapping['mapping']['columns'] = [];
	const unused: string[] = [];
	const counts = new Map<string, number>();
	for (const h of header) counts.set(h.trim(), (counts.get(h.trim()) ?? 0) + 1);
	header.forEach((h, i) => {
		const m = meanings[i];
		if (m === null) {
			if (h.trim() !== '') unused.push(h.trim());
			return;
		}
		const name = h.trim();
		const unique = name !== '' && name.length <= 200 && counts.get(name) === 1;
		columns.push({ column: unique ? name : i, meaning: m });
	});
	const result = mappingFormat(columns.map((c) => c.meaning));
	return {
		mapping: { columns, units: { wavelength: 'nm', spectral: options.spectral ?? 'relative' } },
		format: 'format' in result ? result.format : null,
		problem: 'problem' in result ? unrecognisedMessage(header, result.problem, columns.length > 0) : null,
		unused
	};
}

function claimPointColumns(header: string[], norm: string[], meanings: (ColumnMeaning | null)[], taken: Set<NamedMeaning>) {
	const exact = (letter: string) => header.findIndex((h) => h.trim() === letter);
	const either = (lower: string, upper: string, preferUpper: boolean) => {
		const a = exact(preferUpper ? upper : lower);
		return a >= 0 ? a : exact(preferUpper ? lower : upper);
	};
	const set = (i: number, m: NamedMeaning) => {
		if (i >= 0 && meanings[i] === null) {
			meanings[i] = m;
			taken.add(m);
		}
	};
	const hasZ = exact('z') >= 0 || exact('Z') >= 0;
	if (hasZ) {
		set(either('x', 'X', true), 'X');
		set(either('y', 'Y', true), 'Y');
		set(either('z', 'Z', true), 'Z');
	} else {
		set(either('x', 'X', false), 'x');
		set(either('y', 'Y', false), 'y');
	}
	// Other point quantities by name; only one reading kind is used, in this order of preference.
	const have = (ms: NamedMeaning[]) => ms.every((m) => taken.has(m));
	const candidates: NamedMeaning[][] = [['u_prime', 'v_prime'], ['cct', 'duv']];
	for (const pair of candidates) {
		const idx = pair.map((m) => norm.findIndex((n, i) => SYNONYMS[n] === m && meanings[i] === null));
		const alreadyComplete = have(['X', 'Y', 'Z']) || have(['x', 'y']) || have(['u_prime', 'v_prime']);
		if (idx.every((i) => i >= 0) && !alreadyComplete) pair.forEach((m, k) => set(idx[k], m));
		else if (!alreadyComplete && idx.some((i) => i >= 0) && pair.every((m) => !taken.has(m))) {
			// Half a pair: keep it so the problem message can say what is missing.
			idx.forEach((i, k) => set(i, pair[k]));
		}
	}
}

function unrecognisedMessage(header: string[], problem: string, anyMapped: boolean): string {
	const shown = header
		.map((h) => h.trim())
		.filter((h) => h !== '')
		.slice(0, 8)
		.map((h) => (h.length > 24 ? `${h.slice(0, 21)}…` : h));
	const found = shown.length ? ` (found: ${shown.join(', ')}${header.length > 8 ? ', …' : ''})` : '';
	if (anyMapped && !problem.startsWith('no column')) return `The columns cannot be read as readings: ${problem}${found}.`;
	return `No recognisable columns${found}: expected wavelengths such as 380, 385, … or a wavelength column, or x and y, u_prime and v_prime, cct and duv, or X, Y and Z.`;
}

// ---------------------------------------------------------------------------------------------
// From a mapping to column indices

export type FieldColumns = Partial<Record<ReadingField, number>>;

export type Layout = { header: string[]; unused: number[]; spectral: SpectralUnit } & (
	| { format: 'wide_spectral'; bands: { index: number; nm: number }[]; start: number; interval: number; fields: FieldColumns }
	| { format: 'long_spectral'; wavelength: number; readings: { index: number; label: string }[] }
	| { format: 'chromaticity_xy'; columns: { x: number; y: number }; fields: FieldColumns }
	| { format: 'chromaticity_uv_prime'; columns: { u_prime: number; v_prime: number }; fields: FieldColumns }
	| { format: 'cct_duv'; columns: { cct: number; duv: number }; fields: FieldColumns }
	| { format: 'tristimulus'; columns: { X: number; Y: number; Z: number }; fields: FieldColumns }
);

function findColumn(header: string[], ref: string | number): number {
	if (typeof ref === 'number') return ref < header.length ? ref : -1;
	const t = ref.trim();
	const exact = header.findIndex((h) => h.trim() === t);
	if (exact >= 0) return exact;
	const n = normaliseHeader(t);
	const loose = header.map((h, i) => [normaliseHeader(h), i] as const).filter(([h]) => h === n);
	return loose.length === 1 ? loose[0][1] : -1;
}

/**
 * Column indices for a mapping against this header. Throws `ImportError('unrecognised')` when a
 * mapped column is missing or the wavelengths of a wide layout are duplicated, out of order or
 * not on a uniform 1–10 nm step (every row would fail the same way, so the file is refused).
 */
export function resolveLayout(header: string[], mapping: ColumnMapping | GuessedMapping['mapping']): Layout {
	const parsed = columnMappingSchema.safeParse(mapping);
	if (!parsed.success) {
		throw new ImportError('unrecognised', `The column mapping cannot be used: ${parsed.error.issues[0]?.message ?? 'invalid'}.`);
	}
	const m = parsed.data;
	const byMeaning = new Map<string, number>();
	const used = new Set<number>();
	const bands: { index: number; nm: number }[] = [];
	const spectra: { index: number; label: string }[] = [];
	for (const c of m.columns) {
		const i = findColumn(header, c.column);
		if (i < 0) {
			throw new ImportError('unrecognised', `The mapped column ${JSON.stringify(String(c.column))} is not in the file's header.`);
		}
		if (used.has(i)) {
			throw new ImportError('unrecognised', `The column ${JSON.stringify(header[i].trim())} is mapped twice.`);
		}
		used.add(i);
		const meaning = c.meaning;
		if (meaning === 'ignore') continue;
		if (typeof meaning === 'object') bands.push({ index: i, nm: meaning.band_nm });
		else if (meaning === 'spectrum') spectra.push({ index: i, label: header[i].trim() });
		else byMeaning.set(meaning, i);
	}
	const fmt = mappingFormat(m.columns.map((c) => c.meaning));
	if ('problem' in fmt) throw new ImportError('unrecognised', `The column mapping cannot be used: ${fmt.problem}.`);
	// Columns mapped to a quantity this layout does not use (x beside a complete cct, duv) count as unused.
	const relevant = new Set<string>([...(POINT_SETS.find((s) => s.format === fmt.format)?.needs ?? []), ...READING_FIELDS]);
	for (const [k, i] of byMeaning) {
		if (k !== 'wavelength' && !relevant.has(k)) {
			byMeaning.delete(k);
			used.delete(i);
		}
	}
	const unused = header.map((_, i) => i).filter((i) => !used.has(i) && header[i].trim() !== '');
	const fields: FieldColumns = {};
	for (const f of READING_FIELDS) if (byMeaning.has(f)) fields[f] = byMeaning.get(f);
	const base = { header, unused, spectral: m.units.spectral };
	const col = (k: NamedMeaning) => byMeaning.get(k)!;
	switch (fmt.format) {
		case 'wide_spectral': {
			const grid = checkBandGrid(bands, header);
			return { ...base, format: 'wide_spectral', bands: grid.bands, start: grid.start, interval: grid.interval, fields };
		}
		case 'long_spectral':
			return { ...base, format: 'long_spectral', wavelength: col('wavelength'), readings: spectra };
		case 'chromaticity_xy':
			return { ...base, format: 'chromaticity_xy', columns: { x: col('x'), y: col('y') }, fields };
		case 'chromaticity_uv_prime':
			return { ...base, format: 'chromaticity_uv_prime', columns: { u_prime: col('u_prime'), v_prime: col('v_prime') }, fields };
		case 'cct_duv':
			return { ...base, format: 'cct_duv', columns: { cct: col('cct'), duv: col('duv') }, fields };
		case 'tristimulus':
			return { ...base, format: 'tristimulus', columns: { X: col('X'), Y: col('Y'), Z: col('Z') }, fields };
		default:
			throw new ImportError('unrecognised', 'The column mapping cannot be used.');
	}
}

/** Wavelength columns in file order must rise (or fall) on one step of 1–10 nm. Returns them ascending. */
function checkBandGrid(bands: { index: number; nm: number }[], header: string[]) {
	const name = (b: { index: number }) => JSON.stringify(header[b.index].trim());
	const seen = new Map<number, { index: number }>();
	for (const b of bands) {
		const prev = seen.get(b.nm);
		if (prev) {
			throw new ImportError('unrecognised', `The wavelength ${b.nm} nm appears in two columns (${name(prev)} and ${name(b)}); keep one.`);
		}
		seen.set(b.nm, b);
	}
	const inFileOrder = [...bands].sort((a, b) => a.index - b.index);
	const rising = inFileOrder[1].nm > inFileOrder[0].nm;
	for (let k = 1; k < inFileOrder.length; k++) {
		const up = inFileOrder[k].nm > inFileOrder[k - 1].nm;
		if (up !== rising) {
			throw new ImportError(
				'unrecognised',
				`The wavelength columns are out of order: ${inFileOrder[k].nm} nm comes after ${inFileOrder[k - 1].nm} nm; they must rise (or fall) steadily.`
			);
		}
	}
	const sorted = [...bands].sort((a, b) => a.nm - b.nm);
	const interval = sorted[1].nm - sorted[0].nm;
	for (let k = 2; k < sorted.length; k++) {
		const step = sorted[k].nm - sorted[k - 1].nm;
		if (Math.abs(step - interval) > 1e-6) {
			throw new ImportError(
				'unrecognised',
				`The wavelength columns do not have a uniform step: ${fmtNm(interval)} nm up to ${sorted[k - 1].nm} nm, then ${fmtNm(step)} nm.`
			);
		}
	}
	if (interval < STEP_RANGE_NM.min - 1e-9 || interval > STEP_RANGE_NM.max + 1e-9) {
		throw new ImportError('unrecognised', `The wavelength step is ${fmtNm(interval)} nm; steps from 1 to 10 nm can be read.`);
	}
	return { bands: sorted, start: sorted[0].nm, interval: Number(interval.toFixed(6)) };
}

function fmtNm(v: number): string {
	return String(Number(v.toFixed(4)));
}
