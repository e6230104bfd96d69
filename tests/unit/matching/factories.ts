/** Small factories for matching tests (invented data built from models; not measured data). */
import { makeSpectrum, planckianSpectrum, type Spectrum } from '../../../src/lib/colour';
import type { FixtureProfile } from '../../../src/lib/matching/led/profiles';
import { resolveTargetWhite, type TargetWhite } from '../../../src/lib/matching/target';

/** A Planckian source at T kelvin on start…end at step nm (relative). */
export function planck(T: number, start = 360, end = 830, step = 1): Spectrum {
	return planckianSpectrum(T, start, end, step);
}

/** Values f(λ) on start…end nm at step. */
export function spectrumOf(f: (nm: number) => number, start = 380, end = 780, step = 5): Spectrum {
	const n = Math.round((end - start) / step) + 1;
	const v: number[] = [];
	for (let i = 0; i < n; i++) v.push(f(start + i * step));
	return makeSpectrum(start, step, v);
}

/** A target white at CCT (K) and Duv. */
export function cctTarget(CCT: number, Duv = 0, tolerance?: number): TargetWhite {
	return resolveTargetWhite({ kind: 'cct', CCT, Duv }, { tolerance });
}

/** An invented four-channel fixture: R, G, B LEDs and a cool phosphor white. */
export function fourChannelFixture(): FixtureProfile {
	return {
		id: 'test-rgbw',
		label: 'Test RGBW (invented)',
		kind: 'rgbw',
		description: 'invented for tests',
		generic: true,
		channels: [
			{ id: 'R', label: 'Red', emitter: { kind: 'led', peak: 625, halfWidth: 22 }, maxFlux: 0.3 },
			{ id: 'G', label: 'Green', emitter: { kind: 'led', peak: 530, halfWidth: 35 }, maxFlux: 0.7 },
			{ id: 'B', label: 'Blue', emitter: { kind: 'led', peak: 460, halfWidth: 24 }, maxFlux: 0.1 },
			{
				id: 'W',
				label: 'White',
				emitter: {
					kind: 'phosphor',
					bands: [
						{ peak: 450, halfWidth: 22, weight: 1 },
						{ peak: 560, halfWidth: 110, weight: 0.6 }
					]
				},
				maxFlux: 1
			}
		]
	};
}

/** u'v' of XYZ. */
export function uvp(c: { X: number; Y: number; Z: number }): { u: number; v: number } {
	const d = c.X + 15 * c.Y + 3 * c.Z;
	return { u: (4 * c.X) / d, v: (9 * c.Y) / d };
}
