import { describe, expect, it } from 'vitest';
import { cieIlluminant, COMPUTATION_VERSION, type Spectrum } from '../../../src/lib/colour';
import { analyzeReport, parseReadings, toAnalyzeJson, type ParseReport } from '../../../src/lib/import';
import { csv, wavelengths } from './factories';

/** A wide spectral CSV sampled from a colour-core spectrum on 380–780 nm at 5 nm. */
function wideCsvOf(label: string, s: Spectrum): string {
	const nm = wavelengths(380, 780, 5);
	const at = (n: number) => s.values[Math.round((n - s.start) / s.interval)];
	return csv([['label', ...nm], [label, ...nm.map((n) => at(n))]]);
}

const analyse = (text: string) => analyzeReport(parseReadings(text));

describe('analyzeReport', () => {
	it('CIE 15:2004 Table T.3: illuminant A from a 5 nm wide CSV gives x, y = 0.44758, 0.40745', () => {
		const result = analyse(wideCsvOf('Illuminant A', cieIlluminant('A')));
		expect(result.errors).toEqual([]);
		const a = result.readings[0].analysis;
		expect(Math.abs(a.x - 0.44758)).toBeLessThan(5e-5);
		expect(Math.abs(a.y - 0.40745)).toBeLessThan(5e-5);
		// CIE 15:2004 §3.1: illuminant A has a correlated colour temperature of about 2856 K.
		expect(a.cct_k!).toBeGreaterThan(2853);
		expect(a.cct_k!).toBeLessThan(2859);
		// CIE 13.3-1995 §5.2: below 5000 K the reference is a Planckian radiator, which A is, so Ra = 100.
		expect(a.cri!.ra).toBeGreaterThan(99.5);
		expect(a.cri!.r).toHaveLength(15);
		expect(result.computationVersion).toBe(COMPUTATION_VERSION);
	});

	it('CIE 15:2004 §3.1: a chromaticity row at D65 xy (0.31272, 0.32903) gives CCT ≈ 6504 K', () => {
		const result = analyse(csv([['label', 'x', 'y'], ['D65', '0.31272', '0.32903']]));
		const a = result.readings[0].analysis;
		expect(Math.abs(a.cct_k! - 6504)).toBeLessThan(2);
		expect(a.cri).toBeNull();
		expect(a.ssi).toBeNull();
	});

	it("CIE 15:2004 Table T.3 D65: u'v' from eq. (8.10) (0.19783, 0.46834, derived) gives back its xy", () => {
		const a = analyse(csv([["u'", "v'"], ['0.19783', '0.46834']])).readings[0].analysis;
		expect(a.x).toBeCloseTo(0.31272, 4);
		expect(a.y).toBeCloseTo(0.32903, 4);
	});

	it('CIE 15:2004 Table T.3: CCT 2856 K on the Planckian locus (Duv 0) lands at illuminant A', () => {
		const a = analyse(csv([['cct', 'duv'], ['2856', '0']])).readings[0].analysis;
		expect(Math.abs(a.x - 0.44758)).toBeLessThan(2e-4);
		expect(Math.abs(a.y - 0.40745)).toBeLessThan(2e-4);
	});

	it('common practice: the D65 white point XYZ (95.047, 100, 108.883) gives D65 xy', () => {
		const a = analyse(csv([['X', 'Y', 'Z', 'lux'], ['95.047', '100', '108.883', '800']])).readings[0].analysis;
		expect(a.x).toBeCloseTo(0.31272, 4);
		expect(a.y).toBeCloseTo(0.32903, 4);
		expect(a.lux).toBe(800);
	});

	it('turns a reading the colour core refuses into an error and keeps the rest', () => {
		const report: ParseReport = {
			format: 'chromaticity_xy',
			delimiter: ',',
			encoding: 'text',
			decimalComma: false,
			readings: [
				{ row: 1, label: 'bad', kind: 'chromaticity_xy', x: Number.NaN, y: 0.3, warnings: [] },
				{ row: 2, label: 'good', kind: 'chromaticity_xy', x: 0.31272, y: 0.32903, warnings: ['taken_at left out'] }
			],
			errors: [{ row: 3, column: 'x', message: 'row 3: x = 1.4 is outside 0–1' }],
			warnings: []
		};
		const result = analyzeReport(report);
		expect(result.readings.map((r) => r.reading.label)).toEqual(['good']);
		expect(result.readings[0].analysis.warnings[0]).toBe('taken_at left out');
		expect(result.errors.map((e) => [e.row, e.column])).toEqual([
			[1, null],
			[3, 'x']
		]);
		expect(result.errors[0].message).toMatch(/^row 1: /);
	});
});

describe('toAnalyzeJson', () => {
	it('prints exactly the fields of the analyze command, in order', () => {
		const text = `${wideCsvOf('A', cieIlluminant('A'))}`;
		const json = toAnalyzeJson(analyse(text));
		expect(Object.keys(json)).toEqual(['readings', 'errors']);
		expect(Object.keys(json.readings[0])).toEqual(['row', 'label', 'kind', 'x', 'y', 'u_prime', 'v_prime', 'cct_k', 'duv', 'cri', 'ssi', 'warnings']);
		expect(json.readings[0].kind).toBe('spectral');
		expect(Object.keys(json.readings[0].cri!)).toEqual(['ra', 'r']);
		expect(typeof json.readings[0].ssi).toBe('number');
	});

	it('names the kinds chromaticity, cct_duv and tristimulus', () => {
		const kinds = [
			csv([['x', 'y'], ['0.3', '0.3']]),
			csv([['u_prime', 'v_prime'], ['0.2', '0.47']]),
			csv([['cct', 'duv'], ['5600', '0.002']]),
			csv([['X', 'Y', 'Z'], ['95', '100', '108']])
		].map((t) => toAnalyzeJson(analyse(t)).readings[0].kind);
		expect(kinds).toEqual(['chromaticity', 'chromaticity', 'cct_duv', 'tristimulus']);
	});
});
