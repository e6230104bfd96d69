import { describe, expect, it } from 'vitest';
import { explainMiredArithmetic, miredLibrary } from '../../../src/lib/matching/mired';

describe('explainMiredArithmetic', () => {
	it('common practice: full CTB (−131 mired) takes 3200 K to about 5500 K', () => {
		const e = explainMiredArithmetic(3200, 5500, { compare: [['ctb-full']] });
		expect(e.comparisons[0].nominalShift).toBe(-131);
		expect(Math.abs(e.comparisons[0].resultK - 5500)).toBeLessThan(20); // 10⁶/(312.5 − 131) = 5510 K
	});

	it('common practice worked example: 3092 K → 5600 K needs −144.8 mired', () => {
		const e = explainMiredArithmetic(3092, 5600);
		expect(e.shiftNeeded).toBeCloseTo(-144.8, 1);
		expect(e.family).toBe('CTB');
		expect(e.sourceMired).toBeCloseTo(323.4, 1);
		expect(e.targetMired).toBeCloseTo(178.6, 1);
	});

	it('derived from the proportional nominal shifts: ¾ + ¼ CTB equals one full CTB (−131), both 13.8 mired short', () => {
		const e = explainMiredArithmetic(3092, 5600, { compare: [['ctb-threequarter', 'ctb-quarter'], ['ctb-full']] });
		const [stack, full] = e.comparisons;
		expect(stack.nominalShift).toBeCloseTo(full.nominalShift, 9);
		expect(stack.residualMired).toBeCloseTo(13.8, 1);
	});

	it('common practice (disputed figures ¼ CTB −35, full −137; ¾ by proportion −102.75): ¾ + ¼ CTB lands closer than one full CTB', () => {
		const overrides = { 'ctb-quarter': { miredShift: -35 }, 'ctb-full': { miredShift: -137 }, 'ctb-threequarter': { miredShift: -0.75 * 137 } };
		const e = explainMiredArithmetic(3092, 5600, { overrides, compare: [['ctb-threequarter', 'ctb-quarter'], ['ctb-full']] });
		const [stack, full] = e.comparisons;
		expect(Math.abs(stack.residualMired)).toBeLessThan(Math.abs(full.residualMired));
	});

	it('derived: the nearest two-sheet stack for −144.8 mired is full + ⅛ CTB (−147.4 mired, 2.5 past)', () => {
		const e = explainMiredArithmetic(3092, 5600);
		expect(e.candidates[0].gels.map((g) => g.id).sort()).toEqual(['ctb-eighth', 'ctb-full']);
		expect(e.candidates[0].nominalShift).toBeCloseTo(-147.375, 3);
		expect(e.candidates[0].residualMired).toBeCloseTo(-2.53, 2); // −144.84 − (−147.375)
	});

	it('common practice: full CTO (+159) takes 5600 K to about 2950 K and 7000 K to about 3300 K', () => {
		const a = explainMiredArithmetic(5600, 2950, { compare: [['cto-full']] }).comparisons[0];
		const b = explainMiredArithmetic(7000, 3300, { compare: [['cto-full']] }).comparisons[0];
		expect(Math.abs(a.resultK - 2950)).toBeLessThan(25);
		expect(Math.abs(b.resultK - 3300)).toBeLessThan(25);
	});

	it('common practice: a 2700 K practical against a 3200 K camera is +58 mired, between a quarter and a half CTO', () => {
		const e = explainMiredArithmetic(3200, 2700, { maxGels: 1, count: 2 });
		expect(e.shiftNeeded).toBeCloseTo(57.9, 1);
		expect(e.family).toBe('CTO');
		expect(e.candidates.map((c) => c.gels[0].id).sort()).toEqual(['cto-half', 'cto-quarter']);
	});

	it('common practice: equal kelvin steps are unequal mired steps (4000 → 3000 K is 83 mired; 7000 → 6000 K is 24)', () => {
		expect(explainMiredArithmetic(4000, 3000).shiftNeeded).toBeCloseTo(83.3, 1);
		expect(explainMiredArithmetic(7000, 6000).shiftNeeded).toBeCloseTo(23.8, 1);
	});

	it('common practice teaching examples: 3200 → 5700 K = −137 mired; 6500 → 3200 K = +159', () => {
		expect(Math.round(explainMiredArithmetic(3200, 5700).shiftNeeded)).toBe(-137);
		expect(Math.round(explainMiredArithmetic(6500, 3200).shiftNeeded)).toBe(159);
	});

	it('gives the steps in order with their numbers in the text', () => {
		const e = explainMiredArithmetic(3092, 5600, { compare: [['ctb-full']] });
		expect(e.steps.map((s) => s.kind)).toEqual(['source', 'target', 'shift', 'stacks', 'result', 'comparison', 'caveat']);
		expect(e.steps[0].text).toContain('323.4 mired');
		expect(e.steps[2].text).toContain('−144.8 mired');
		expect(e.steps[4].text).toContain('5681 K');
		expect(e.steps[5].text).toContain('5197 K');
	});

	it('needs no filter when source and target agree', () => {
		const e = explainMiredArithmetic(5600, 5600);
		expect(e.family).toBe('none');
		expect(e.candidates[0].label).toBe('no filter');
		expect(e.steps.some((s) => s.kind === 'stacks')).toBe(false);
	});

	it('never mixes CTO with CTB in one stack', () => {
		const e = explainMiredArithmetic(3200, 5600, { maxGels: 3, count: 50 });
		for (const c of e.candidates) expect(new Set(c.gels.map((g) => g.family)).size).toBe(1);
	});

	it('the library has the CTO and CTB strengths with overrides applied', () => {
		const lib = miredLibrary({ 'cto-half': { miredShift: 81 } });
		expect(lib).toHaveLength(10);
		expect(lib.find((g) => g.id === 'cto-half')?.miredShift).toBe(81);
		expect(lib.find((g) => g.id === 'cto-quarter')?.miredShift).toBeCloseTo(39.75, 9);
	});

	it('throws on impossible inputs', () => {
		expect(() => explainMiredArithmetic(0, 5600)).toThrow(/kelvin/);
		expect(() => explainMiredArithmetic(3200, Number.NaN)).toThrow(/Target/);
		expect(() => explainMiredArithmetic(3200, 5600, { maxGels: 4 })).toThrow(/1 to 3/);
		expect(() => explainMiredArithmetic(3200, 5600, { compare: [['ctb-double']] })).toThrow(/Unknown filter/);
		expect(() => explainMiredArithmetic(3200, 5600, { overrides: { 'ctb-nine': { miredShift: 1 } } })).toThrow(/Unknown filter/);
	});
});
