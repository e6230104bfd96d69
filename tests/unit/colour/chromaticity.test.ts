import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	deltaUvPrime,
	uv1960ToUvPrime,
	uv1960ToXy,
	uvPrimeToUv1960,
	uvPrimeToXy,
	xyToUv1960,
	xyToUvPrime
} from '../../../src/lib/colour/chromaticity';

describe('CIE 1960 uv and CIE 1976 u′v′', () => {
	it("D65 (0.31272, 0.32903) → u′v′ (0.1978, 0.4683) (from memory, 4 decimals)", () => {
		const p = xyToUvPrime({ x: 0.31272, y: 0.32903 });
		expect(p.u_prime.toFixed(4)).toBe('0.1978');
		expect(p.v_prime.toFixed(4)).toBe('0.4683');
	});
	it("A (0.44758, 0.40745) → u′v′ (0.2560, 0.5243) (from memory, 4 decimals)", () => {
		const p = xyToUvPrime({ x: 0.44758, y: 0.40745 });
		expect(p.u_prime.toFixed(4)).toBe('0.2560');
		expect(p.v_prime.toFixed(4)).toBe('0.5243');
	});
	it('CIE 15:2004 §8.1: u = u′, v = 2v′/3', () => {
		const xy = { x: 0.4, y: 0.38 };
		const uv = xyToUv1960(xy);
		const uvp = xyToUvPrime(xy);
		expect(uv.u).toBeCloseTo(uvp.u_prime, 15);
		expect(uv.v).toBeCloseTo((2 * uvp.v_prime) / 3, 15);
		expect(uvPrimeToUv1960(uvp).v).toBeCloseTo(uv.v, 15);
		expect(uv1960ToUvPrime(uv).v_prime).toBeCloseTo(uvp.v_prime, 15);
	});
	it('round trips xy → uv → xy and xy → u′v′ → xy (batch)', () => {
		fc.assert(
			fc.property(fc.double({ min: 0.05, max: 0.7, noNaN: true }), fc.double({ min: 0.05, max: 0.8, noNaN: true }), (x, y) => {
				fc.pre(x + y < 1);
				const a = uv1960ToXy(xyToUv1960({ x, y }));
				const b = uvPrimeToXy(xyToUvPrime({ x, y }));
				return Math.abs(a.x - x) < 1e-12 && Math.abs(a.y - y) < 1e-12 && Math.abs(b.x - x) < 1e-12 && Math.abs(b.y - y) < 1e-12;
			})
		);
	});
	it('Δu′v′ is the Euclidean distance (3-4-5 triangle)', () => {
		expect(deltaUvPrime({ u_prime: 0.2, v_prime: 0.4 }, { u_prime: 0.203, v_prime: 0.404 })).toBeCloseTo(0.005, 15);
	});
	it('degenerate inputs throw instead of returning Infinity', () => {
		expect(() => xyToUv1960({ x: 1.5, y: 0 })).toThrow(RangeError);
		expect(() => uv1960ToXy({ u: 2, v: 1 })).toThrow(RangeError);
		expect(() => xyToUvPrime({ x: NaN, y: 0.3 })).toThrow(RangeError);
	});
});
