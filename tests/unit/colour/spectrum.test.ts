import { describe, expect, it } from 'vitest';
import {
	alignSpectrum,
	makeSpectrum,
	multiplySpectra,
	spectrumFromSamples,
	SpectrumError,
	validateSpectrum,
	wavelengthAt
} from '../../../src/lib/colour/spectrum';
import { spectrumOf, valuesOf } from './factories';

const flat = () => spectrumOf(() => 1);

describe('makeSpectrum: bad inputs give clear errors', () => {
	it('NaN names the wavelength', () => {
		const v = valuesOf(flat());
		v[10] = NaN;
		expect(() => makeSpectrum(380, 5, v)).toThrow(SpectrumError);
		expect(() => makeSpectrum(380, 5, v)).toThrow(/430 nm.*NaN/);
	});
	it('Infinity is refused', () => {
		const v = valuesOf(flat());
		v[0] = Infinity;
		expect(() => makeSpectrum(380, 5, v)).toThrow(/380 nm.*Infinity/);
	});
	it('a clearly negative value is refused', () => {
		const v = valuesOf(flat());
		v[20] = -0.05;
		expect(() => makeSpectrum(380, 5, v)).toThrow(/negative power -0.05 at 480 nm/);
	});
	it('all zero is refused', () => {
		expect(() => makeSpectrum(380, 5, new Array(81).fill(0))).toThrow(/no positive value/);
	});
	it('too short a range is refused', () => {
		expect(() => spectrumOf(() => 1, 450, 650)).toThrow(/too short a range: the spectrum covers 450–650 nm/);
	});
	it('bad start, interval, scale and length are refused', () => {
		expect(() => makeSpectrum(NaN, 5, valuesOf(flat()))).toThrow(/start wavelength/);
		expect(() => makeSpectrum(380, 0, valuesOf(flat()))).toThrow(/interval must be a positive/);
		expect(() => makeSpectrum(380, -5, valuesOf(flat()))).toThrow(/interval must be a positive/);
		expect(() => makeSpectrum(380, 5, [1, 2])).toThrow(/at least 3 values/);
		expect(() => makeSpectrum(380, 5, valuesOf(flat()), 'watts' as 'relative')).toThrow(/scale must be/);
	});
});

describe('validateSpectrum', () => {
	it('clips negatives within noise and says so', () => {
		const v = valuesOf(flat());
		v[3] = -5e-4;
		const r = validateSpectrum(makeSpectrum(380, 5, v));
		expect(r.spectrum.values[3]).toBe(0);
		expect(r.warnings.join(' ')).toMatch(/1 slightly negative value .* set to zero/);
	});
	it('warns what is missing when 380–780 nm is not covered', () => {
		const r = validateSpectrum(spectrumOf(() => 1, 400, 700));
		expect(r.warnings.join(' ')).toMatch(/380–400 nm and 700–780 nm are missing and taken as zero power/);
	});
	it('a full, clean spectrum gives no warning and the same object', () => {
		const s = flat();
		const r = validateSpectrum(s);
		expect(r.warnings).toEqual([]);
		expect(r.spectrum).toBe(s);
	});
	it('throws on a hand-made object with NaN', () => {
		const s = flat();
		s.values[5] = NaN;
		expect(() => validateSpectrum(s)).toThrow(SpectrumError);
	});
});

describe('spectrumFromSamples', () => {
	const wl = Array.from({ length: 81 }, (_, i) => 380 + 5 * i);
	const ones = wl.map(() => 1);
	it('accepts sorted, uniform samples', () => {
		const r = spectrumFromSamples(wl, ones);
		expect([r.spectrum.start, r.spectrum.interval, r.spectrum.values.length]).toEqual([380, 5, 81]);
		expect(wavelengthAt(r.spectrum, 80)).toBe(780);
	});
	it('unsorted wavelengths', () => {
		const w = [...wl];
		[w[3], w[4]] = [w[4], w[3]];
		expect(() => spectrumFromSamples(w, ones)).toThrow(/wavelengths must increase: 395 nm at row 5 follows 400 nm/);
	});
	it('duplicate wavelengths', () => {
		const w = [...wl];
		w[4] = w[3];
		expect(() => spectrumFromSamples(w, ones)).toThrow(/duplicate wavelength 395 nm/);
	});
	it('non-uniform step', () => {
		const w = [...wl];
		w[40] += 2;
		expect(() => spectrumFromSamples(w, ones)).toThrow(/not evenly spaced/);
	});
	it('length mismatch and NaN wavelength', () => {
		expect(() => spectrumFromSamples(wl, ones.slice(1))).toThrow(/81 wavelengths but 80 values/);
		const w = [...wl];
		w[2] = NaN;
		expect(() => spectrumFromSamples(w, ones)).toThrow(/row 3 is NaN/);
	});
	it('snaps float noise in the step (0.9999999 nm → 1 nm)', () => {
		const w = Array.from({ length: 401 }, (_, i) => 380 + i * 0.9999999 + 1e-8);
		const r = spectrumFromSamples(w, w.map(() => 1));
		expect(r.spectrum.interval).toBe(1);
		expect(r.spectrum.start).toBe(380);
	});
});

describe('alignSpectrum and multiplySpectra', () => {
	it('linear interpolation reports what it did, zero outside', () => {
		const s = spectrumOf((nm) => nm, 380, 780, 10);
		const r = alignSpectrum(s, 370, 790, 5);
		expect(r.spectrum.values[0]).toBe(0);
		expect(r.spectrum.values[(385 - 370) / 5]).toBeCloseTo(385, 12);
		expect(r.note).toMatch(/resampled from 380–780 nm at 10 nm to 370–790 nm at 5 nm by linear interpolation; values outside the original range set to zero/);
	});
	it('no note when the grid is unchanged', () => {
		const s = flat();
		expect(alignSpectrum(s, 380, 780, 5)).toEqual({ spectrum: s, note: null });
	});
	it('linear interpolation does not overshoot a line spectrum', () => {
		const s = spectrumOf((nm) => (nm === 550 ? 100 : 0), 380, 780, 10);
		const r = alignSpectrum(s, 380, 780, 1).spectrum;
		expect(Math.max(...r.values)).toBe(100);
		expect(Math.min(...r.values)).toBe(0);
	});
	it('source × filter on the source grid, filter ends held', () => {
		const source = spectrumOf(() => 2, 380, 780, 5);
		const filter = spectrumOf((nm) => (nm < 600 ? 0.5 : 0.25), 400, 700, 10);
		const p = multiplySpectra(source, filter);
		expect(p.values[0]).toBe(1); // 380 nm: filter's 400 nm value held
		expect(p.values[p.values.length - 1]).toBe(0.5); // 780 nm: 700 nm value held
		expect(p.start).toBe(380);
	});
});
