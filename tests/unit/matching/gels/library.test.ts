import { describe, expect, it } from 'vitest';
import { multiplySpectra, spectrumToXYZ } from '../../../../src/lib/colour';
import {
	CLEAR_BASE_LOSS_STOPS,
	FULL_GREEN_PEAK_DENSITY,
	GEL_DEFINITIONS,
	validateGelOverrides
} from '../../../../src/lib/matching/gels/definitions';
import {
	arithmeticShift,
	effectOnPlanckian,
	gelEffectsTable,
	gelLibrary,
	getGel,
	greenFilterDuvEffects,
	modelLossStops
} from '../../../../src/lib/matching/gels/library';
import { planck } from '../factories';

describe('built-in filter library', () => {
	it('has CTO and CTB at five strengths, plus and minus green at four, and three ND', () => {
		const lib = gelLibrary();
		const count = (f: string) => lib.filter((g) => g.family === f).length;
		expect([count('CTO'), count('CTB'), count('plus-green'), count('minus-green'), count('ND')]).toEqual([5, 5, 4, 4, 3]);
		expect(lib.map((g) => g.id)).toEqual(expect.arrayContaining(['cto-full', 'ctb-half', 'plusgreen-quarter', 'minusgreen-eighth', 'nd-0.6']));
		expect(new Set(lib.map((g) => g.id)).size).toBe(lib.length);
	});

	it('common practice: full CTB −131 mired, full CTO +159; fractions proportional', () => {
		expect(getGel('ctb-full').miredShift).toBe(-131);
		expect(getGel('cto-full').miredShift).toBe(159);
		expect(getGel('ctb-half').miredShift).toBeCloseTo(-65.5, 12);
		expect(getGel('cto-eighth').miredShift).toBeCloseTo(19.875, 12);
	});

	it('common practice, disputed: each strength’s range covers the quoted figures (½ CTB −68 and −80; full CTB −131 to −137)', () => {
		const half = getGel('ctb-half').miredRange!;
		expect(half.min).toBeLessThanOrEqual(-80);
		expect(half.max).toBeGreaterThanOrEqual(-68);
		const full = getGel('ctb-full').miredRange!;
		expect(full.min).toBeLessThanOrEqual(-137);
		expect(full.max).toBeGreaterThanOrEqual(-131);
		expect(getGel('ctb-full').lossRange).toEqual({ min: 1, max: 2 });
	});

	it('common practice: full CTO loses ≈ ⅔ stop on its 6500 K reference, full CTB 1.5 (middle of the disputed 1–2)', () => {
		const cto = getGel('cto-full');
		expect(effectOnPlanckian(cto.transmission, 6500, cto.lossOffsetStops).lossStops).toBeCloseTo(2 / 3, 9);
		const ctb = getGel('ctb-full');
		expect(ctb.effects[0].sourceK).toBe(3200);
		expect(ctb.effects[0].lossStops).toBeCloseTo(1.5, 9);
	});

	it('derived: a fraction keeps the clear-base loss plus its share of the rest (⅛ CTO = 0.152 + ⅛·(⅔ − 0.152))', () => {
		expect(getGel('cto-eighth').lossStops).toBeCloseTo(CLEAR_BASE_LOSS_STOPS + 0.125 * (2 / 3 - CLEAR_BASE_LOSS_STOPS), 12);
		expect(CLEAR_BASE_LOSS_STOPS).toBeCloseTo(0.152, 3);
	});

	it('physics: ND 0.3 / 0.6 / 0.9 lose 0.3·log2(10) ≈ 1, 2, 3 stops and move no colour', () => {
		for (const [id, stops] of [['nd-0.3', 0.9966], ['nd-0.6', 1.9932], ['nd-0.9', 2.9897]] as const) {
			const g = getGel(id);
			expect(g.lossStops).toBeCloseTo(stops, 4);
			expect(Math.abs(g.effects[0].miredShift)).toBeLessThan(1e-6);
			expect(Math.abs(g.effects[1].duvShift)).toBeLessThan(1e-9);
		}
	});

	it('common practice calibration: a full plus green is a peak density of 0.30 (≈ CC 30), fractions in proportion', () => {
		expect(FULL_GREEN_PEAK_DENSITY).toBe(0.3);
		const full = GEL_DEFINITIONS.find((g) => g.id === 'plusgreen-full')!;
		const quarter = GEL_DEFINITIONS.find((g) => g.id === 'plusgreen-quarter')!;
		const peak = (g: typeof full) => Math.max(...(g.model as { bands: { peakDensity: number }[] }).bands.map((b) => b.peakDensity));
		expect(peak(full)).toBeCloseTo(0.3, 12);
		expect(peak(quarter)).toBeCloseTo(0.075, 12);
		// The transmission bottoms out at 0.9 · 10^−0.3 near the band centres.
		expect(Math.min(...getGel('minusgreen-full').transmission.values)).toBeCloseTo(0.9 * 10 ** -0.3, 4);
	});

	it('derived from our band model (regression): Duv effect of plus and minus green on 3200 K and 5600 K Planckians', () => {
		const byId = Object.fromEntries(greenFilterDuvEffects().map((r) => [r.id, r]));
		// Regression values, our model's own output at the time of writing.
		expect(byId['plusgreen-full'].duvAt3200).toBeCloseTo(0.0167, 4);
		expect(byId['plusgreen-full'].duvAt5600).toBeCloseTo(0.0218, 4);
		expect(byId['minusgreen-full'].duvAt3200).toBeCloseTo(-0.0202, 4);
		expect(byId['minusgreen-full'].duvAt5600).toBeCloseTo(-0.0232, 4);
		// Signs: plus green moves above the locus (Duv > 0, Ohno 2014), minus green below; weaker filters less.
		for (const r of Object.values(byId)) {
			expect(Math.sign(r.duvAt3200)).toBe(r.id.startsWith('plus') ? 1 : -1);
			expect(Math.sign(r.duvAt5600)).toBe(r.id.startsWith('plus') ? 1 : -1);
		}
		expect(Math.abs(byId['plusgreen-eighth'].duvAt3200)).toBeLessThan(Math.abs(byId['plusgreen-half'].duvAt3200));
	});

	it('common practice, derived: plus and minus green lose under a stop', () => {
		for (const r of greenFilterDuvEffects()) {
			expect(r.lossStops).toBeGreaterThan(0);
			expect(r.lossStops).toBeLessThan(1);
		}
	});

	it('the effects table lists every filter with 3200 K and 5600 K effects', () => {
		const t = gelEffectsTable();
		expect(t).toHaveLength(21);
		expect(t.every((r) => r.at3200.sourceK === 3200 && r.at5600.sourceK === 5600)).toBe(true);
	});

	it('model loss of the Planck-ratio CTO on 6500 K is about 2 stops at a 0.9 peak (regression), which the nominal ⅔ stop replaces', () => {
		const cto = getGel('cto-full');
		expect(modelLossStops(cto.transmission, 6500)).toBeCloseTo(2.0, 1);
		expect(cto.lossOffsetStops).toBeCloseTo(2 / 3 - modelLossStops(cto.transmission, 6500), 12);
	});
});

