import { describe, expect, it } from 'vitest';
import { CIE1931_2_5NM } from '../../../src/lib/colour/data/cmfs';
import { cmfs1nm, cmfs5nm } from '../../../src/lib/colour/observers';

describe('colour-matching functions at 1 nm (Sprague from the 5 nm table)', () => {
	it('equal the CIE 5 nm table at every 5 nm point', () => {
		const one = cmfs1nm('CIE1931_2');
		for (let i = 0; i < CIE1931_2_5NM.x.length; i++) {
			expect(one.x[5 * i]).toBe(CIE1931_2_5NM.x[i]);
			expect(one.y[5 * i]).toBe(CIE1931_2_5NM.y[i]);
			expect(one.z[5 * i]).toBe(CIE1931_2_5NM.z[i]);
		}
	});
	it('ISO/CIE 11664-1 1 nm table sums over 360–830 nm: Σx̄ = 106.8655, Σȳ = 106.8569, Σz̄ = 106.8923 (from memory), within 3e-4', () => {
		const c = cmfs1nm('CIE1931_2');
		const sum = (a: Float64Array) => a.reduce((s, v) => s + v, 0);
		expect(Math.abs(sum(c.x) - 106.8655)).toBeLessThan(3e-4);
		expect(Math.abs(sum(c.y) - 106.8569)).toBeLessThan(3e-4);
		expect(Math.abs(sum(c.z) - 106.8923)).toBeLessThan(3e-4);
	});
	it('are never negative (ringing where z̄ reaches 0 is clipped)', () => {
		const c = cmfs1nm('CIE1964_10');
		expect(Math.min(...c.x, ...c.y, ...c.z)).toBeGreaterThanOrEqual(0);
	});
	it('the 5 nm table covers 360–830 nm (CIE 15:2004 Table T.4)', () => {
		const c = cmfs5nm();
		expect([c.start, c.interval, c.x.length]).toEqual([360, 5, 95]);
	});
});
