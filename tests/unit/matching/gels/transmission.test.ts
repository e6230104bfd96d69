import { describe, expect, it } from 'vitest';
import { CCTToUv, planckianSpectrum, spectrumToXYZ, XYZToXy, xyToUv1960, xyToCCT } from '../../../../src/lib/colour';
import { GEL_DEFINITIONS } from '../../../../src/lib/matching/gels/definitions';
import {
	bandDensity,
	bandTransmission,
	conversionTargetK,
	conversionTransmission,
	FILTER_GRID,
	neutralTransmission
} from '../../../../src/lib/matching/gels/transmission';

const conversions = GEL_DEFINITIONS.filter((g) => g.model.kind === 'conversion');

function through(T: number, tau: { values: Float64Array }) {
	const P = planckianSpectrum(T, FILTER_GRID.start, FILTER_GRID.end, FILTER_GRID.interval);
	const v = P.values.map((p, i) => p * tau.values[i]);
	return XYZToXy(spectrumToXYZ({ ...P, values: v }));
}

describe('conversionTransmission (Planck ratio)', () => {
	it.each(conversions.map((g) => [g.id, g] as const))(
		"physics (Planck's law, CIE 15:2004 Planckian radiator): %s on a Planckian at T_from lands on the Planckian at T_to within 1e-5 in uv",
		(_id, g) => {
			const fromK = (g.model as { fromK: number }).fromK;
			const toK = conversionTargetK(fromK, g.miredShift as number);
			const tau = conversionTransmission(fromK, g.miredShift as number);
			const uv = xyToUv1960(through(fromK, tau));
			const ref = CCTToUv(toK);
			expect(Math.hypot(uv.u - ref.u, uv.v - ref.v)).toBeLessThan(1e-5);
		}
	);

	it.each(conversions.map((g) => [g.id, g] as const))(
		"physics (Planck vs Wien): %s keeps its mired shift within 5 % of nominal on Planckians from 2000 K up to T_from",
		(_id, g) => {
			const fromK = (g.model as { fromK: number }).fromK;
			const nominal = g.miredShift as number;
			const tau = conversionTransmission(fromK, nominal);
			for (let T = 2000; T <= fromK + 1e-9; T += (fromK - 2000) / 6) {
				const out = xyToCCT(through(T, tau)).CCT;
				const shift = 1e6 / out - 1e6 / xyToCCT(through(T, { values: new Float64Array(tau.values.length).fill(1) })).CCT;
				expect(Math.abs(shift - nominal) / Math.abs(nominal)).toBeLessThan(0.05);
			}
		}
	);

	it("physics (Wien's approximation): ln τ is close to linear in 1/λ with slope −c2·ΔM·10⁻⁶ where c2/λT is large", () => {
		const tau = conversionTransmission(3200, -131);
		const c2 = 1.4388e7; // nm·K (CIE 15:2004)
		const at = (nm: number) => tau.values[nm - FILTER_GRID.start];
		const slope = (Math.log(at(400)) - Math.log(at(500))) / (1 / 400 - 1 / 500);
		expect(slope / (-c2 * -131e-6)).toBeGreaterThan(0.98);
		expect(slope / (-c2 * -131e-6)).toBeLessThan(1.02);
	});

	it('is scaled to a 0.9 peak and never exceeds it', () => {
		const tau = conversionTransmission(6500, 159);
		expect(Math.max(...tau.values)).toBeCloseTo(0.9, 12);
		expect(Math.min(...tau.values)).toBeGreaterThan(0);
		expect(tau.start).toBe(360);
		expect(tau.values).toHaveLength(471);
	});

	it('conversionTargetK: 10⁶ / (10⁶/T + ΔM) (common practice mired arithmetic)', () => {
		expect(conversionTargetK(3200, -131)).toBeCloseTo(1e6 / (312.5 - 131), 9);
		expect(() => conversionTargetK(3200, -400)).toThrow(/no colour temperature/);
	});

	it('throws on bad inputs', () => {
		expect(() => conversionTransmission(0, 10)).toThrow(/above 0 K/);
		expect(() => conversionTransmission(3200, 10, { peak: 1.5 })).toThrow(/Peak/);
		expect(() => conversionTransmission(3200, Number.NaN)).toThrow();
	});
});

describe('bandTransmission and neutralTransmission', () => {
	it('definition of density: τ = 0.9·10^(−D), D = 0.30 at the centre of a single band (≈ CC 30, common practice)', () => {
		const bands = [{ centre: 560, sigma: 35, peakDensity: 0.3 }];
		const tau = bandTransmission(bands);
		expect(tau.values[560 - 360]).toBeCloseTo(0.9 * 10 ** -0.3, 12);
		expect(tau.values[360 - 360]).toBeCloseTo(0.9, 6);
		expect(bandDensity(560 + 35, bands)).toBeCloseTo(0.3 * Math.exp(-0.5), 12);
	});
	it('neutral density 0.3 transmits 10^−0.3 ≈ 0.501 everywhere', () => {
		const tau = neutralTransmission(0.3);
		expect(Math.min(...tau.values)).toBeCloseTo(10 ** -0.3, 12);
		expect(Math.max(...tau.values)).toBeCloseTo(10 ** -0.3, 12);
	});
	it('throws on bad bands or density', () => {
		expect(() => bandTransmission([{ centre: 560, sigma: 0, peakDensity: 0.3 }])).toThrow(/σ/);
		expect(() => neutralTransmission(-1)).toThrow(/≥ 0/);
	});
});
