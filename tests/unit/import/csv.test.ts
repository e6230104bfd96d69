import { describe, expect, it } from 'vitest';
import {
	createReadingsParser,
	ImportError,
	parseReadings,
	parseRows,
	parseRowsAsync,
	previewReadings,
	readRecords,
	type ImportErrorCode,
	type ParsedReading,
	type ParseReport
} from '../../../src/lib/import';
import { chunks, csv, latin1, longFile, utf8, warmShape, wavelengths, wideFile, withBom } from './factories';

function refusal(fn: () => unknown): ImportError {
	try {
		fn();
	} catch (e) {
		if (e instanceof ImportError) return e;
		throw e;
	}
	throw new Error('expected an ImportError');
}

function expectRefused(fn: () => unknown, code: ImportErrorCode, message?: RegExp) {
	const e = refusal(fn);
	expect(e.code).toBe(code);
	if (message) expect(e.message).toMatch(message);
	// One sentence, no stack-like text.
	expect(e.message).not.toMatch(/\n|at \w+ \(/);
	return e;
}

const only = <K extends ParsedReading['kind']>(r: ParsedReading, kind: K) => {
	expect(r.kind).toBe(kind);
	return r as Extract<ParsedReading, { kind: K }>;
};

describe('wide spectral layout', () => {
	it('reads one spectrum per row with its optional columns', () => {
		const text = wideFile({
			extra: ['label', 'taken_at', 'meter', 'notes', 'lux'],
			rows: [
				{ extra: ['Key', '2026-03-01 21:30', 'Meter one', 'through the window', 850] },
				{ extra: ['Fill', '2026-03-01T21:35:10Z', '', '', ''] }
			]
		});
		const report = parseReadings(utf8(text));
		expect(report.format).toBe('wide_spectral');
		expect(report.delimiter).toBe(',');
		expect(report.encoding).toBe('utf-8');
		expect(report.errors).toEqual([]);
		expect(report.readings).toHaveLength(2);
		const [key, fill] = report.readings.map((r) => only(r, 'spectral'));
		expect(key).toMatchObject({ row: 1, label: 'Key', taken_at: '2026-03-01T21:30', meter: 'Meter one', notes: 'through the window', lux: 850 });
		expect(key.spectrum).toMatchObject({ start: 380, interval: 5, scale: 'relative' });
		expect(key.spectrum.values).toHaveLength(81);
		expect(key.spectrum.values[0]).toBeCloseTo(warmShape(380), 10);
		expect(key.spectrum.values[80]).toBeCloseTo(warmShape(780), 10);
		expect(fill).toMatchObject({ row: 2, label: 'Fill', taken_at: '2026-03-01T21:35:10Z' });
		expect(fill.meter).toBeUndefined();
		expect(fill.lux).toBeUndefined();
	});

	it.each([
		['380nm', (nm: number) => `${nm}nm`],
		['380 nm', (nm: number) => ` ${nm} nm `],
		['380.0', (nm: number) => nm.toFixed(1)],
		['380 NM', (nm: number) => `${nm} NM`]
	])('reads wavelength headers written like %s', (_, headerOf) => {
		const report = parseReadings(wideFile({ headerOf }));
		expect(report.format).toBe('wide_spectral');
		expect(report.readings).toHaveLength(1);
	});

	it.each([1, 2, 2.5, 10])('accepts a uniform %s nm step', (step) => {
		const report = parseReadings(wideFile({ nm: wavelengths(380, 780, step) }));
		expect(only(report.readings[0], 'spectral').spectrum.interval).toBe(step);
	});

	it('reads wavelength columns that run from long to short', () => {
		const nm = wavelengths().reverse();
		const report = parseReadings(wideFile({ nm }));
		const s = only(report.readings[0], 'spectral').spectrum;
		expect(s.start).toBe(380);
		expect(s.values[0]).toBeCloseTo(warmShape(380), 10);
	});

	it('labels default to "Reading <row>" and are kept as plain text', () => {
		const text = wideFile({ extra: ['label'], rows: [{ extra: [''] }, { extra: ['=cmd|calc <b>x</b> ${1}'] }] });
		const report = parseReadings(text);
		expect(report.readings.map((r) => r.label)).toEqual(['Reading 1', '=cmd|calc <b>x</b> ${1}']);
	});

	it('reports each bad cell with row, column and reason, and keeps the good rows', () => {
		const nm = wavelengths();
		const good = nm.map(warmShape);
		const at = (i: number, v: string) => good.map((g, k) => (k === i ? v : g));
		const text = wideFile({
			extra: ['label'],
			rows: [
				{ extra: ['ok 1'] },
				{ extra: ['nan'], values: at(34, 'NaN') },
				{ extra: ['neg'], values: at(2, '-5') },
				{ extra: ['huge'], values: at(40, '1e12') },
				{ extra: ['empty'], values: at(10, '') },
				{ extra: ['text'], values: at(11, 'abc') },
				{ extra: ['inf'], values: at(12, '1e999') },
				{ extra: ['ok 2'] }
			]
		});
		const report = parseReadings(text);
		expect(report.readings.map((r) => [r.row, r.label])).toEqual([
			[1, 'ok 1'],
			[8, 'ok 2']
		]);
		expect(report.errors).toEqual([
			{ row: 2, column: '550', message: 'row 2: 550 nm = NaN is not a number (no value)' },
			{ row: 3, column: '390', message: 'row 3: 390 nm = -5 is negative' },
			{ row: 4, column: '580', message: 'row 4: 580 nm = 1e12 is implausibly large (over 1e9)' },
			{ row: 5, column: '430', message: 'row 5: 430 nm is empty' },
			{ row: 6, column: '435', message: 'row 6: 435 nm = "abc" is not a number' },
			{ row: 7, column: '440', message: 'row 7: 440 nm = 1e999 is not a finite number' }
		]);
	});

	it('passes negative noise within 0.1 % of the peak to the colour core, which clips it and says so', () => {
		const nm = wavelengths();
		const values = nm.map((n, k) => (k === 0 ? -0.05 : warmShape(n)));
		const report = parseReadings(wideFile({ rows: [{ values }] }));
		expect(report.errors).toEqual([]);
		const r = only(report.readings[0], 'spectral');
		expect(r.spectrum.values[0]).toBe(0);
		expect(r.warnings.join(' ')).toMatch(/negative/);
	});

	it('refuses a row whose values are all zero', () => {
		const report = parseReadings(wideFile({ rows: [{ values: wavelengths().map(() => 0) }, {}] }));
		expect(report.readings.map((r) => r.row)).toEqual([2]);
		expect(report.errors).toEqual([{ row: 1, column: null, message: 'row 1: every spectral value is 0 or below' }]);
	});

	it('reports a spectrum too short for the colour core as a row error', () => {
		const report = parseReadings(wideFile({ nm: wavelengths(450, 650, 5) }));
		expect(report.readings).toEqual([]);
		expect(report.errors).toHaveLength(1);
		expect(report.errors[0]).toMatchObject({ row: 1, column: null });
		expect(report.errors[0].message).toMatch(/^row 1: too short a range/);
	});

	it('warns (through the colour core) when 380–780 nm is not fully covered', () => {
		const report = parseReadings(wideFile({ nm: wavelengths(400, 700, 5) }));
		expect(report.readings).toHaveLength(1);
		expect(report.readings[0].warnings.join(' ')).toMatch(/400–700 nm/);
	});

	it('reports ragged rows, but accepts a trailing delimiter on every line', () => {
		const nm = wavelengths();
		const header = ['label', ...nm];
		const row = (label: string) => [label, ...nm.map(warmShape)];
		const text = csv([header, row('ok'), row('short').slice(0, 50), [...row('long'), 7], [...row('trailing'), '']]);
		const report = parseReadings(text);
		expect(report.readings.map((r) => r.label)).toEqual(['ok', 'trailing']);
		expect(report.errors).toEqual([
			{ row: 2, column: null, message: 'row 2: has 50 cells, the header has 82' },
			{ row: 3, column: null, message: 'row 3: has 83 cells, the header has 82' }
		]);
		const trailing = csv([[...header, ''], [...row('a'), ''], [...row('b'), '']]);
		expect(parseReadings(trailing).readings).toHaveLength(2);
	});

	it.each([
		['duplicated', [380, 385, 385, 390, 395], /385 nm appears in two columns/],
		['unsorted', [380, 390, 385, 395, 400], /out of order: 385 nm comes after 390 nm/],
		['non-uniform', [380, 385, 390, 400, 410], /uniform step: 5 nm up to 390 nm, then 10 nm/],
		['too coarse', [380, 400, 420, 440], /step is 20 nm; steps from 1 to 10 nm/]
	])('refuses %s wavelength columns with a clear message', (_, nm, message) => {
		expectRefused(() => parseReadings(wideFile({ nm: nm as number[] })), 'unrecognised', message);
	});

	it('uses absolute W/m²/nm when asked', () => {
		const report = parseReadings(wideFile({}), { spectralScale: 'W/m²/nm' });
		expect(only(report.readings[0], 'spectral').spectrum.scale).toBe('absolute');
	});

	it('lists unused columns in a warning', () => {
		const report = parseReadings(wideFile({ extra: ['label', 'fixture'], rows: [{ extra: ['a', 'b'] }] }));
		expect(report.warnings).toContain('Column not used: "fixture".');
	});

	it('keeps a reading whose date cannot be read, with a warning', () => {
		const report = parseReadings(wideFile({ extra: ['taken_at'], rows: [{ extra: ['01/03/2026'] }, { extra: ['2026-02-30'] }] }));
		expect(report.readings).toHaveLength(2);
		expect(report.readings[0].taken_at).toBeUndefined();
		expect(report.readings[0].warnings[0]).toMatch(/not an ISO 8601 date/);
		expect(report.readings[1].taken_at).toBeUndefined();
	});
});

describe('long spectral layout', () => {
	it('reads one reading per column, labelled by its header', () => {
		const report = parseReadings(longFile(['Key', 'Practical']));
		expect(report.format).toBe('long_spectral');
		expect(report.errors).toEqual([]);
		expect(report.readings.map((r) => [r.row, r.column, r.label])).toEqual([
			[1, 'Key', 'Key'],
			[2, 'Practical', 'Practical']
		]);
		const p = only(report.readings[1], 'spectral');
		expect(p.spectrum).toMatchObject({ start: 380, interval: 5 });
		expect(p.spectrum.values[10]).toBeCloseTo(warmShape(430) * 2, 10);
	});

	it.each(['wavelength', 'Wavelength_nm', ' NM ', 'wavelength (nm)'])('recognises the wavelength column named %s', (name) => {
		const text = longFile(['a']).replace('wavelength_nm', name);
		expect(parseReadings(text).format).toBe('long_spectral');
	});

	it('reads wavelengths that fall, in reverse, with a warning', () => {
		const report = parseReadings(longFile(['a'], wavelengths().reverse()));
		const s = only(report.readings[0], 'spectral').spectrum;
		expect(s.start).toBe(380);
		expect(s.values[0]).toBeCloseTo(warmShape(380), 10);
		expect(report.warnings).toContain('Wavelengths run from long to short; they were read in reverse order.');
	});

	it('reports a duplicated wavelength row and still builds the spectra when the rest is uniform', () => {
		const nm = [...wavelengths(), 780];
		const report = parseReadings(longFile(['a'], nm));
		expect(report.errors).toEqual([{ row: 82, column: 'wavelength_nm', message: 'row 82: wavelength 780 nm repeats row 81' }]);
		expect(report.readings).toHaveLength(1);
	});

	it('reports an out-of-order wavelength row', () => {
		const nm = wavelengths();
		nm.splice(3, 0, 382);
		const report = parseReadings(longFile(['a'], nm));
		expect(report.errors).toEqual([
			{ row: 4, column: 'wavelength_nm', message: 'row 4: wavelength 382 nm is out of order (after 390 nm on row 3); wavelengths must rise steadily' }
		]);
		expect(report.readings).toHaveLength(1);
	});

	it('builds no spectrum when the step is not uniform, and says where it breaks', () => {
		const nm = wavelengths().filter((n) => n !== 500);
		const report = parseReadings(longFile(['a', 'b'], nm));
		expect(report.readings).toEqual([]);
		expect(report.errors).toEqual([
			{ row: 25, column: 'wavelength_nm', message: 'row 25: wavelength 505 nm breaks the 5 nm step (after 495 nm), so no spectrum could be built' }
		]);
	});

	it('leaves out only the reading with a bad cell, naming it', () => {
		const report = parseReadings(longFile(['good', 'bad'], wavelengths(), (n, j) => (j === 1 && n === 600 ? 'n/a' : warmShape(n))));
		expect(report.readings.map((r) => r.label)).toEqual(['good']);
		expect(report.errors).toEqual([{ row: 45, column: 'bad', message: 'row 45: bad = n/a is not a number (no value) (reading "bad" left out)' }]);
	});

	it('lets a reading cover part of the range (empty cells at its ends are not errors)', () => {
		const report = parseReadings(longFile(['full', 'part'], wavelengths(), (n, j) => (j === 1 && (n < 400 || n > 760) ? '' : warmShape(n))));
		expect(report.errors).toEqual([]);
		const part = only(report.readings[1], 'spectral');
		expect(part.spectrum.start).toBe(400);
		expect(part.warnings.join(' ')).toMatch(/400–760 nm/);
	});

	it('reports a negative value and an empty cell inside the range', () => {
		const report = parseReadings(
			longFile(['neg', 'gap'], wavelengths(), (n, j) => (j === 0 && n === 700 ? -4 : j === 1 && n === 500 ? '' : warmShape(n)))
		);
		expect(report.readings).toEqual([]);
		expect(report.errors).toEqual([
			{ row: 25, column: 'gap', message: 'row 25: gap is empty (reading "gap" left out)' },
			{ row: 65, column: 'neg', message: 'row 65: neg = -4 is negative (reading "neg" left out)' }
		]);
	});

	it('reports a bad wavelength cell', () => {
		const nm: (number | string)[] = wavelengths();
		const text = longFile(['a'], nm as number[]).replace('\n780,', '\nabc,');
		const report = parseReadings(text);
		expect(report.errors).toEqual([{ row: 81, column: 'wavelength_nm', message: 'row 81: wavelength_nm = "abc" is not a number' }]);
		expect(report.readings).toHaveLength(1);
	});
});

describe('chromaticity, CCT + Duv and tristimulus layouts', () => {
	it('reads x, y with optional columns', () => {
		const text = csv([
			['Label', ' x ', 'Y', 'lux', 'meter', 'notes', 'taken_at'],
			['Sodium window', '0.5', '0.41', '12', 'M1', 'street', '2026-03-01'],
			['House lights', '0.45', '0.41', '', '', '', '']
		]);
		const report = parseReadings(text);
		expect(report.format).toBe('chromaticity_xy');
		expect(report.errors).toEqual([]);
		expect(report.readings[0]).toEqual({
			row: 1,
			label: 'Sodium window',
			kind: 'chromaticity_xy',
			x: 0.5,
			y: 0.41,
			lux: 12,
			meter: 'M1',
			notes: 'street',
			taken_at: '2026-03-01',
			warnings: []
		});
	});

	it('reports values outside their ranges in the house wording', () => {
		const text = csv([
			['label', 'x', 'y', 'lux'],
			['a', '0.3', '0.3', ''],
			['b', '1.4', '0.3', ''],
			['c', '0.6', '0.6', ''],
			['d', '0.3', '0', ''],
			['e', '0.3', '0.3', '-2'],
			['f', '', '0.3', '']
		]);
		const report = parseReadings(text);
		expect(report.readings.map((r) => r.label)).toEqual(['a']);
		expect(report.errors).toEqual([
			{ row: 2, column: 'x', message: 'row 2: x = 1.4 is outside 0–1' },
			{ row: 3, column: 'y', message: 'row 3: x + y = 1.2 is over 1' },
			{ row: 4, column: 'y', message: 'row 4: y = 0 is outside 0–1 (it must be above 0)' },
			{ row: 5, column: 'lux', message: 'row 5: lux = -2 is negative' },
			{ row: 6, column: 'x', message: 'row 6: x is empty' }
		]);
	});

	it.each([
		['u_prime', 'v_prime'],
		["u'", "v'"],
		['U’', 'V’']
	])('reads u′v′ from columns %s, %s', (u, v) => {
		const report = parseReadings(csv([[u, v], ['0.2', '0.47']]));
		expect(report.format).toBe('chromaticity_uv_prime');
		expect(report.readings[0]).toMatchObject({ kind: 'chromaticity_uv_prime', u_prime: 0.2, v_prime: 0.47 });
	});

	it('reads cct and duv, refusing a Duv typed a thousand times too big', () => {
		const report = parseReadings(csv([['label', 'CCT', 'Duv'], ['tube', '4100', '0.004'], ['typo', '4100', '4'], ['cold', '500', '0']]));
		expect(report.format).toBe('cct_duv');
		expect(report.readings[0]).toMatchObject({ kind: 'cct_duv', cct_k: 4100, duv: 0.004 });
		expect(report.errors).toEqual([
			{ row: 2, column: 'Duv', message: 'row 2: Duv = 4 is outside −0.05 to 0.05 (Duv is small, e.g. 0.003)' },
			{ row: 3, column: 'CCT', message: 'row 3: CCT = 500 is outside 1000–100000 K' }
		]);
	});

	it('says what is missing when cct comes without duv', () => {
		expectRefused(() => parseReadings(csv([['cct'], ['3200']])), 'unrecognised', /cct is mapped but duv is not/);
	});

	it('reads X, Y, Z as tristimulus, and refuses negatives and a zero Y', () => {
		const report = parseReadings(csv([['X', 'Y', 'Z'], ['95.047', '100', '108.883'], ['-1', '2', '3'], ['0', '0', '0']]));
		expect(report.format).toBe('tristimulus');
		expect(report.readings[0]).toMatchObject({ kind: 'tristimulus', X: 95.047, Y: 100, Z: 108.883 });
		expect(report.errors).toEqual([
			{ row: 2, column: 'X', message: 'row 2: X = -1 is negative' },
			{ row: 3, column: 'Y', message: 'row 3: Y = 0 is not above 0 (a light has Y > 0)' }
		]);
	});

	it('decides x/y against X/Y/Z by the presence of a z column, whatever the case', () => {
		expect(parseReadings(csv([['x', 'y', 'z'], ['1', '2', '3']])).format).toBe('tristimulus');
		expect(parseReadings(csv([['X', 'Y'], ['0.3', '0.3']])).format).toBe('chromaticity_xy');
		// xyY: lower-case y is chromaticity, upper-case Y is luminance and not used.
		const xyY = parseReadings(csv([['x', 'y', 'Y'], ['0.3127', '0.329', '100']]));
		expect(xyY.format).toBe('chromaticity_xy');
		expect(xyY.readings[0]).toMatchObject({ x: 0.3127, y: 0.329 });
		expect(xyY.warnings).toContain('Column not used: "Y".');
	});

	it('prefers one kind of reading when a meter export has several, and says which columns it left', () => {
		const report = parseReadings(csv([['x', 'y', 'cct', 'duv'], ['0.3127', '0.329', '6504', '0.003']]));
		expect(report.format).toBe('chromaticity_xy');
		expect(report.warnings).toContain('Columns not used: "cct", "duv".');
	});
});

describe('delimiters, decimal commas and encodings', () => {
	const rows = [
		['label', 'x', 'y'],
		['A', '0,44758', '0,40745']
	];

	it('detects semicolons and reads decimal commas there', () => {
		const report = parseReadings(csv(rows, ';'));
		expect(report.delimiter).toBe(';');
		expect(report.decimalComma).toBe(true);
		expect(report.readings[0]).toMatchObject({ x: 0.44758, y: 0.40745 });
	});

	it('reads decimal commas in wavelength headers and values of a semicolon file', () => {
		const nm = wavelengths();
		const text = csv([nm.map((n) => `${n},0`), nm.map((n) => String(warmShape(n)).replace('.', ','))], ';');
		const report = parseReadings(text);
		expect(report.decimalComma).toBe(true);
		expect(only(report.readings[0], 'spectral').spectrum.values[1]).toBeCloseTo(warmShape(385), 10);
	});

	it('refuses a decimal comma outside semicolon files with a reason', () => {
		const report = parseReadings(csv([['label', 'x', 'y'], ['A', '"0,44758"', '0.40745']]));
		expect(report.errors[0].message).toBe('row 1: x = 0,44758 uses a decimal comma, which is read only in semicolon-separated files');
	});

	it('detects tabs', () => {
		const report = parseReadings(csv([['label', 'x', 'y'], ['Key, warm', '0.4', '0.4']], '\t'));
		expect(report.delimiter).toBe('\t');
		expect(report.readings[0].label).toBe('Key, warm');
	});

	it('reads quoted cells with delimiters, quotes and line breaks inside', () => {
		const text = 'label,x,y,notes\n"Key, ""hard""",0.4,0.4,"two\nlines"\nFill,0.3,0.3,\n';
		const report = parseReadings(text);
		expect(report.readings.map((r) => [r.row, r.label, r.notes])).toEqual([
			[1, 'Key, "hard"', 'two lines'],
			[2, 'Fill', undefined]
		]);
	});

	it('reports an unclosed quote as a row error', () => {
		const report = parseReadings('label,x,y\nA,0.3,0.3\n"B,0.3,0.3\n');
		expect(report.readings).toHaveLength(1);
		expect(report.errors).toEqual([{ row: 2, column: null, message: 'row 2: a quoted cell is not closed' }]);
	});

	it('reads CRLF and old-Mac CR line ends and counts blank lines as rows', () => {
		for (const eol of ['\r\n', '\r']) {
			const report = parseReadings(utf8(csv([['label', 'x', 'y'], ['A', '0.3', '0.3'], [''], ['B', '0.31', '0.32']], ',', eol)));
			expect(report.readings.map((r) => [r.row, r.label])).toEqual([
				[1, 'A'],
				[3, 'B']
			]);
		}
	});

	it('strips a UTF-8 byte order mark', () => {
		const report = parseReadings(withBom(utf8(csv(rows, ';'))));
		expect(report.encoding).toBe('utf-8-bom');
		expect(report.format).toBe('chromaticity_xy');
	});

	it('reads UTF-8 labels', () => {
		const report = parseReadings(utf8(csv([['label', 'x', 'y'], ['Façade — est', '0.3', '0.3']])));
		expect(report.encoding).toBe('utf-8');
		expect(report.readings[0].label).toBe('Façade — est');
	});

	it('falls back to Latin-1 when the bytes are not UTF-8 (Façade with ç as 0xE7)', () => {
		const bytes = latin1(csv([['label', 'x', 'y'], ['Façade', '0.3', '0.3']]));
		expect(bytes).toContain(0xe7);
		const report = parseReadings(bytes);
		expect(report.encoding).toBe('latin1');
		expect(report.readings[0].label).toBe('Façade');
	});
});

describe('files that cannot be used', () => {
	it('refuses empty and blank files', () => {
		expectRefused(() => parseReadings(new Uint8Array(0)), 'empty', /^The file is empty\.$/);
		expectRefused(() => parseReadings(' \n\n\t\n'), 'empty', /^The file is empty\.$/);
		expectRefused(() => parseReadings(withBom(new Uint8Array(0))), 'empty');
		expectRefused(() => parseReadings('label,x,y\n\n'), 'empty', /header line but no data rows/);
	});

	it('refuses binary data', () => {
		const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d, 0x49, 0x48, 0x44, 0x52]);
		expectRefused(() => parseReadings(png), 'binary', /NUL bytes/);
		const controls = Uint8Array.from({ length: 200 }, (_, i) => (i % 3 === 0 ? 0x01 : 0x41));
		expectRefused(() => parseReadings(controls), 'binary', /control characters/);
	});

	it('refuses UTF-16 with a way out', () => {
		expectRefused(() => parseReadings(new Uint8Array([0xff, 0xfe, 0x78, 0x00])), 'binary');
		expectRefused(() => parseReadings(new Uint8Array([0xff, 0xfe, 0x78, 0x01, 0x2c, 0x01])), 'unrecognised', /UTF-16/);
	});

	it('refuses files over the size, row and column limits', () => {
		const text = csv([['label', 'x', 'y'], ...Array.from({ length: 20 }, (_, i) => [`r${i}`, '0.3', '0.3'])]);
		expectRefused(() => parseReadings(text, { limits: { maxBytes: 100 } }), 'too_large', /^The file is over the size limit of 100 bytes\.$/);
		expectRefused(() => parseReadings(text, { limits: { maxRows: 10 } }), 'too_many_rows', /more than 10 data rows/);
		expectRefused(() => parseReadings(wideFile({}), { limits: { maxColumns: 50 } }), 'too_many_columns', /81 columns; the limit is 50/);
	});

	// 50,001 rows and 20 MB: allow for a busy machine.
	it('has the stated default limits', { timeout: 60_000 }, () => {
		const rows = ['x,y', ...Array.from({ length: 50_001 }, () => '0.3,0.3')].join('\n');
		expectRefused(() => parseReadings(rows), 'too_many_rows', /more than 50,000 data rows/);
		const wide = csv([Array.from({ length: 2001 }, (_, i) => `c${i}`), ['1']]);
		expectRefused(() => parseReadings(wide), 'too_many_columns', /2,001 columns; the limit is 2,000/);
		const big = new Uint8Array(20 * 1024 * 1024 + 1).fill(0x41);
		expectRefused(() => parseReadings(big), 'too_large', /size limit of 20 MB/);
	});

	it('refuses unrecognisable columns, naming what it found', () => {
		const e = expectRefused(() => parseReadings(csv([['date', 'fixture', 'reading_a'], ['1', '2', '3']])), 'unrecognised');
		expect(e.message).toBe(
			'No recognisable columns (found: date, fixture, reading_a): expected wavelengths such as 380, 385, … or a wavelength column, or x and y, u_prime and v_prime, cct and duv, or X, Y and Z.'
		);
		expectRefused(() => parseReadings('hello world\nthis is prose\n'), 'unrecognised');
	});
});

