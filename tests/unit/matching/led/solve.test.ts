import { describe, expect, it } from 'vitest';
import { CCTToXy, xyToUvPrime } from '../../../../src/lib/colour';
import { dmx16ToLevel, levelToDmx8 } from '../../../../src/lib/matching/dmx';
import { genericFixture, resolveFixture, type ResolvedFixture } from '../../../../src/lib/matching/led/profiles';
import { mixXYZ, solveLedFix } from '../../../../src/lib/matching/led/solve';
import { fourChannelFixture, uvp } from '../factories';

/**
 * Brute force, written independently of the solver: with two channels' levels on a grid, the other
 * two follow from the chromaticity equations in the XYZ form Σ lᵢ(Xᵢ − x/y·Yᵢ) = 0,
 * Σ lᵢ(Zᵢ − z/y·Yᵢ) = 0 (CIE 15:2004 §7.3); keep the brightest mix with all levels in 0..1.
 */
function bruteMaxY(f: ResolvedFixture, xy: { x: number; y: number }, steps = 200): number {
	const z = 1 - xy.x - xy.y;
	const a = f.channels.map((c) => c.XYZ.X - (xy.x / xy.y) * c.XYZ.Y);
	const b = f.channels.map((c) => c.XYZ.Z - (z / xy.y) * c.XYZ.Y);
	let best = 0;
	const n = f.channels.length;
	for (let p = 0; p < n; p++)
		for (let q = p + 1; q < n; q++) {
			const [r, s] = [...Array(n).keys()].filter((k) => k !== p && k !== q);
			const det = a[r] * b[s] - a[s] * b[r];
			for (let i = 0; i <= steps; i++)
				for (let j = 0; j <= steps; j++) {
					const lp = i / steps;
					const lq = j / steps;
					const rhsA = -(a[p] * lp + a[q] * lq);
					const rhsB = -(b[p] * lp + b[q] * lq);
					const lr = (rhsA * b[s] - a[s] * rhsB) / det;
					const ls = (a[r] * rhsB - rhsA * b[r]) / det;
					if (lr < -1e-12 || lr > 1 + 1e-12 || ls < -1e-12 || ls > 1 + 1e-12) continue;
					const l = new Array(n).fill(0);
					l[p] = lp;
					l[q] = lq;
					l[r] = lr;
					l[s] = ls;
					best = Math.max(best, mixXYZ(f, l).Y);
				}
		}
	return best;
}

describe('solveLedFix inside the gamut', () => {
	const f = resolveFixture(fourChannelFixture());

	it.each([3200, 4300, 5600])('reproduces a %i K target within Δu′v′ 1e-4 (in practice to rounding)', (T) => {
		const r = solveLedFix(f, { kind: 'cct', CCT: T }, { quality: false });
		expect(r.inGamut).toBe(true);
		expect(r.distance.duv_prime).toBeLessThan(1e-4);
		expect(r.distance.duv_prime).toBeLessThan(1e-9);
	});

	it.each([3200, 5600])('gives the most light any exact mix gives at %i K (brute force over a 4-channel fixture)', (T) => {
		const xy = CCTToXy(T, 0);
		const r = solveLedFix(f, { x: xy.x, y: xy.y }, { quality: false });
		const brute = bruteMaxY(f, xy);
		expect(r.output).toBeGreaterThanOrEqual(brute - 1e-9);
		expect(r.output - brute).toBeLessThan(0.01 * brute); // the grid only approaches the optimum
		expect(Math.max(...r.channels.map((c) => c.level))).toBeCloseTo(1, 9);
	});

	it('three channels: the unique mix (up to scale) from solving XYZ = M·l directly (CIE 15:2004 §7.3)', () => {
		const rgb = resolveFixture(genericFixture('generic-rgb'));
		const xy = CCTToXy(5000, 0);
		const t = [xy.x / xy.y, 1, (1 - xy.x - xy.y) / xy.y];
		const M = [0, 1, 2].map((row) => rgb.channels.map((c) => [c.XYZ.X, c.XYZ.Y, c.XYZ.Z][row]));
		// Cramer's rule for M·l = t.
		const det3 = (m: number[][]) =>
			m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
		const D = det3(M);
		const l = [0, 1, 2].map((k) => det3(M.map((row, i) => row.map((v, j) => (j === k ? t[i] : v)))) / D);
		const max = Math.max(...l);
		const r = solveLedFix(rgb, { x: xy.x, y: xy.y }, { quality: false });
		r.channels.forEach((c, i) => expect(c.level).toBeCloseTo(l[i] / max, 9));
	});

	it('seven channels: exact at 2700–6500 K with at least one channel at full; levels in %, 8-bit and 16-bit DMX agree', () => {
		const seven = resolveFixture(genericFixture('generic-seven'));
		for (const T of [2700, 4300, 6500]) {
			const r = solveLedFix(seven, { kind: 'cct', CCT: T });
			expect(r.distance.duv_prime).toBeLessThan(1e-9);
			expect(r.channels).toHaveLength(7);
			expect(Math.max(...r.channels.map((c) => c.level))).toBeCloseTo(1, 9);
			for (const c of r.channels) {
				expect(c.percent).toBeCloseTo(c.level * 100, 12);
				expect(c.dmx8).toBe(levelToDmx8(c.level));
				expect(Math.abs(dmx16ToLevel(c.dmx16.coarse, c.dmx16.fine) - c.level)).toBeLessThanOrEqual(0.5 / 65535 + 1e-12);
			}
			expect(r.predicted.Ra).toBeGreaterThan(50);
			expect(r.relativeOutput).toBeGreaterThan(0);
			expect(r.relativeOutput).toBeLessThanOrEqual(1);
			expect(r.bicolour).toBeNull();
		}
	});
});

