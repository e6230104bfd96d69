import { describe, expect, it } from 'vitest';
import { alignSpectrum, makeSpectrum } from '../../../../src/lib/colour';
import { characteriseTransmission, customGel, normaliseTransmission, TransmissionError } from '../../../../src/lib/matching/gels/custom';
import { CTO_FRACTION_REFERENCE_K } from '../../../../src/lib/matching/gels/definitions';
import { getGel } from '../../../../src/lib/matching/gels/library';
import { proposeGelsForSourceToTarget } from '../../../../src/lib/matching/gels/propose';
import { cctTarget, planck, spectrumOf } from '../factories';

describe('characteriseTransmission', () => {
	it('physics round trip: the modelled full CTO fed in as "measured" gives back +159 mired on its 6500 K reference', () => {
		const c = characteriseTransmission(getGel('cto-full').transmission, { sourcesK: [6500] });
		expect(c.effects[0].miredShift).toBeCloseTo(159, 2);
		expect(Math.abs(c.effects[0].duvShift)).toBeLessThan(1e-5);
	});

	it('physics: on 3200 K and 5600 K the same filter stays within 5 % of +159 mired (Planck drift)', () => {
		const c = characteriseTransmission(getGel('cto-full').transmission);
		expect(Math.abs(c.at3200!.miredShift - 159) / 159).toBeLessThan(0.05);
		expect(Math.abs(c.at5600!.miredShift - 159) / 159).toBeLessThan(0.05);
	});

	it('a measurement on 380–780 nm at 5 nm in percent gives the same shift within 0.5 mired', () => {
		const fine = getGel('cto-half').transmission;
		const coarse = alignSpectrum(fine, 380, 780, 5).spectrum;
		const percent = makeSpectrum(380, 5, Array.from(coarse.values, (v) => v * 100));
		const c = characteriseTransmission(percent, { percent: true, sourcesK: [CTO_FRACTION_REFERENCE_K] });
		expect(c.effects[0].miredShift).toBeCloseTo(79.5, 0);
	});

	it('photopic light loss: a flat 50 % filter loses exactly 1 stop (log2 of the Y ratio) and shifts nothing', () => {
		const c = characteriseTransmission(spectrumOf(() => 0.5));
		expect(c.at3200!.lossStops).toBeCloseTo(1, 12);
		expect(Math.abs(c.at5600!.miredShift)).toBeLessThan(1e-6);
	});

	it('clips noise just above 1 with a warning, refuses percentages given as fractions, and negative values', () => {
		const n = normaliseTransmission(spectrumOf((nm) => (nm === 600 ? 1.005 : 0.8)));
		expect(Math.max(...n.transmission.values)).toBe(1);
		expect(n.warnings[0]).toMatch(/clipped/);
		expect(() => characteriseTransmission(spectrumOf(() => 80))).toThrow(/percent: true/);
		expect(() => characteriseTransmission(spectrumOf(() => 180), { percent: true })).toThrow(/100 %/);
		const neg = makeSpectrum(380, 5, new Array(81).fill(0.5));
		neg.values[10] = -0.2;
		expect(() => characteriseTransmission(neg)).toThrow(TransmissionError);
		expect(() => characteriseTransmission(spectrumOf(() => 0.5), { sourcesK: [500] })).toThrow(/1000–25000/);
	});
});

describe('customGel', () => {
	it('joins the search through extraGels and is stacked like a built-in filter', () => {
		const mine = customGel({ id: 'my-warmer', label: 'My warmer', transmission: getGel('cto-quarter').transmission });
		expect(mine.custom).toBe(true);
		expect(mine.miredShift).toBeGreaterThan(35);
		const r = proposeGelsForSourceToTarget({ spectrum: planck(5600) }, cctTarget(4500), { extraGels: [mine], only: ['my-warmer'], maxGels: 2, computeRa: false });
		expect(r.proposals.some((p) => p.gels.some((g) => g.id === 'my-warmer'))).toBe(true);
	});
	it('needs a usable id and refuses a duplicate of a built-in id', () => {
		expect(() => customGel({ id: '', label: 'x', transmission: spectrumOf(() => 0.5) })).toThrow(/id/);
		const dup = customGel({ id: 'cto-full', label: 'x', transmission: spectrumOf(() => 0.5) });
		expect(() => proposeGelsForSourceToTarget({ spectrum: planck(3200) }, cctTarget(3200), { extraGels: [dup] })).toThrow(/share the id/);
	});
});
