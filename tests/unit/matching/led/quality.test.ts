import { describe, expect, it } from 'vitest';
import { genericFixture, resolveFixture } from '../../../../src/lib/matching/led/profiles';
import { nullSpace, solveLedQualityFix } from '../../../../src/lib/matching/led/quality';
import { solveLedFix } from '../../../../src/lib/matching/led/solve';

const seven = resolveFixture(genericFixture('generic-seven'));

describe('solveLedQualityFix', () => {
	it('CIE 13.3-1995 Ra: at no less than 60 % of the maximum output it finds a mix at least as good as the brightest, still exact', () => {
		const q = solveLedQualityFix(seven, { kind: 'cct', CCT: 4300 }, { metric: 'Ra', minOutput: 0.6, samples: 60 });
		const bright = solveLedFix(seven, { kind: 'cct', CCT: 4300 });
		expect(q.quality.atMaximumOutput).toBeCloseTo(bright.predicted.Ra!, 9);
		expect(q.quality.value).toBeGreaterThanOrEqual(q.quality.atMaximumOutput);
		expect(q.quality.value).toBeGreaterThan(q.quality.atMaximumOutput + 1); // regression: ≈ 91 → ≈ 97
		expect(q.quality.outputShare).toBeGreaterThanOrEqual(0.6 - 1e-9);
		expect(q.distance.duv_prime).toBeLessThan(1e-6);
		expect(Math.max(...q.channels.map((c) => c.level))).toBeCloseTo(1, 9);
		expect(q.note).toMatch(/best Ra/);
	});

	it('Academy SSI (2020): likewise for spectral similarity, and the same seed gives the same mix', () => {
		const a = solveLedQualityFix(seven, { kind: 'cct', CCT: 5600 }, { metric: 'SSI', minOutput: 0.7, samples: 30, seed: 7 });
		const b = solveLedQualityFix(seven, { kind: 'cct', CCT: 5600 }, { metric: 'SSI', minOutput: 0.7, samples: 30, seed: 7 });
		expect(a.quality.value).toBeGreaterThanOrEqual(Math.round(a.quality.atMaximumOutput) - 1e-9);
		expect(a.channels.map((c) => c.level)).toEqual(b.channels.map((c) => c.level));
		expect(a.quality.outputShare).toBeGreaterThanOrEqual(0.7 - 1e-9);
	});

	it('with minOutput 1 it keeps the brightest mix', () => {
		const q = solveLedQualityFix(seven, { kind: 'cct', CCT: 4300 }, { metric: 'Ra', minOutput: 1, samples: 10 });
		expect(q.quality.outputShare).toBeGreaterThan(1 - 1e-6);
	});

	it('refuses a bad floor or metric', () => {
		expect(() => solveLedQualityFix(seven, { kind: 'cct', CCT: 4300 }, { metric: 'Ra', minOutput: 0 })).toThrow(/minOutput/);
		// @ts-expect-error not a metric
		expect(() => solveLedQualityFix(seven, { kind: 'cct', CCT: 4300 }, { metric: 'TLCI' })).toThrow(/metric/);
	});
});

describe('nullSpace', () => {
	it('linear algebra: an orthonormal basis with A·N = 0 and dimension n − rank', () => {
		const A = [
			[1, 2, 3, 4, 5],
			[0, 1, 0, 1, 0]
		];
		const N = nullSpace(A, 5);
		expect(N).toHaveLength(3);
		for (const v of N) {
			for (const row of A) expect(row.reduce((s, a, i) => s + a * v[i], 0)).toBeCloseTo(0, 12);
			expect(Math.hypot(...v)).toBeCloseTo(1, 12);
		}
		expect(N[0].reduce((s, x, i) => s + x * N[1][i], 0)).toBeCloseTo(0, 12);
	});
});
