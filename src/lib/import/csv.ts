/**
 * The importer's entry points: a whole file (`parseReadings`), chunk by chunk
 * (`createReadingsParser`), already-split rows (`parseRows`, `parseRowsAsync`; `readRecords`
 * splits without validating) and a look at the first rows with a guessed column mapping
 * (`previewReadings`).
 *
 * Text is cut into records with papaparse. To read chunk by chunk, complete records are found
 * first by a small quote-aware scan (a newline inside a quoted cell does not end a record), and
 * each run of complete records is handed to papaparse with the delimiter fixed, so a file gives the
 * same report however it is chunked.
 */
import Papa from 'papaparse';
import { assertNotBinary, ByteDecoder, SNIFF_CHARS } from './decode';
import { ImportError } from './errors';
import { guessMapping, resolveLayout, type ColumnMappingInput, type GuessedMapping } from './mapping';
import { ReadingsBuilder } from './rows';
import { DEFAULT_LIMITS, type Delimiter, type Encoding, type ImportFormat, type ImportLimits, type ParseReport, type SpectralUnit } from './types';

export interface ParseOptions {
	/** Read the columns this way instead of by our header rules (see `columnMappingSchema`). */
	mapping?: ColumnMappingInput;
	/** Scale of spectral values when no mapping gives one; default `relative`. */
	spectralScale?: SpectralUnit;
	limits?: Partial<ImportLimits>;
	/** Row errors listed in full before the rest are only counted; default 1000. */
	maxErrors?: number;
	/** Skip delimiter detection. */
	delimiter?: Delimiter;
}

export interface ReadingsParser {
	/** Feed bytes (or text) in order; throws `ImportError` as soon as the file is known unusable. */
	write(chunk: Uint8Array | string): void;
	/** No more input: the report, or `ImportError` (e.g. `empty`). */
	end(): ParseReport;
}

const DELIMITERS: Delimiter[] = [',', ';', '\t'];
const SNIFF_LINES = 20;
const QUOTE = 34;
const NEWLINE = 10;

function limitsOf(options: { limits?: Partial<ImportLimits> }): ImportLimits {
	return { ...DEFAULT_LIMITS, ...options.limits };
}

function size(bytes: number): string {
	if (bytes >= 1024 * 1024) return `${Number((bytes / (1024 * 1024)).toFixed(1))} MB`;
	if (bytes >= 1024) return `${Number((bytes / 1024).toFixed(1))} KB`;
	return `${bytes} bytes`;
}

function tooLarge(limit: number): ImportError {
	return new ImportError('too_large', `The file is over the size limit of ${size(limit)}.`);
}

/**
 * Picks the delimiter: the candidate that appears in the header line (outside quotes) and splits
 * the most following lines into as many cells as the header. Defaults to a comma.
 */
export function detectDelimiter(sample: string): Delimiter {
	const lines = sample.split('\n').filter((l) => l.trim() !== '').slice(0, SNIFF_LINES + 1);
	if (lines.length === 0) return ',';
	const count = (line: string, d: string) => {
		let n = 0;
		let quoted = false;
		for (const ch of line) {
			if (ch === '"') quoted = !quoted;
			else if (ch === d && !quoted) n++;
		}
		return n;
	};
	let best: Delimiter = ',';
	let bestScore = -1;
	for (const d of DELIMITERS) {
		const inHeader = count(lines[0], d);
		if (inHeader === 0) continue;
		const agree = lines.slice(1).filter((l) => count(l, d) === inHeader).length;
		const score = agree * 10000 + inHeader;
		if (score > bestScore) {
			best = d;
			bestScore = score;
		}
	}
	return best;
}

type RecordSink = (cells: string[], problem?: string) => void;

function papaProblem(e: Papa.ParseError): string {
	switch (e.code) {
		case 'MissingQuotes':
			return 'a quoted cell is not closed';
		case 'InvalidQuotes':
			return 'a quoted cell has a stray quote (inside quotes, write a quote as two quotes)';
		default:
			return e.message;
	}
}

/** Text in, records out; newlines normalised to \n; delimiter detected on the first lines. */
class RecordSplitter {
	delimiter: Delimiter | null;
	private buf = '';
	private scanned = 0;
	private state = 0; // 0 field start, 1 unquoted, 2 quoted, 3 quote seen inside quotes
	private heldCR = false;
	private sniffed = false;
	private lines = 0;
	stopped = false;

