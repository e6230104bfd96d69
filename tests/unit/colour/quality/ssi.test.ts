import { describe, expect, it } from 'vitest';
import { cieIlluminant } from '../../../../src/lib/colour/illuminants/cie';
import { daylightSpectrum } from '../../../../src/lib/colour/illuminants/daylight';
import { planckianSpectrum } from '../../../../src/lib/colour/illuminants/planckian';
import { spectralSimilarityIndex } from '../../../../src/lib/colour/quality/ssi';
import { spectrumOf, whiteLed } from '../factories';

describe('Academy Spectral Similarity Index (2020)', () => {
	it('SSI of CIE C against D65 = 94 (value reported by colour-science’s ssi.py example, an open-source implementation)', () => {
		expect(spectralSimilarityIndex(cieIlluminant('C'), cieIlluminant('D65'))).toBe(94);
	});
	it('identical shapes score 100, whatever the scale or grid', () => {
		const a = planckianSpectrum(3200, 360, 830, 1);
		const b = planckianSpectrum(3200, 380, 780, 5);
		for (let i = 0; i < b.values.length; i++) b.values[i] *= 7;
		expect(spectralSimilarityIndex(a, b)).toBe(100);
	});
	it('default reference: Planckian below 4000 K, CIE daylight at and above, at the test’s CCT', () => {
		expect(spectralSimilarityIndex(planckianSpectrum(3000, 360, 830, 5))).toBe(100);
		expect(spectralSimilarityIndex(daylightSpectrum(5600))).toBe(100);
	});
	it('fluorescent F2 against its default reference is far from 100; a broad LED model scores higher (batch)', () => {
		const f2 = spectralSimilarityIndex(cieIlluminant('F2'));
		const led = spectralSimilarityIndex(spectrumOf(whiteLed()));
		expect(f2).toBeLessThan(80);
		expect(led).toBeGreaterThan(f2);
	});
	it('unrounded on request', () => {
		const v = spectralSimilarityIndex(cieIlluminant('C'), cieIlluminant('D65'), { round: false });
		expect(v).not.toBe(Math.round(v));
		expect(Math.round(v)).toBe(94);
	});
	it('a bad reference throws', () => {
		const r = cieIlluminant('D65');
		r.values.fill(0);
		expect(() => spectralSimilarityIndex(cieIlluminant('C'), r)).toThrow(/no positive value/);
	});
});

describe('SSI fast paths', () => {
	it('the tabulated Planckian and linear daylight references equal direct evaluation (batch, 1000–20000 K)', async () => {
		const { ssiAgainstDefault } = await import('../../../../src/lib/colour/quality/ssi');
		const test = cieIlluminant('F2');
		for (const T of [1000, 1800, 2856, 3333, 3999, 4000, 5000, 6504, 12000, 20000]) {
			const fast = ssiAgainstDefault(test, T, { round: false });
			const direct = ssiAgainstDefault(test, T, { round: false, direct: true });
			expect(Math.abs(fast - direct)).toBeLessThan(1e-7);
		}
	});
});
