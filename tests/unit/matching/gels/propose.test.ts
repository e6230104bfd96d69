import { describe, expect, it } from 'vitest';
import { cieIlluminant, deltaUvPrime, multiplySpectra, spectrumToXYZ, XYZToXy, xyToUvPrime } from '../../../../src/lib/colour';
import { GEL_HEAT_CAUTION, HOUSE_LIGHT_CAUTION } from '../../../../src/lib/matching/cautions';
import { gelLibrary, getGel } from '../../../../src/lib/matching/gels/library';
import {
	enumerateStacks,
	ESTIMATE_NOTE,
	proposeGelsForHouseLight,
	proposeGelsForLamp,
	proposeGelsForSourceToTarget
} from '../../../../src/lib/matching/gels/propose';
import { cctTarget, planck } from '../factories';

const families = (p: { gels: { id: string }[] }) => p.gels.map((g) => getGel(g.id).family);

describe('proposeGelsForSourceToTarget, spectral', () => {
	it('common practice: tungsten (3200 K Planckian) to a 5600 K target takes CTB at about full strength, within the 0.002 tolerance', () => {
		const r = proposeGelsForSourceToTarget({ spectrum: planck(3200) }, cctTarget(5600));
		expect(r.estimate).toBe(false);
		expect(r.proposals).toHaveLength(5);
		expect(r.proposals[0].within).toBe(true);
		for (const p of r.proposals) {
			expect(families(p).every((f) => f === 'CTB')).toBe(true);
			expect(p.miredShift.nominal).toBeCloseTo(-131, 6);
		}
		const full = r.proposals.find((p) => p.label === 'Full CTB')!;
		// Physics: the Planck-ratio full CTB turns 3200 K into exactly 10⁶/(312.5 − 131) K.
		expect(full.predicted.CCT!).toBeCloseTo(1e6 / 181.5, 0);
		expect(full.miredShift.actual!).toBeCloseTo(-131, 3);
		expect(full.lossStops).toBeCloseTo(1.5, 9);
		expect(r.cautions).toContain(GEL_HEAT_CAUTION);
	});

	it('CIE 13.3-1995: a Planckian through a Planck-ratio filter, below 5000 K, is its own reference (Ra = 100)', () => {
		const r = proposeGelsForSourceToTarget({ spectrum: planck(3200) }, cctTarget(4300), { only: ['ctb-half'], maxGels: 1, top: 2 });
		const half = r.proposals.find((p) => p.label === '½ CTB')!;
		expect(half.predicted.Ra!).toBeCloseTo(100, 1);
	});

	it('ranks by residual in half-tolerance steps, then light loss (checked against an independent computation of every stack)', () => {
		// 5 nm source keeps the brute force quick; the stack list is the solver's own enumeration.
		const src = planck(2900, 380, 780, 5);
		const target = cctTarget(4300, 0.003);
		const r = proposeGelsForSourceToTarget({ spectrum: src }, target, { computeRa: false, top: 8 });
		const gels = gelLibrary().filter((g) => g.family !== 'ND');
		const step = target.tolerance / 2;
		const Yin = spectrumToXYZ(src).Y;
		const brute = enumerateStacks(gels, 3, false).map((idx) => {
			const out = idx.reduce((s, j) => multiplySpectra(s, gels[j].transmission), src);
			const XYZ = spectrumToXYZ(out);
			const residual = deltaUvPrime(xyToUvPrime(XYZToXy(XYZ)), target);
			const loss = -Math.log2(XYZ.Y / Yin) + idx.reduce((s, j) => s + gels[j].lossOffsetStops, 0);
			return { ids: idx.map((j) => gels[j].id).join('+'), residual, loss };
		});
		brute.sort((a, b) => Math.floor(a.residual / step) - Math.floor(b.residual / step) || a.loss - b.loss || a.ids.split('+').length - b.ids.split('+').length);
		const best = brute[0];
		expect(r.proposals[0].gels.map((g) => g.id).join('+')).toBe(best.ids);
		expect(r.proposals[0].residual).toBeCloseTo(best.residual, 9);
		expect(r.proposals[0].lossStops).toBeCloseTo(best.loss, 9);
		for (let k = 1; k < r.proposals.length; k++) {
			const a = r.proposals[k - 1];
			const b = r.proposals[k];
			const ba = Math.floor(a.residual / step);
			const bb = Math.floor(b.residual / step);
			expect(ba <= bb).toBe(true);
			if (ba === bb) expect(a.lossStops).toBeLessThanOrEqual(b.lossStops + 1e-12);
		}
	});

	it('a light already on target needs no filter', () => {
		const r = proposeGelsForSourceToTarget({ spectrum: planck(5600) }, cctTarget(5600));
		expect(r.proposals[0].label).toBe('no filter');
		expect(r.proposals[0].residual).toBeLessThan(1e-6);
		expect(r.before.within).toBe(true);
	});

	it('never stacks CTO with CTB or plus with minus green unless asked; ND only when asked, one at most', () => {
		const r = proposeGelsForSourceToTarget({ spectrum: cieIlluminant('F4') }, cctTarget(5600), { top: 30, computeRa: false });
		for (const p of r.proposals) {
			const f = families(p);
			expect(f.includes('CTO') && f.includes('CTB')).toBe(false);
			expect(f.includes('plus-green') && f.includes('minus-green')).toBe(false);
			expect(f).not.toContain('ND');
		}
		const nd = proposeGelsForSourceToTarget({ spectrum: planck(5600) }, cctTarget(5600), { includeNeutralDensity: true, top: 200, computeRa: false });
		expect(nd.proposals.some((p) => families(p).includes('ND'))).toBe(true);
		for (const p of nd.proposals) expect(families(p).filter((f) => f === 'ND').length).toBeLessThanOrEqual(1);
		const gels = gelLibrary();
		const opposing = enumerateStacks(gels, 2, true).some((idx) => idx.map((j) => gels[j].family).join() === 'CTO,CTB');
		expect(opposing).toBe(true);
	});

	it('a cool-white tube (CIE F2 spectrum, CIE 15:2004 Table T.6; about 4230 K) toward tungsten takes CTO, Ra predicted', () => {
		const r = proposeGelsForSourceToTarget({ spectrum: cieIlluminant('F2') }, cctTarget(3200));
		const f = families(r.proposals[0]);
		expect(f).toContain('CTO');
		expect(r.proposals[0].residual).toBeLessThan(r.before.duv_prime);
		expect(r.proposals[0].predicted.Ra).not.toBeNull();
	});
});