describe('solveLedFix on the gamut edge', () => {
	it('a red–green mix colour (on the hull edge) is met exactly with only those two channels', () => {
		const f = resolveFixture(fourChannelFixture());
		const edge = mixXYZ(f, [1, 0.5, 0, 0]);
		const s = edge.X + edge.Y + edge.Z;
		const r = solveLedFix(f, { x: edge.X / s, y: edge.Y / s }, { quality: false });
		expect(r.distance.duv_prime).toBeLessThan(1e-9);
		expect(r.channels[0].level).toBeCloseTo(1, 6);
		expect(r.channels[1].level).toBeCloseTo(0.5, 6);
		expect(r.channels[2].level + r.channels[3].level).toBeLessThan(1e-6);
	});
});

describe('solveLedFix outside the gamut', () => {
	it('finds the nearest reachable u′v′ (brute force over a 21⁴ grid of levels) and says so', () => {
		const f = resolveFixture(fourChannelFixture());
		const target = { x: 0.05, y: 0.6 };
		const r = solveLedFix(f, target, { quality: false });
		expect(r.inGamut).toBe(false);
		expect(r.note).toMatch(/outside this fixture's gamut/);
		const t = xyToUvPrime(target);
		let best = Infinity;
		const s = 20;
		for (let a = 0; a <= s; a++)
			for (let b = 0; b <= s; b++)
				for (let c = 0; c <= s; c++)
					for (let d = 0; d <= s; d++) {
						if (a + b + c + d === 0) continue;
						const p = uvp(mixXYZ(f, [a / s, b / s, c / s, d / s]));
						best = Math.min(best, Math.hypot(p.u - t.u_prime, p.v - t.v_prime));
					}
		expect(r.distance.duv_prime).toBeLessThanOrEqual(best + 1e-12);
		expect(best - r.distance.duv_prime).toBeLessThan(2e-3);
		expect(Math.max(...r.channels.map((c) => c.level))).toBeCloseTo(1, 9);
	});

	it('bi-colour: the warm–cool line passes below the locus mid-range, so a 4000 K target is reached as a CCT setting plus a Duv still missing', () => {
		const r = solveLedFix(genericFixture('generic-bicolour'), { kind: 'cct', CCT: 4000 });
		expect(r.inGamut).toBe(false);
		expect(r.bicolour).not.toBeNull();
		expect(Math.abs(r.bicolour!.cctSettingK! - 4000)).toBeLessThan(150);
		expect(r.bicolour!.mixDuv!).toBeLessThan(0);
		expect(r.bicolour!.greenMagentaDuv!).toBeCloseTo(r.target.Duv! - r.bicolour!.mixDuv!, 12);
		expect(r.bicolour!.note).toMatch(/toward green/);
	});

	it('bi-colour: a target on the warm–cool line is met exactly with no green/magenta offset', () => {
		const f = resolveFixture(genericFixture('generic-bicolour'));
		const mid = mixXYZ(f, [1, 0.5]);
		const s = mid.X + mid.Y + mid.Z;
		const r = solveLedFix(f, { x: mid.X / s, y: mid.Y / s });
		expect(r.distance.duv_prime).toBeLessThan(1e-9);
		expect(r.channels[0].level).toBeCloseTo(1, 9);
		expect(r.channels[1].level).toBeCloseTo(0.5, 9);
		expect(Math.abs(r.bicolour!.greenMagentaDuv!)).toBeLessThan(1e-9);
		expect(r.bicolour!.note).toMatch(/No green\/magenta offset/);
	});
});
