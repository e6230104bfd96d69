import { describe, expect, it } from 'vitest';
import { equalKelvinSteps, equalMiredSteps, miredBetween } from '$lib/components/lab/steps';

describe('the equal-steps lesson', () => {
	it('common practice: 4000 → 3000 K is 83 mired, 7000 → 6000 K is 24', () => {
		expect(Math.round(miredBetween(4000, 3000))).toBe(83);
		expect(Math.round(miredBetween(7000, 6000))).toBe(24);
	});

	it('equal kelvin steps shrink in mired and on the chart as the kelvin rises', () => {
		const k = equalKelvinSteps();
		expect(k.map((p) => p.K)).toEqual([2000, 3000, 4000, 5000, 6000, 7000, 8000, 9000, 10000]);
		// 10⁶/2000 − 10⁶/3000 = 166.7; 10⁶/9000 − 10⁶/10000 = 11.1 (mired definition).
		expect(k[0].next!.mired).toBeCloseTo(166.667, 3);
		expect(k[7].next!.mired).toBeCloseTo(11.111, 3);
		expect(k[8].next).toBeNull();
		for (let i = 1; i < k.length - 1; i++) expect(k[i].next!.deltaUvPrime).toBeLessThan(k[i - 1].next!.deltaUvPrime);
		expect(k[0].next!.deltaUvPrime / k[7].next!.deltaUvPrime).toBeGreaterThan(8);
	});

	it('equal mired steps stay far more even on the chart', () => {
		const m = equalMiredSteps();
		expect(m.map((p) => Math.round(p.K))).toEqual([2000, 2222, 2500, 2857, 3333, 4000, 5000, 6667, 10000]);
		for (const p of m.slice(0, -1)) expect(p.next!.mired).toBeCloseTo(50, 9);
		const d = m.slice(0, -1).map((p) => p.next!.deltaUvPrime);
		const k = equalKelvinSteps().slice(0, -1).map((p) => p.next!.deltaUvPrime);
		expect(Math.max(...d) / Math.min(...d)).toBeLessThan(Math.max(...k) / Math.min(...k) / 3);
	});

	it('throws on an empty or backward run', () => {
		expect(() => equalKelvinSteps(3000, 2000)).toThrow(/kelvin run/);
		expect(() => equalKelvinSteps(2000, 3000, 0)).toThrow(/kelvin run/);
		expect(() => equalMiredSteps(100, 500)).toThrow(/mired run/);
		expect(() => miredBetween(0, 3000)).toThrow();
	});
});