describe('proposeGelsForSourceToTarget, estimate from chromaticity', () => {
	it('adds nominal mired by arithmetic, flags estimate, predicts no CRI: 3200 K + full CTB → 10⁶/181.5 K (common practice arithmetic)', () => {
		const r = proposeGelsForSourceToTarget({ CCT: 3200, Duv: 0 }, cctTarget(5600));
		expect(r.estimate).toBe(true);
		expect(r.note).toBe(ESTIMATE_NOTE);
		const p = r.proposals[0];
		expect(p.label).toBe('Full CTB'); // ties on residual break toward less light lost, then fewer sheets
		expect(p.estimate).toBe(true);
		expect(p.predicted.Ra).toBeNull();
		expect(p.predicted.CCT!).toBeCloseTo(1e6 / 181.5, 0);
		expect(p.miredShift.actual).toBeNull();
		expect(p.lossStops).toBeCloseTo(1.5, 12);
	});

	it('accepts xy and u′v′ sources, and says so when a light has no CCT', () => {
		expect(proposeGelsForSourceToTarget({ x: 0.4, y: 0.4 }, cctTarget(3200)).estimate).toBe(true);
		expect(proposeGelsForSourceToTarget({ u_prime: 0.22, v_prime: 0.5 }, cctTarget(3200)).proposals.length).toBeGreaterThan(0);
		const none = proposeGelsForSourceToTarget({ x: 0.2, y: 0.6 }, cctTarget(3200));
		expect(none.proposals).toEqual([]);
		expect(none.note).toMatch(/no meaningful colour temperature/);
	});
});

describe('both directions', () => {
	it('gel the lamp toward the house light: the target is the tube’s own colour', () => {
		const tube = { spectrum: cieIlluminant('F2'), label: 'tubes' };
		const r = proposeGelsForLamp({ lamp: { spectrum: planck(3200) }, houseLight: tube });
		expect(r.direction).toBe('lamp-to-house-light');
		expect(r.target.label).toBe('tubes');
		expect(r.proposals[0].residual).toBeLessThan(r.before.duv_prime);
		expect(families(r.proposals[0])).toContain('CTB');
	});

	it('gel the house light toward the lamp: sleeves on tubes, with the fittings caution', () => {
		const r = proposeGelsForHouseLight({ houseLight: { spectrum: cieIlluminant('F4') }, lamp: { spectrum: planck(3200) } });
		expect(r.direction).toBe('house-light-to-lamp');
		expect(r.cautions).toEqual([GEL_HEAT_CAUTION, HOUSE_LIGHT_CAUTION]);
		expect(r.proposals[0].residual).toBeLessThan(r.before.duv_prime);
	});

	it('an explicit target wins over the other light', () => {
		const r = proposeGelsForHouseLight({ houseLight: { spectrum: cieIlluminant('F11') }, lamp: { spectrum: planck(3200) }, target: cctTarget(4000) });
		expect(r.target.CCT!).toBeCloseTo(4000, 0);
	});

	it('throws without a target', () => {
		expect(() => proposeGelsForLamp({ lamp: { spectrum: planck(3200) } })).toThrow(/house light/);
		expect(() => proposeGelsForHouseLight({ houseLight: { spectrum: planck(3200) } })).toThrow(/lamp/);
	});
});

describe('options and errors', () => {
	it('restricts to ids or families and returns top N', () => {
		const r = proposeGelsForSourceToTarget({ spectrum: planck(3200) }, cctTarget(4000), { families: ['CTB'], top: 3, computeRa: false });
		expect(r.proposals).toHaveLength(3);
		expect(r.proposals.every((p) => families(p).every((f) => f === 'CTB'))).toBe(true);
	});
	it('uses overrides in the prediction', () => {
		const r = proposeGelsForSourceToTarget({ spectrum: planck(3200) }, cctTarget(5600), {
			overrides: { 'ctb-full': { miredShift: -137 } },
			only: ['ctb-full'],
			maxGels: 1,
			computeRa: false
		});
		expect(r.proposals.find((p) => p.label === 'Full CTB')!.miredShift.actual!).toBeCloseTo(-137, 2);
	});
	it('throws on bad options', () => {
		const src = { spectrum: planck(3200) };
		expect(() => proposeGelsForSourceToTarget(src, cctTarget(5600), { maxGels: 4 })).toThrow(/0 to 3/);
		expect(() => proposeGelsForSourceToTarget(src, cctTarget(5600), { top: 0 })).toThrow(/at least one/);
		expect(() => proposeGelsForSourceToTarget(src, cctTarget(5600), { only: ['cto-double'] })).toThrow(/Unknown filter/);
		expect(() => proposeGelsForSourceToTarget(src, cctTarget(5600), { residualStep: 0 })).toThrow(/residualStep/);
		expect(() => proposeGelsForSourceToTarget({ x: Number.NaN, y: 0.3 }, cctTarget(5600))).toThrow(RangeError);
	});
});
