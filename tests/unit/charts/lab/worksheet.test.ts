import { describe, expect, it } from 'vitest';
import { makeWorksheet, nextSeed, parseSeed, seededRandom, SEED_MAX } from '$lib/components/lab/worksheet';

const numbers = (s: string) => [...s.matchAll(/\d+(?:\.\d+)?/g)].map((m) => Number(m[0]));

describe('seededRandom', () => {
	it('repeats its sequence for a seed and differs between seeds (regression)', () => {
		const a = seededRandom(42);
		const b = seededRandom(42);
		const c = seededRandom(43);
		const sa = [a(), a(), a()];
		expect([b(), b(), b()]).toEqual(sa);
		expect([c(), c(), c()]).not.toEqual(sa);
		for (const v of sa) expect(v >= 0 && v < 1).toBe(true);
	});
});

describe('parseSeed and nextSeed', () => {
	it('accepts 1 … 99999 and falls back otherwise', () => {
		expect(parseSeed('4821')).toBe(4821);
		expect(parseSeed(null)).toBe(1);
		expect(parseSeed('0')).toBe(1);
		expect(parseSeed('100000')).toBe(1);
		expect(parseSeed('12a')).toBe(1);
		expect(parseSeed('-5', 7)).toBe(7);
	});

	it('always gives a different set', () => {
		let calls = 0;
		const stuck = () => (calls++ < 3 ? 0 : 0.5); // returns set 1 three times, then another
		expect(nextSeed(1, stuck)).not.toBe(1);
		expect(nextSeed(5)).toBeLessThanOrEqual(SEED_MAX);
	});
});

describe('makeWorksheet', () => {
	it('gives the same sheet for the same set number and a different one for another', () => {
		expect(makeWorksheet(7)).toEqual(makeWorksheet(7));
		expect(makeWorksheet(7).exercises.map((e) => e.question)).not.toEqual(makeWorksheet(8).exercises.map((e) => e.question));
	});

	it('has eight exercises of the five kinds, each with an answer and working', () => {
		const w = makeWorksheet(123);
		expect(w.exercises.map((e) => e.kind)).toEqual(['to-mired', 'to-kelvin', 'shift', 'shift', 'gel', 'gel', 'stack', 'stack']);
		for (const e of w.exercises) {
			expect(e.answer.length).toBeGreaterThan(0);
			expect(e.working.length).toBeGreaterThan(0);
		}
	});

	it('answers the conversions with M = 10⁶ / K (mired definition, common practice)', () => {
		for (const seed of [1, 2, 3, 500, 99999]) {
			const [toM, toK] = makeWorksheet(seed).exercises;
			const K = numbers(toM.question)[0];
			expect(numbers(toM.answer)[0]).toBeCloseTo(1e6 / K, 1);
			const M = numbers(toK.question)[0];
			expect(numbers(toK.answer)[0]).toBe(Math.round(1e6 / M));
		}
	});

	it('answers a shift with 10⁶/target − 10⁶/source and the right family', () => {
		for (const seed of [11, 12, 13]) {
			const [, , coolward, warmward] = makeWorksheet(seed).exercises;
			const [a, b] = numbers(coolward.question);
			expect(a).toBeLessThan(b);
			expect(coolward.answer).toContain('CTB');
			expect(coolward.answer).toContain(`−${Math.abs(1e6 / b - 1e6 / a).toFixed(1)} mired`);
			const [c, d] = numbers(warmward.question);
			expect(c).toBeGreaterThan(d);
			expect(warmward.answer).toContain('CTO');
			expect(warmward.answer).toContain(`+${(1e6 / d - 1e6 / c).toFixed(1)} mired`);
		}
	});

	it('answers a gel exercise with 10⁶ / (10⁶/K + shift) (shifts add, common practice)', () => {
		for (const seed of [21, 22, 23, 24]) {
			for (const e of makeWorksheet(seed).exercises.filter((x) => x.kind === 'gel')) {
				const K = numbers(e.question)[0];
				const m = /nominal ([+−])([\d.]+) mired/.exec(e.question)!;
				const shift = (m[1] === '−' ? -1 : 1) * Number(m[2]);
				expect(numbers(e.answer)[0]).toBe(Math.round(1e6 / (1e6 / K + shift)));
			}
		}
	});

	it('refuses a set number outside 1 … 99999', () => {
		expect(() => makeWorksheet(0)).toThrow(/1 to 99999/);
		expect(() => makeWorksheet(1.5)).toThrow(/whole number/);
		expect(() => makeWorksheet(Number.NaN)).toThrow(/whole number/);
	});
});