	constructor(
		private readonly sink: RecordSink,
		delimiter: Delimiter | undefined,
		private readonly onSniff: (sample: string) => void
	) {
		this.delimiter = delimiter ?? null;
	}

	feed(text: string) {
		if (this.stopped) return;
		if (this.heldCR) text = `\r${text}`;
		// A chunk ending in \r may be half of \r\n: hold it for the next chunk.
		this.heldCR = text.endsWith('\r');
		if (this.heldCR) text = text.slice(0, -1);
		const added = text.includes('\r') ? text.replace(/\r\n?/g, '\n') : text;
		this.buf += added;
		if (!this.sniffed && !this.sniffReady(added)) return;
		this.scan(false);
	}

	end() {
		if (this.heldCR) {
			this.heldCR = false;
			this.buf += '\n';
		}
		this.scan(true);
	}

	private sniffReady(added: string): boolean {
		for (let i = added.indexOf('\n'); i >= 0; i = added.indexOf('\n', i + 1)) this.lines++;
		return this.lines > SNIFF_LINES || this.buf.length >= SNIFF_CHARS * 8;
	}

	private scan(final: boolean) {
		if (this.stopped) return;
		if (!this.sniffed) {
			this.sniffed = true;
			const sample = this.buf.slice(0, SNIFF_CHARS * 8);
			this.onSniff(sample);
			if (this.delimiter === null) this.delimiter = detectDelimiter(sample);
		}
		const d = this.delimiter!.charCodeAt(0);
		const buf = this.buf;
		let state = this.state;
		let boundary = -1;
		// Without quotes ahead (the usual case), records end at every newline: skip the scan.
		if (state < 2 && buf.indexOf('"', this.scanned) < 0) {
			boundary = buf.lastIndexOf('\n');
			if (boundary >= this.scanned) {
				const last = buf.length > boundary + 1 ? buf.charCodeAt(buf.length - 1) : -1;
				state = last < 0 || last === d ? 0 : 1;
			} else {
				boundary = -1;
				for (let i = this.scanned; i < buf.length; i++) state = buf.charCodeAt(i) === d ? 0 : 1;
			}
			this.scanned = buf.length;
		}
		for (let i = this.scanned; i < buf.length; i++) {
			const c = buf.charCodeAt(i);
			switch (state) {
				case 0:
					if (c === QUOTE) state = 2;
					else if (c === NEWLINE) boundary = i;
					else if (c !== d) state = 1;
					break;
				case 1:
					if (c === d) state = 0;
					else if (c === NEWLINE) {
						boundary = i;
						state = 0;
					}
					break;
				case 2:
					if (c === QUOTE) state = 3;
					break;
				default:
					if (c === QUOTE) state = 2;
					else if (c === d) state = 0;
					else if (c === NEWLINE) {
						boundary = i;
						state = 0;
					} else state = 1;
			}
		}
		this.state = state;
		const cut = final ? buf.length : boundary + 1;
		this.buf = buf.slice(cut);
		// The state now describes the end of the buffer, so what is left has been scanned.
		this.scanned = this.buf.length;
		if (cut > 0) this.emit(buf.slice(0, cut));
	}

	private emit(segment: string) {
		if (segment === '') return;
		const result = Papa.parse<string[]>(segment, { delimiter: this.delimiter!, newline: '\n', quoteChar: '"', skipEmptyLines: false });
		const rows = result.data;
		if (segment.endsWith('\n') && rows.length > 0) {
			const last = rows[rows.length - 1];
			if (last.length === 1 && last[0] === '') rows.pop();
		}
		const problems = new Map<number, string>();
		for (const e of result.errors) {
			if (e.row !== undefined && e.row !== null && !problems.has(e.row)) problems.set(e.row, papaProblem(e));
		}
		for (let i = 0; i < rows.length && !this.stopped; i++) this.sink(rows[i], problems.get(i));
	}
}

