import { describe, expect, it } from 'vitest';
import { valueAt } from '../../../../src/lib/colour';
import { getGel } from '../../../../src/lib/matching/gels/library';
import { stackTransmission } from '../../../../src/lib/matching/gels/stack';

describe('stackTransmission', () => {
	it('physics (filters in series multiply, Beer–Lambert): ½ CTB + ¼ plus green is the product at every nm, in either order', () => {
		const a = getGel('ctb-half');
		const b = getGel('plusgreen-quarter');
		const ab = stackTransmission([a, b]);
		const ba = stackTransmission([b, a]);
		expect(ab.start).toBe(380);
		expect(ab.values).toHaveLength(401);
		for (const nm of [400, 500, 560, 650, 780]) {
			const want = valueAt(a.transmission, nm, 'hold') * valueAt(b.transmission, nm, 'hold');
			expect(ab.values[nm - 380]).toBeCloseTo(want, 12);
			expect(ba.values[nm - 380]).toBeCloseTo(want, 12);
		}
	});

	it('ND 0.3 twice is density 0.6 (densities add): 10^−0.6 everywhere', () => {
		const nd = getGel('nd-0.3');
		const t = stackTransmission([nd, nd], 400, 700, 10);
		expect(t.values).toHaveLength(31);
		for (const v of t.values) expect(v).toBeCloseTo(10 ** -0.6, 9);
	});

	it('an empty stack is clear, and a bad grid is refused', () => {
		expect([...stackTransmission([], 380, 390, 5).values]).toEqual([1, 1, 1]);
		expect(() => stackTransmission([], 500, 400)).toThrow(RangeError);
	});
});
