import { describe, expect, it } from 'vitest';
import { LinearProgrammeError, solveLinearProgramme } from '../../../src/lib/matching/lp';

describe('solveLinearProgramme', () => {
	// The classic two-variable textbook LP: max 3x + 5y, x ≤ 4, 2y ≤ 12, 3x + 2y ≤ 18 → x = 2, y = 6, 36.
	// (F. S. Hillier and G. J. Lieberman, "Introduction to Operations Research", the Wyndor Glass
	// example, §3.1 — from memory.)
	it('Wyndor Glass example: optimum (2, 6), value 36', () => {
		const r = solveLinearProgramme({
			objective: [3, 5],
			sense: 'max',
			lessOrEqual: [
				{ coefficients: [1, 0], rhs: 4 },
				{ coefficients: [0, 2], rhs: 12 },
				{ coefficients: [3, 2], rhs: 18 }
			]
		});
		expect(r.feasible).toBe(true);
		expect(r.x[0]).toBeCloseTo(2, 8);
		expect(r.x[1]).toBeCloseTo(6, 8);
		expect(r.value).toBeCloseTo(36, 7);
	});
	it('honours equalities and upper bounds', () => {
		// max x + y, x − y = 0, x ≤ 0.25 → (0.25, 0.25)
		const r = solveLinearProgramme({
			objective: [1, 1],
			sense: 'max',
			equalities: [{ coefficients: [1, -1], rhs: 0 }],
			upperBounds: [0.25, 1]
		});
		expect(r.x[0]).toBeCloseTo(0.25, 8);
		expect(r.x[1]).toBeCloseTo(0.25, 8);
	});
	it('reports infeasibility', () => {
		const r = solveLinearProgramme({
			objective: [1],
			sense: 'max',
			greaterOrEqual: [{ coefficients: [1], rhs: 2 }],
			upperBounds: [1]
		});
		expect(r.feasible).toBe(false);
	});
	it('minimises', () => {
		const r = solveLinearProgramme({ objective: [2, 1], sense: 'min', greaterOrEqual: [{ coefficients: [1, 1], rhs: 3 }] });
		expect(r.value).toBeCloseTo(3, 8);
		expect(r.x[1]).toBeCloseTo(3, 8);
	});
	it('throws on malformed input', () => {
		expect(() => solveLinearProgramme({ objective: [], sense: 'max' })).toThrow(LinearProgrammeError);
		expect(() => solveLinearProgramme({ objective: [Number.NaN], sense: 'max' })).toThrow(/finite/);
		expect(() =>
			solveLinearProgramme({ objective: [1, 1], sense: 'max', equalities: [{ coefficients: [1], rhs: 0 }] })
		).toThrow(/coefficients/);
	});
});