/** A parser to feed chunk by chunk (server streams, browser workers). */
export function createReadingsParser(options: ParseOptions = {}): ReadingsParser {
	const limits = limitsOf(options);
	const decoder = new ByteDecoder();
	let bytes = 0;
	let mode: 'bytes' | 'text' | null = null;
	let builder: ReadingsBuilder | null = null;

	// The builder needs the delimiter and encoding, known once the first lines are in.
	const splitter = new RecordSplitter(
		(cells, problem) => {
			if (!builder) {
				builder = new ReadingsBuilder({
					mapping: options.mapping,
					spectralScale: options.spectralScale,
					limits,
					maxErrors: options.maxErrors,
					delimiter: splitter.delimiter ?? ',',
					encoding: mode === 'text' ? 'text' : decoder.encoding
				});
			}
			builder.push(cells, problem);
		},
		options.delimiter,
		assertNotBinary
	);

	const feedText = (text: string) => {
		if (text.includes('\u0000')) {
			throw new ImportError('binary', 'The file looks like binary data, not a text CSV (it contains NUL bytes).');
		}
		splitter.feed(text);
	};

	return {
		write(chunk) {
			const kind = typeof chunk === 'string' ? 'text' : 'bytes';
			if (mode && mode !== kind) throw new TypeError('Feed either bytes or text to one parser, not both.');
			const first = mode === null;
			mode = kind;
			bytes += chunk.length;
			if (bytes > limits.maxBytes) {
				throw tooLarge(limits.maxBytes);
			}
			if (typeof chunk === 'string') feedText(first && chunk.startsWith('\uFEFF') ? chunk.slice(1) : chunk);
			else feedText(decoder.write(chunk));
		},
		end() {
			if (mode !== 'text') {
				const rest = decoder.end();
				if (rest) feedText(rest);
			}
			splitter.end();
			if (!builder) throw new ImportError('empty', 'The file is empty.');
			const b: ReadingsBuilder = builder;
			// Decoder warnings (mixed encodings) can appear after the first records.
			for (const w of decoder.warnings) b.warn(w);
			return b.finish({ encoding: mode === 'text' ? 'text' : decoder.encoding });
		}
	};
}

/** A whole file at once: bytes as uploaded (encoding detected) or text. */
export function parseReadings(input: Uint8Array | ArrayBuffer | string, options: ParseOptions = {}): ParseReport {
	const limits = limitsOf(options);
	const data = input instanceof ArrayBuffer ? new Uint8Array(input) : input;
	if (data.length === 0) throw new ImportError('empty', 'The file is empty.');
	if (data.length > limits.maxBytes) {
		throw tooLarge(limits.maxBytes);
	}
	const parser = createReadingsParser(options);
	parser.write(data);
	return parser.end();
}

export interface RowsOptions extends Omit<ParseOptions, 'delimiter'> {
	/** Recorded in the report; the rows are already split. Default ','. */
	delimiter?: Delimiter;
	/** Recorded in the report. Default 'text'. */
	encoding?: Encoding;
	/** Per row (same index as `rows`), why the splitter could not read it cleanly; such rows are refused. */
	problems?: readonly (string | undefined)[];
	/** File-level warnings found while decoding (as `Records.warnings`), added to the report. */
	warnings?: readonly string[];
}

export interface Records {
	/** Every record, blank ones included, header first. */
	rows: string[][];
	/** Same index as `rows`: set where papaparse could not split the record cleanly. */
	problems: (string | undefined)[];
	delimiter: Delimiter;
	encoding: Encoding;
	warnings: string[];
}

/**
 * Decoding and splitting only, no validation: what `parseReadings` does before it reads the
 * columns. `parseRows(r.rows, r)` then gives the same report as `parseReadings`.
 */
export function readRecords(input: Uint8Array | ArrayBuffer | string, options: { limits?: Partial<ImportLimits>; delimiter?: Delimiter } = {}): Records {
	const limits = limitsOf(options);
	const data = input instanceof ArrayBuffer ? new Uint8Array(input) : input;
	if (data.length === 0) throw new ImportError('empty', 'The file is empty.');
	if (data.length > limits.maxBytes) throw tooLarge(limits.maxBytes);
	const rows: string[][] = [];
	const problems: (string | undefined)[] = [];
	const splitter = new RecordSplitter(
		(cells, problem) => {
			rows.push(cells);
			problems.push(problem);
		},
		options.delimiter,
		assertNotBinary
	);
	const decoder = new ByteDecoder();
	if (typeof data === 'string') {
		if (data.includes('\u0000')) throw new ImportError('binary', 'The file looks like binary data, not a text CSV (it contains NUL bytes).');
		splitter.feed(data.startsWith('\uFEFF') ? data.slice(1) : data);
	} else {
		splitter.feed(decoder.write(data));
		splitter.feed(decoder.end());
	}
	splitter.end();
	return {
		rows,
		problems,
		delimiter: splitter.delimiter ?? ',',
		encoding: typeof data === 'string' ? 'text' : decoder.encoding,
		warnings: [...decoder.warnings]
	};
}