describe('overrides', () => {
	it('an overridden mired shift rebuilds the transmission: −137 mired on 3200 K gives −137 (physics: exact at T_from)', () => {
		const lib = gelLibrary({ 'ctb-full': { miredShift: -137 } });
		const g = lib.find((x) => x.id === 'ctb-full')!;
		expect(g.miredShift).toBe(-137);
		expect(g.overridden.miredShift).toBe(true);
		expect(g.effects[0].miredShift).toBeCloseTo(-137, 3);
		expect(g.transmission).not.toBe(getGel('ctb-full').transmission);
		// Others are shared, untouched.
		expect(lib.find((x) => x.id === 'cto-full')).toBe(getGel('cto-full'));
	});

	it('an overridden light loss holds on the reference source', () => {
		const g = getGel('ctb-full', { 'ctb-full': { lossStops: 1 } });
		expect(g.lossStops).toBe(1);
		expect(g.effects[0].lossStops).toBeCloseTo(1, 9);
	});

	it('a mired override on a green filter changes the arithmetic only, with a warning', () => {
		const g = getGel('plusgreen-full', { 'plusgreen-full': { miredShift: 0 } });
		expect(g.miredShift).toBe(0);
		expect(g.warnings.join(' ')).toMatch(/arithmetic view only/);
		expect(arithmeticShift(g, 312.5).mired).toBe(0);
	});

	it('rejects unknown ids, non-numbers, negative losses and impossible shifts', () => {
		expect(() => validateGelOverrides({ 'cto-double': { miredShift: 1 } })).toThrow(/Unknown filter/);
		expect(() => validateGelOverrides({ 'cto-full': { miredShift: Number.NaN } })).toThrow(/finite/);
		expect(() => validateGelOverrides({ 'cto-full': { lossStops: -1 } })).toThrow(/≥ 0/);
		expect(() => validateGelOverrides({ 'ctb-full': { miredShift: -400 } })).toThrow(/no colour temperature/);
		expect(() => validateGelOverrides({ 'nd-0.3': { miredShift: 5 } })).toThrow(/neutral density/);
	});
});

describe('arithmeticShift', () => {
	it('CTO/CTB use the nominal shift; green filters interpolate in source mired between their 3200 K and 5600 K effects, held beyond', () => {
		expect(arithmeticShift(getGel('ctb-full'), 250).mired).toBe(-131);
		const pg = getGel('plusgreen-full');
		expect(arithmeticShift(pg, 1e6 / 3200).duv).toBeCloseTo(pg.effects[0].duvShift, 12);
		expect(arithmeticShift(pg, 1e6 / 5600).mired).toBeCloseTo(pg.effects[1].miredShift, 12);
		expect(arithmeticShift(pg, 1e6 / 2000).duv).toBeCloseTo(pg.effects[0].duvShift, 12);
		const mid = arithmeticShift(pg, (1e6 / 3200 + 1e6 / 5600) / 2).duv;
		expect(mid).toBeCloseTo((pg.effects[0].duvShift + pg.effects[1].duvShift) / 2, 12);
	});
});

describe('stacking', () => {
	it('is order-independent: transmissions multiply (identical XYZ for every order of a three-filter stack)', () => {
		const src = planck(3200);
		const [a, b, c] = ['ctb-half', 'plusgreen-quarter', 'cto-eighth'].map((id) => getGel(id).transmission);
		const orders = [
			[a, b, c],
			[c, b, a],
			[b, a, c]
		];
		const results = orders.map((o) => spectrumToXYZ(o.reduce((s, t) => multiplySpectra(s, t), src)));
		for (const r of results) {
			expect(r.X).toBeCloseTo(results[0].X, 9);
			expect(r.Y).toBeCloseTo(results[0].Y, 9);
			expect(r.Z).toBeCloseTo(results[0].Z, 9);
		}
	});
});