describe('column mappings for other layouts', () => {
	const text = csv([
		['Name', 'CIE x (2°)', 'CIE y (2°)', 'Lx', 'Remarks'],
		['Key', '0.4476', '0.4074', '1200', 'warm'],
		['Fill', '2', '0.4074', '', '']
	]);

	it('reads a layout by the mapping, by header or by 0-based position', () => {
		expectRefused(() => parseReadings(text), 'unrecognised');
		const report = parseReadings(text, {
			mapping: {
				columns: [
					{ column: 'name', meaning: 'label' },
					{ column: 1, meaning: 'x' },
					{ column: 'CIE y (2°)', meaning: 'y' },
					{ column: 'Lx', meaning: 'lux' },
					{ column: 'Remarks', meaning: 'ignore' }
				]
			}
		});
		expect(report.format).toBe('chromaticity_xy');
		expect(report.warnings).toEqual([]);
		expect(report.readings).toEqual([{ row: 1, label: 'Key', kind: 'chromaticity_xy', x: 0.4476, y: 0.4074, lux: 1200, warnings: [] }]);
		expect(report.errors).toEqual([{ row: 2, column: 'CIE x (2°)', message: 'row 2: CIE x (2°) = 2 is outside 0–1' }]);
	});

	it('maps band columns at given wavelengths, in W/m²/nm', () => {
		const nm = wavelengths();
		const file = csv([['id', ...nm.map((_, i) => `ch${i}`)], ['1', ...nm.map((n) => warmShape(n) / 1000)]]);
		const report = parseReadings(file, {
			mapping: { columns: [{ column: 'id', meaning: 'label' }, ...nm.map((n, i) => ({ column: `ch${i}`, meaning: { band_nm: n } }))], units: { wavelength: 'nm', spectral: 'W/m2/nm' } }
		});
		const r = only(report.readings[0], 'spectral');
		expect(r.label).toBe('1');
		expect(r.spectrum.scale).toBe('absolute');
	});

	it('maps a long layout', () => {
		const file = longFile(['k1', 'k2']).replace('wavelength_nm', 'lambda_x');
		const report = parseReadings(file, { mapping: { columns: [{ column: 'lambda_x', meaning: 'wavelength' }, { column: 'k2', meaning: 'spectrum' }] } });
		expect(report.readings.map((r) => r.label)).toEqual(['k2']);
		expect(report.warnings).toEqual(['Column not used: "k1".']);
	});

	it('refuses a mapping that names a missing column or an impossible layout', () => {
		expectRefused(() => parseReadings(text, { mapping: { columns: [{ column: 'nope', meaning: 'x' }, { column: 2, meaning: 'y' }] } }), 'unrecognised', /"nope" is not in the file's header/);
		expectRefused(() => parseReadings(text, { mapping: { columns: [{ column: 1, meaning: 'x' }] } }), 'unrecognised', /x is mapped but y is not/);
	});
});

describe('chunk by chunk, rows and preview', () => {
	const file = utf8(
		`${wideFile({ extra: ['label', 'notes'], rows: [{ extra: ['Façade', '"multi\nline, quoted"'] }, { extra: ['b', ''] }, { extra: ['c', 'x'] }] })}`.replace(/\n/g, '\r\n')
	);

	it('gives the same report however the bytes are chunked', () => {
		const whole = parseReadings(file);
		expect(whole.readings).toHaveLength(3);
		expect(whole.readings[0].notes).toBe('multi line, quoted');
		for (const sizes of [[1], [2, 3], [7], [4096], [1, 1000, 3]]) {
			const p = createReadingsParser();
			for (const c of chunks(file, sizes)) p.write(c);
			const r: ParseReport = p.end();
			expect(r).toEqual(whole);
		}
	});

	it('reports Latin-1 when the first non-UTF-8 byte arrives late in a stream, as for the whole file', () => {
		const bytes = latin1(csv([['label', 'x', 'y'], ...Array.from({ length: 40 }, (_, i) => [`r${i}`, '0.3', '0.3']), ['Façade', '0.3', '0.3']]));
		const whole = parseReadings(bytes);
		expect(whole.encoding).toBe('latin1');
		const p = createReadingsParser();
		for (const c of chunks(bytes, [64])) p.write(c);
		expect(p.end()).toEqual(whole);
	});

	it('decodes a multi-byte character split across chunks', () => {
		const bytes = utf8(csv([['label', 'x', 'y'], ['Façade', '0.3', '0.3']]));
		const at = bytes.indexOf(0xc3);
		const p = createReadingsParser();
		p.write(bytes.subarray(0, at + 1));
		p.write(bytes.subarray(at + 1));
		expect(p.end().readings[0].label).toBe('Façade');
	});

	it('accepts text chunks too', () => {
		const text = csv([['label', 'x', 'y'], ['a', '0.3', '0.3']]);
		const p = createReadingsParser();
		for (const ch of text) p.write(ch);
		expect(p.end()).toEqual(parseReadings(text));
	});

	it('stops early when a stream is too large', () => {
		const p = createReadingsParser({ limits: { maxBytes: 10 } });
		p.write(utf8('x,y\n'));
		expectRefused(() => p.write(utf8('0.3,0.3\n0.3,0.3\n')), 'too_large');
	});

	it('reads rows split elsewhere, sync and async', async () => {
		const rows = [['x', 'y'], [], ['0.3', '0.3'], ['2', '0.3']];
		const r = parseRows(rows, { delimiter: ';' });
		expect(r.delimiter).toBe(';');
		expect(r.readings.map((x) => x.row)).toEqual([2]);
		expect(r.errors[0].row).toBe(3);
		async function* gen() {
			for (const row of rows) yield row;
		}
		expect(await parseRowsAsync(gen(), { delimiter: ';' })).toEqual(r);
	});

	it('splits without validating (readRecords), and parseRows on that equals parseReadings', () => {
		for (const input of [latin1(csv([['label', 'x', 'y'], ['Façade', '0,3', '0,3'], ['"open', '1', '1']], ';')), file, 'x,y\n\n0.3,0.3\n']) {
			const r = readRecords(input);
			expect(parseRows(r.rows, r)).toEqual(parseReadings(input));
		}
		const r = readRecords('a;b\n1;2\n');
		expect(r).toEqual({ rows: [['a', 'b'], ['1', '2']], problems: [undefined, undefined], delimiter: ';', encoding: 'text', warnings: [] });
	});

	it('previews the first rows with what was detected and a guessed mapping', () => {
		const text = csv([['label', 'x', 'y', 'fixture'], ...Array.from({ length: 30 }, (_, i) => [`r${i}`, '0,3', '0,3', 'f'])], ';');
		const p = previewReadings(latin1(text), { rows: 5 });
		expect(p.header).toEqual(['label', 'x', 'y', 'fixture']);
		expect(p.rows).toHaveLength(5);
		expect(p.delimiter).toBe(';');
		expect(p.encoding).toBe('utf-8');
		expect(p.decimalComma).toBe(true);
		expect(p.format).toBe('chromaticity_xy');
		expect(p.problem).toBeNull();
		expect(p.unused).toEqual(['fixture']);
		expect(p.mapping.columns).toEqual([
			{ column: 'label', meaning: 'label' },
			{ column: 'x', meaning: 'x' },
			{ column: 'y', meaning: 'y' }
		]);
	});

	it('previews an unknown layout with the reason, and a mapping from the preview parses it', () => {
		const text = csv([['when', 'chroma_x', 'chroma_y'], ['today', '0.31', '0.32']]);
		const p = previewReadings(text);
		expect(p.format).toBeNull();
		expect(p.problem).toMatch(/^No recognisable columns/);
		const mapping = { columns: [{ column: p.header[1], meaning: 'x' as const }, { column: p.header[2], meaning: 'y' as const }] };
		expect(parseReadings(text, { mapping }).readings[0]).toMatchObject({ x: 0.31, y: 0.32 });
	});

	it('previews a wide header with a wavelength problem, reporting it instead of throwing', () => {
		const p = previewReadings(wideFile({ nm: [380, 385, 385, 390] }));
		expect(p.format).toBeNull();
		expect(p.problem).toMatch(/385 nm appears in two columns/);
	});

	it('refuses to preview empty or binary files', () => {
		expectRefused(() => previewReadings(''), 'empty');
		expectRefused(() => previewReadings(new Uint8Array([1, 0, 2])), 'binary');
	});
});