function rowsBuilder(options: RowsOptions) {
	return new ReadingsBuilder({
		mapping: options.mapping,
		spectralScale: options.spectralScale,
		limits: limitsOf(options),
		maxErrors: options.maxErrors,
		delimiter: options.delimiter ?? ',',
		encoding: options.encoding ?? 'text'
	});
}

/** Rows split elsewhere (e.g. by papaparse in a browser worker): the first non-blank row is the header. */
export function parseRows(rows: Iterable<string[]>, options: RowsOptions = {}): ParseReport {
	const builder = rowsBuilder(options);
	let i = 0;
	for (const r of rows) builder.push(r, options.problems?.[i++]);
	for (const w of options.warnings ?? []) builder.warn(w);
	return builder.finish();
}

export async function parseRowsAsync(rows: AsyncIterable<string[]> | Iterable<string[]>, options: RowsOptions = {}): Promise<ParseReport> {
	const builder = rowsBuilder(options);
	let i = 0;
	for await (const r of rows) builder.push(r, options.problems?.[i++]);
	for (const w of options.warnings ?? []) builder.warn(w);
	return builder.finish();
}

export interface PreviewResult {
	header: string[];
	/** The first data rows as cells (blank rows left out). */
	rows: string[][];
	delimiter: Delimiter;
	encoding: Encoding;
	/** Whether any preview cell is a number written with a decimal comma (read in `;` files only). */
	decimalComma: boolean;
	/** The layout our header rules found, or null (then `problem` says why). */
	format: ImportFormat | null;
	/** Our guess at what each column means, as a starting point for a user's mapping. */
	mapping: GuessedMapping['mapping'];
	problem: string | null;
	unused: string[];
	warnings: string[];
}

/** The header, the first `rows` data rows, what was detected and a guessed mapping. Never validates rows. */
export function previewReadings(
	input: Uint8Array | ArrayBuffer | string,
	options: { rows?: number; limits?: Partial<ImportLimits>; delimiter?: Delimiter; spectralScale?: SpectralUnit } = {}
): PreviewResult {
	const limits = limitsOf(options);
	const want = options.rows ?? 10;
	const data = input instanceof ArrayBuffer ? new Uint8Array(input) : input;
	if (data.length === 0) throw new ImportError('empty', 'The file is empty.');
	if (data.length > limits.maxBytes) {
		throw tooLarge(limits.maxBytes);
	}
	let text: string;
	let encoding: Encoding;
	const decoder = new ByteDecoder();
	if (typeof data === 'string') {
		if (data.includes('\u0000')) throw new ImportError('binary', 'The file looks like binary data, not a text CSV (it contains NUL bytes).');
		text = data.startsWith('\uFEFF') ? data.slice(1) : data;
		encoding = 'text';
	} else {
		text = decoder.write(data) + decoder.end();
		encoding = decoder.encoding;
	}
	let header: string[] | null = null;
	const rows: string[][] = [];
	const splitter: RecordSplitter = new RecordSplitter(
		(cells) => {
			if (cells.every((c) => c.trim() === '')) return;
			if (!header) header = cells;
			else rows.push(cells);
			if (rows.length >= want) splitter.stopped = true;
		},
		options.delimiter,
		(sample) => assertNotBinary(sample)
	);
	const step = 64 * 1024;
	for (let i = 0; i < text.length && !splitter.stopped; i += step) splitter.feed(text.slice(i, i + step));
	splitter.end();
	if (!header) throw new ImportError('empty', 'The file is empty.');
	const h: string[] = header;
	if (h.length > limits.maxColumns) {
		throw new ImportError('too_many_columns', `The header has ${h.length.toLocaleString('en-GB')} columns; the limit is ${limits.maxColumns.toLocaleString('en-GB')}.`);
	}
	const delimiter = splitter.delimiter ?? ',';
	const guess = guessMapping(h, { decimalComma: delimiter === ';', spectral: options.spectralScale });
	let problem = guess.problem;
	let format = guess.format;
	if (!problem) {
		try {
			resolveLayout(h, guess.mapping);
		} catch (e) {
			if (!(e instanceof ImportError)) throw e;
			problem = e.message;
			format = null;
		}
	}
	const decimalComma = delimiter === ';' && rows.some((r) => r.some((c) => /^\s*[+-]?\d*,\d+(?:[eE][+-]?\d+)?\s*$/.test(c)));
	return { header: h, rows, delimiter, encoding, decimalComma, format, mapping: guess.mapping, problem, unused: guess.unused, warnings: [...decoder.warnings] };
}
