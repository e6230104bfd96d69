import { describe, expect, it } from 'vitest';
import { CRI_GUIDES, CRI_SAMPLE_NAMES, criDomainMin, criLayout, fmtIndex } from '$lib/charts/cri';

const flat = (v: number) => ({ ra: v, r: new Array(15).fill(v) });

describe('criLayout', () => {
	it('one bar each for Ra and R1–R15, Ra and R9 marked, sample names from CIE 13.3 Table 1', () => {
		const l = criLayout(flat(90), 640);
		expect(l.bars.map((b) => b.name)).toEqual(['Ra', ...Array.from({ length: 15 }, (_, i) => `R${i + 1}`)]);
		expect(l.bars.filter((b) => b.marked).map((b) => b.name)).toEqual(['Ra', 'R9']);
		expect(l.bars[9].sample).toBe('strong red');
		expect(CRI_SAMPLE_NAMES[12]).toMatch(/skin/);
	});

	it('a bar at 100 runs from the zero line to the right end; no row overlaps the next', () => {
		const l = criLayout(flat(100), 640);
		for (const b of l.bars) {
			expect(b.x).toBeCloseTo(l.zeroX, 6);
			expect(b.x + b.width).toBeCloseTo(l.plotRight, 1);
		}
		for (let i = 1; i < l.bars.length; i++) expect(l.bars[i].y).toBeGreaterThanOrEqual(l.bars[i - 1].y + l.bars[i - 1].height);
	});

	it('CIE 13.3 §6: Rᵢ = 100 − 4.6 ΔEᵢ can be negative: a negative bar ends at the zero line and extends left', () => {
		// The colour core's indices for CIE F2, rounded (regression).
		const l = criLayout({ ra: 64, r: [57, 76, 90, 57, 59, 67, 74, 33, -84, 46, 47, 54, 60, 93, 47] }, 640);
		const r9 = l.bars[9];
		expect(l.x.domain()[0]).toBe(-100);
		expect(r9.x + r9.width).toBeCloseTo(l.zeroX, 6);
		expect(r9.x).toBeCloseTo(l.x(-84), 1);
		expect(l.zeroX).toBeGreaterThan(l.plotLeft);
	});

	it('common practice: guides at the rules of thumb (85 and 90) sit at their values', () => {
		const l = criLayout(flat(80), 640);
		expect(CRI_GUIDES).toEqual([85, 90]);
		expect(l.guides.map((g) => g.value)).toEqual([85, 90]);
		expect(l.guides[1].x).toBeCloseTo(l.x(90), 1);
	});

	it('names the samples only when there is room (a phone shows R1…R15 alone)', () => {
		expect(criLayout(flat(90), 328).names).toBe(false);
		expect(criLayout(flat(90), 900).names).toBe(true);
	});

	it('domain: 0 unless an index is negative, then down in steps of 20', () => {
		expect(criDomainMin([90, 12])).toBe(0);
		expect(criDomainMin([90, -1])).toBe(-20);
		expect(criDomainMin([-84])).toBe(-100);
	});

	it('throws for a missing or non-finite index', () => {
		expect(() => criLayout({ ra: NaN, r: [1] }, 640)).toThrow(RangeError);
		expect(() => criLayout({ ra: 80, r: [1, Infinity] }, 640)).toThrow(/finite/);
		expect(() => criLayout(null as never, 640)).toThrow(RangeError);
	});

	it('prints whole numbers with a real minus sign', () => {
		expect(fmtIndex(-83.9)).toBe('−84');
		expect(fmtIndex(64.06)).toBe('64');
		expect(fmtIndex(-0.2)).toBe('0');
	});
});

describe('criLayout ticks', () => {
	it('always number the lower end and zero, so a negative bar can be read on a phone', () => {
		const phone = criLayout({ ra: 71, r: [66, 78, 86, 67, 66, 68, 83, 53, -28, 48, 58, 49, 68, 92, 60] }, 328);
		expect(phone.ticks[0]).toBe(-40);
		expect(phone.ticks).toContain(0);
		expect(phone.ticks).toContain(100);
		const wide = criLayout({ ra: 71, r: [66, 78, 86, 67, 66, 68, 83, 53, -28, 48, 58, 49, 68, 92, 60] }, 900);
		expect(wide.ticks).toEqual([-40, -20, 0, 20, 40, 60, 80, 100]);
		expect(criLayout(flat(90), 328).ticks).toEqual([0, 50, 100]);
	});
});
