import fc from 'fast-check';
import { describe, expect, it, vi } from 'vitest';
import { createReadingsParser, ImportError, parseReadings, previewReadings, type ParseReport } from '../../../src/lib/import';
import { chunks, utf8, wavelengths } from './factories';

// Hundreds of generated files per property: allow for a busy machine.
vi.setConfig({ testTimeout: 60_000 });

type Outcome = { report: ParseReport } | { refused: string };

/** Either a report or an ImportError; anything else thrown fails the property. */
function outcome(run: () => ParseReport): Outcome {
	try {
		return { report: run() };
	} catch (e) {
		if (e instanceof ImportError) return { refused: e.code };
		throw e;
	}
}

function wellFormed(report: ParseReport) {
	for (const r of report.readings) {
		expect(Number.isInteger(r.row) && r.row >= 1).toBe(true);
		expect(typeof r.label).toBe('string');
	}
	for (const e of report.errors) {
		expect(Number.isInteger(e.row) && e.row >= 0).toBe(true);
		expect(e.message).toMatch(/^(row \d+: |"|[^\n]+: )/);
		expect(e.message).not.toContain('\n');
	}
}

const tokens = [
	'x', 'y', 'z', 'X', 'Y', 'Z', 'label', 'lux', 'cct', 'duv', "u'", "v'", 'wavelength', 'nm', '380', '385', '390', '400',
	'0.3', '0,3', '-1', '1e12', 'NaN', '', ' ', ',', ',', ',', ';', '\t', '\n', '\n', '\r\n', '\r', '"', '""', 'é', 'ç', '\u00a0', '#'
];
const csvLike = fc.array(fc.constantFrom(...tokens), { maxLength: 300 }).map((parts) => parts.join(''));

describe('the importer never throws anything but an ImportError', () => {
	it('on random bytes', () => {
		fc.assert(
			fc.property(
				fc.oneof(
					fc.uint8Array({ maxLength: 3000 }),
					fc.uint8Array({ min: 1, max: 255, maxLength: 3000 }),
					// Mostly printable, with some high bytes: exercises the UTF-8 / Latin-1 decision.
					fc.uint8Array({ min: 0x09, max: 0x7e, maxLength: 2000 }).chain((b) =>
						fc.integer({ min: 0x80, max: 0xff }).map((hi) => Uint8Array.from([...b, hi, ...b.slice(0, 20)]))
					)
				),
				(bytes) => {
				const o = outcome(() => parseReadings(bytes));
				if ('report' in o) wellFormed(o.report);
				try {
					previewReadings(bytes);
				} catch (e) {
					expect(e).toBeInstanceOf(ImportError);
				}
				}
			),
			{ numRuns: 300 }
		);
	});

	it('on random CSV-like text, as text and as bytes', () => {
		fc.assert(
			fc.property(csvLike, (text) => {
				const a = outcome(() => parseReadings(text));
				const b = outcome(() => parseReadings(utf8(text)));
				if ('report' in a) wellFormed(a.report);
				if ('report' in b) wellFormed(b.report);
				expect('report' in a).toBe('report' in b);
			}),
			{ numRuns: 400 }
		);
	});

	it('on random rows under a real header (every row read or reported)', () => {
		const cell = fc.oneof(
			fc.double({ min: -2, max: 2, noNaN: true }).map(String),
			fc.constantFrom('', 'NaN', 'abc', '1e400', '0.3', ' 0.31 ', '"0.3"')
		);
		const header = fc.constantFrom('label,x,y', 'label,u_prime,v_prime', 'label,cct,duv', 'label,X,Y,Z', 'x,y,lux');
		fc.assert(
			fc.property(header, fc.array(fc.array(cell, { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 30 }), (h, rows) => {
				const text = [h, ...rows.map((r) => ['L', ...r].join(','))].join('\n');
				const o = outcome(() => parseReadings(text));
				if (!('report' in o)) return;
				wellFormed(o.report);
				// Each non-blank data row is either a reading or has at least one error.
				const seen = new Set([...o.report.readings.map((r) => r.row), ...o.report.errors.map((e) => e.row)]);
				rows.forEach((_, i) => expect(seen.has(i + 1)).toBe(true));
			}),
			{ numRuns: 200 }
		);
	});
});

describe('chunking does not change the result', () => {
	it('for random CSV-like bytes cut at random places', () => {
		fc.assert(
			fc.property(csvLike, fc.array(fc.integer({ min: 1, max: 40 }), { minLength: 1, maxLength: 8 }), (text, sizes) => {
				const bytes = utf8(text);
				const whole = outcome(() => parseReadings(bytes));
				const streamed = outcome(() => {
					const p = createReadingsParser();
					for (const c of chunks(bytes, sizes)) p.write(c);
					return p.end();
				});
				expect(streamed).toEqual(whole);
			}),
			{ numRuns: 300 }
		);
	});

	it('for CSV-like bytes with stray Latin-1 bytes (0xE7, 0xC3) cut at random places', () => {
		const bytesWithStrays = fc
			.tuple(csvLike, fc.array(fc.tuple(fc.nat(), fc.constantFrom(0xe7, 0xc3, 0xa9)), { maxLength: 3 }))
			.map(([text, strays]) => {
				const b = [...utf8(text)];
				for (const [at, byte] of strays) b.splice(b.length ? at % (b.length + 1) : 0, 0, byte);
				return Uint8Array.from(b);
			});
		fc.assert(
			fc.property(bytesWithStrays, fc.array(fc.integer({ min: 1, max: 40 }), { minLength: 1, maxLength: 8 }), (bytes, sizes) => {
				const whole = outcome(() => parseReadings(bytes));
				const streamed = outcome(() => {
					const p = createReadingsParser();
					for (const c of chunks(bytes, sizes)) p.write(c);
					return p.end();
				});
				// A stream that saw valid UTF-8 before the first stray byte reads the rest as Latin-1 and says so;
				// the whole file is then read as Latin-1 throughout. Otherwise both agree exactly.
				if ('report' in streamed && streamed.report.warnings.some((w) => w.includes('mixes UTF-8'))) return;
				expect(streamed).toEqual(whole);
			}),
			{ numRuns: 300 }
		);
	});

	it('for a real wide spectral file with quoted notes, cut at random places', () => {
		const nm = wavelengths(380, 780, 10);
		const row = (i: number) => [`"r${i}, ""q"""`, `"line\r\nbreak"`, ...nm.map((n) => (1 + n / 1000 + i).toFixed(3))].join(',');
		const text = [['label', 'notes', ...nm].join(','), ...Array.from({ length: 12 }, (_, i) => row(i))].join('\r\n');
		const bytes = utf8(text);
		const whole = parseReadings(bytes);
		expect(whole.readings).toHaveLength(12);
		fc.assert(
			fc.property(fc.array(fc.integer({ min: 1, max: 300 }), { minLength: 1, maxLength: 6 }), (sizes) => {
				const p = createReadingsParser();
				for (const c of chunks(bytes, sizes)) p.write(c);
				expect(p.end()).toEqual(whole);
			}),
			{ numRuns: 50 }
		);
	});
});

describe('valid rows always come out', () => {
	it('random in-range x, y rows are all read, with exactly the values written', () => {
		const xy = fc
			.tuple(fc.double({ min: 0.01, max: 0.7, noNaN: true }), fc.double({ min: 0.01, max: 0.29, noNaN: true }))
			.map(([x, y]) => [Number(x.toFixed(5)), Number(y.toFixed(5))] as const);
		fc.assert(
			fc.property(fc.array(xy, { minLength: 1, maxLength: 40 }), fc.constantFrom(',', ';', '\t'), (pairs, d) => {
				const text = [['label', 'x', 'y'].join(d), ...pairs.map(([x, y], i) => [`L${i}`, x, y].join(d))].join('\n');
				const report = parseReadings(text);
				expect(report.errors).toEqual([]);
				expect(report.delimiter).toBe(d);
				expect(report.readings.map((r) => (r.kind === 'chromaticity_xy' ? [r.x, r.y] : null))).toEqual(pairs.map((p) => [...p]));
			}),
			{ numRuns: 100 }
		);
	});
});
