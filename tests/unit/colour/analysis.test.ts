import { describe, expect, it } from 'vitest';
import { analyzeChromaticity, analyzeSpectrum, COMPUTATION_VERSION } from '../../../src/lib/colour/analysis';
import { cieIlluminant } from '../../../src/lib/colour/illuminants/cie';
import { makeSpectrum, SpectrumError } from '../../../src/lib/colour/spectrum';
import { CCTToXy } from '../../../src/lib/colour/temperature';
import { spectrumOf } from './factories';

describe('analyzeSpectrum', () => {
	it('CIE 15:2004 Table T.8: F2 → (0.3721, 0.3751), CCT ≈ 4230 K, Ra ≈ 64, with R1–R15 and an SSI', () => {
		const a = analyzeSpectrum(cieIlluminant('F2'));
		expect(a.x.toFixed(4)).toBe('0.3721');
		expect(a.y.toFixed(4)).toBe('0.3751');
		expect(Math.abs(a.cct_k! - 4230)).toBeLessThanOrEqual(10);
		expect(a.mired).toBeCloseTo(1e6 / a.cct_k!, 9);
		expect(Math.abs(a.cri!.ra - 64)).toBeLessThan(0.6);
		expect(a.cri!.r).toHaveLength(15);
		expect(Number.isInteger(a.ssi)).toBe(true);
		expect(a.lux).toBeNull();
		expect(a.warnings).toEqual([]);
	});
	it('CIE 15:2004 §7.1: absolute spectrum gives lux = 683 · Σ S ȳ Δλ (equal energy 0.01 W/m²/nm over 360–830 nm ≈ 730 lux)', () => {
		const a = analyzeSpectrum(spectrumOf(() => 0.01, 360, 830, 5, 'absolute'));
		// 683 lm/W × 0.01 × Σȳ·5 nm (Σȳ = 21.371 over the 5 nm table, CIE 15:2004 Table T.4)
		expect(a.lux!).toBeCloseTo(683 * 0.01 * 21.371 * 5, 0);
	});
	it('warnings carry coverage and resampling notes; include can skip CRI and SSI', () => {
		const s = spectrumOf(() => 1, 400, 700, 10);
		const a = analyzeSpectrum(s, { include: { cri: false, ssi: false } });
		expect(a.cri).toBeNull();
		expect(a.ssi).toBeNull();
		expect(a.warnings.join(' ')).toMatch(/400–700 nm, not the full 380–780 nm/);
		expect(a.warnings.join(' ')).toMatch(/resampled .* at 10 nm to .* at 5 nm/);
	});
	it('a given SSI reference is used', () => {
		expect(analyzeSpectrum(cieIlluminant('C'), { ssiReference: cieIlluminant('D65') }).ssi).toBe(94);
	});
	it('an invalid spectrum throws SpectrumError', () => {
		const s = makeSpectrum(380, 5, new Array(81).fill(1));
		s.values[0] = -1;
		expect(() => analyzeSpectrum(s)).toThrow(SpectrumError);
	});
});

describe('analyzeChromaticity', () => {
	it('ANSI C78.377-2017 Table 1: 4000 K category centre from CCT 3985 K, Duv +0.001 → (0.3818, 0.3797)', () => {
		const a = analyzeChromaticity({ cct_k: 3985, duv: 0.001 }, 800);
		expect(Math.abs(a.x - 0.3818)).toBeLessThan(2e-4);
		expect(Math.abs(a.y - 0.3797)).toBeLessThan(2e-4);
		expect(a.cct_k).toBeCloseTo(3985, 3);
		expect(a.duv).toBeCloseTo(0.001, 8);
		expect(a.lux).toBe(800);
		expect(a.cri).toBeNull();
		expect(a.ssi).toBeNull();
	});
	it('xy, u′v′ and XYZ inputs of the same light agree (round trip)', () => {
		const xy = CCTToXy(5600, -0.003);
		const a = analyzeChromaticity(xy);
		const b = analyzeChromaticity({ u_prime: a.u_prime, v_prime: a.v_prime });
		const c = analyzeChromaticity({ X: (xy.x / xy.y) * 50, Y: 50, Z: ((1 - xy.x - xy.y) / xy.y) * 50 });
		for (const r of [b, c]) {
			expect(r.x).toBeCloseTo(a.x, 12);
			expect(r.cct_k!).toBeCloseTo(5600, 4);
			expect(r.duv!).toBeCloseTo(-0.003, 9);
		}
	});
	it('far from the locus: values with a warning', () => {
		const a = analyzeChromaticity({ x: 0.2, y: 0.6 });
		expect(a.warnings.length).toBeGreaterThan(0);
	});
	it('bad inputs throw clear errors', () => {
		expect(() => analyzeChromaticity({ x: NaN, y: 0.3 })).toThrow(/finite/);
		expect(() => analyzeChromaticity({ x: 0.8, y: 0.5 })).toThrow(/not valid/);
		expect(() => analyzeChromaticity({ cct_k: -5, duv: 0 })).toThrow(/positive number of kelvin/);
		expect(() => analyzeChromaticity({ X: 0, Y: 0, Z: 0 })).toThrow(/not a light/);
		expect(() => analyzeChromaticity({ foo: 1 } as unknown as { x: number; y: number })).toThrow(/give a chromaticity/);
		expect(() => analyzeChromaticity({ x: 0.3, y: 0.3 }, -1)).toThrow(/lux/);
	});
	it('COMPUTATION_VERSION is a non-empty string', () => {
		expect(COMPUTATION_VERSION).toMatch(/\d+\.\d+\.\d+/);
	});
});
