import { describe, expect, it } from 'vitest';
import { planckianUvAtLnT, planckianUvExact } from '../../../../src/lib/colour/temperature/planckian-locus';
import { planckianLocusXy } from '../../../../src/lib/colour/illuminants/loci';

describe('Planckian locus table', () => {
	it('Hermite interpolation of the table equals direct summation within 1e-10 in uv (500–100000 K)', () => {
		let worst = 0;
		for (let T = 500; T < 1e5; T *= 1.0137) {
			const a = planckianUvAtLnT(Math.log(T));
			const b = planckianUvExact(T);
			worst = Math.max(worst, Math.abs(a.u - b.u), Math.abs(a.v - b.v));
		}
		expect(worst).toBeLessThan(1e-10);
	});
	it('the analytic derivative matches a finite difference', () => {
		const T = 3000;
		const h = 1e-5;
		const a = planckianUvExact(T * Math.exp(h));
		const b = planckianUvExact(T * Math.exp(-h));
		const p = planckianUvExact(T);
		expect(p.du).toBeCloseTo((a.u - b.u) / (2 * h), 8);
		expect(p.dv).toBeCloseTo((a.v - b.v) / (2 * h), 8);
	});
	it('CIE 15:2004 Table T.3: the Planckian radiator at 2855.5 K (illuminant A) is at (0.44758, 0.40745), within 4e-5', () => {
		const [p] = planckianLocusXy([(2848 * 1.4388) / 1.435]);
		expect(Math.abs(p.x - 0.44758)).toBeLessThan(4e-5);
		expect(Math.abs(p.y - 0.40745)).toBeLessThan(4e-5);
	});
	it('rejects non-positive temperatures', () => {
		expect(() => planckianUvExact(0)).toThrow(/positive/);
		expect(() => planckianUvExact(NaN)).toThrow(/positive/);
	});
});
