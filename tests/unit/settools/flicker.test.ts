/**
 * Flicker-safe shutter. Expected values are derived from the common-practice rule (film lighting crews'
 * trade practice, not a published standard): a mains-driven source pulses at 2 × mains; any shutter is
 * safe when 2 × mains / fps is whole, otherwise angle = 360 × fps × n / (2 × mains); the beat is the
 * distance of 2 × mains from the nearest whole multiple of fps; no shutter is safe above 2 × mains fps.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
	FLICKER_NOTES,
	FRAME_RATE_PRESETS,
	analyseFlicker,
	assertFlickerInput,
	beatFrequencyHz,
	beatPeriodS,
	checkExposure,
	checkShutterAngle,
	exposureErrors,
	exposureSToShutterAngle,
	flickerFreeExposures,
	flickerInputErrors,
	isInStep,
	maxFlickerFreeFps,
	pulseFrequencyHz,
	shutterAngleErrors,
	shutterAngleToExposureS
} from '../../../src/lib/settools/flicker';

const angles = (fps: number, mains: number) => flickerFreeExposures(fps, mains).map((e) => Number(e.angleDeg.toFixed(3)));
const setting = (fps: number, mains: number, angleDeg: number) => checkShutterAngle(fps, mains, angleDeg);

describe('pulse frequency', () => {
	it('common practice: a mains-driven source pulses at twice the mains frequency', () => {
		expect(pulseFrequencyHz(50)).toBe(100);
		expect(pulseFrequencyHz(60)).toBe(120);
	});
});

describe('in step: any shutter angle', () => {
	it('derived from the common-practice rule: 24 fps on 60 Hz holds 5 pulses a frame', () => {
		expect(isInStep(24, 60)).toBe(true);
		const r = analyseFlicker(24, 60);
		expect(r.inStep).toBe(true);
		expect(r.pulsesPerFrame).toBe(5);
		expect(r.beatHz).toBe(0);
		expect(r.beatPeriodS).toBe(Infinity);
		for (const a of [11.25, 90, 172.8, 180, 270, 360]) expect(setting(24, 60, a)).toMatchObject({ safe: true, reason: 'in-step', beatHz: 0 });
	});

	it('derived from the common-practice rule: 25 fps on 50 Hz holds 4 pulses a frame', () => {
		expect(isInStep(25, 50)).toBe(true);
		expect(setting(25, 50, 180).safe).toBe(true);
		expect(setting(25, 50, 45).safe).toBe(true);
	});

	it('derived from the common-practice rule: 30, 60 and 120 fps on 60 Hz, 50 and 100 fps on 50 Hz are in step', () => {
		for (const fps of [30, 60, 120]) expect(isInStep(fps, 60)).toBe(true);
		for (const fps of [50, 100]) expect(isInStep(fps, 50)).toBe(true);
	});

	it('derived from the common-practice rule: 24 fps on 50 Hz, 25 on 60 Hz and 48 on 60 Hz are not in step', () => {
		expect(isInStep(24, 50)).toBe(false);
		expect(isInStep(25, 60)).toBe(false);
		expect(isInStep(48, 60)).toBe(false);
		expect(isInStep(23.976, 60)).toBe(false);
	});
});

describe('whole-pulse shutter angles', () => {
	it('derived from the common-practice rule: 24 fps on 50 Hz → 86.4°, 172.8°, 259.2°, 345.6°', () => {
		expect(angles(24, 50)).toEqual([86.4, 172.8, 259.2, 345.6]);
		const e = flickerFreeExposures(24, 50);
		expect(e.map((x) => x.exposureS)).toEqual([1 / 100, 2 / 100, 3 / 100, 4 / 100]);
		expect(e.map((x) => x.wholeMainsCycles)).toEqual([false, true, false, true]);
	});

	it('derived from the common-practice rule: 24 fps on 50 Hz, 172.8° is safe and 180° is not', () => {
		const safe = setting(24, 50, 172.8);
		expect(safe.safe).toBe(true);
		expect(safe.reason).toBe('whole-pulses');
		expect(safe.pulses).toBeCloseTo(2, 9);
		expect(safe.exposureS).toBeCloseTo(1 / 50, 12);

		const unsafe = setting(24, 50, 180);
		expect(unsafe.safe).toBe(false);
		expect(unsafe.reason).toBe('none');
		expect(unsafe.nearest?.angleDeg).toBeCloseTo(172.8, 9);
		expect(unsafe.offsetDeg).toBeCloseTo(7.2, 9);
		expect(unsafe.below?.angleDeg).toBeCloseTo(172.8, 9);
		expect(unsafe.above?.angleDeg).toBeCloseTo(259.2, 9);
		// 100 Hz seen at 24 fps: nearest multiple 96, beat 4 Hz
		expect(unsafe.beatHz).toBeCloseTo(4, 9);
	});

	it('derived from the common-practice rule: 25 fps on 60 Hz → 150° safe (and 75°, 225°, 300°)', () => {
		expect(angles(25, 60)).toEqual([75, 150, 225, 300]);
		expect(setting(25, 60, 150).safe).toBe(true);
		expect(setting(25, 60, 300).safe).toBe(true);
		expect(setting(25, 60, 180).safe).toBe(false);
	});

	it('derived from the common-practice rule: 48 fps on 60 Hz → 144° (and 288°)', () => {
		expect(angles(48, 60)).toEqual([144, 288]);
		expect(setting(48, 60, 144).safe).toBe(true);
		expect(setting(48, 60, 180).safe).toBe(false);
	});

	it('derived from the common-practice rule: in step at 24 fps on 60 Hz the whole-pulse list ends at 360°', () => {
		expect(angles(24, 60)).toEqual([72, 144, 216, 288, 360]);
	});

	it('derived from the common-practice rule: exposures for cameras set in shutter speed', () => {
		expect(checkExposure(24, 50, 1 / 50).safe).toBe(true);
		expect(checkExposure(24, 50, 1 / 100).safe).toBe(true);
		expect(checkExposure(24, 50, 1 / 48).safe).toBe(false);
		expect(checkExposure(24, 50, 1 / 48).angleDeg).toBeCloseTo(180, 9);
		expect(checkExposure(25, 60, 1 / 60).safe).toBe(true);
		expect(checkExposure(25, 60, 1 / 50).safe).toBe(false);
	});

	it('derived from the common-practice rule: an angle typed to 0.1° counts when within 0.1 % of a pulse', () => {
		// 23.976 fps on 60 Hz: 2 pulses = 143.856°; 143.9° is 0.0006 of a pulse away
		expect(setting(23.976, 60, 143.9).safe).toBe(true);
		expect(setting(23.976, 60, 144.5).safe).toBe(false);
		// a tighter tolerance rejects the typed value
		expect(checkShutterAngle(23.976, 60, 143.9, 1e-6).safe).toBe(false);
	});

	it('derived from the common-practice rule: below the first pulse only the angle above is offered', () => {
		const c = setting(24, 50, 45);
		expect(c.safe).toBe(false);
		expect(c.below).toBeNull();
		expect(c.above?.angleDeg).toBeCloseTo(86.4, 9);
		expect(c.nearest?.angleDeg).toBeCloseTo(86.4, 9);
	});

	it('property (derived from the rule): every listed exposure holds a whole number of pulses and is ≤ 360°', () => {
		fc.assert(
			fc.property(fc.double({ min: 1, max: 200, noNaN: true }), fc.constantFrom(50, 60), (fps, mains) => {
				for (const e of flickerFreeExposures(fps, mains)) {
					expect(e.angleDeg).toBeLessThanOrEqual(360);
					expect(shutterAngleToExposureS(fps, e.angleDeg) * 2 * mains).toBeCloseTo(e.pulses, 6);
					expect(checkShutterAngle(fps, mains, e.angleDeg).safe).toBe(true);
				}
			}),
			{ numRuns: 200 }
		);
	});
});

describe('beat of rates just off step', () => {
	it('derived from the common-practice rule: 23.976 fps on 60 Hz beats at ≈ 0.12 Hz (120 − 5 × 23.976)', () => {
		expect(beatFrequencyHz(23.976, 60)).toBeCloseTo(0.12, 9);
		expect(beatPeriodS(23.976, 60)).toBeCloseTo(1 / 0.12, 6);
		const r = analyseFlicker(23.976, 60);
		expect(r.slowBeat).toBe(true);
		expect(r.inStep).toBe(false);
	});

	it('derived from the common-practice rule: 29.97 fps on 60 Hz beats at ≈ 0.12 Hz (120 − 4 × 29.97)', () => {
		expect(beatFrequencyHz(29.97, 60)).toBeCloseTo(0.12, 9);
		expect(beatFrequencyHz(59.94, 60)).toBeCloseTo(0.12, 9);
	});

	it('derived from the common-practice rule: 24 fps on 50 Hz flickers at 4 Hz, not a slow beat', () => {
		const r = analyseFlicker(24, 50);
		expect(r.beatHz).toBeCloseTo(4, 9);
		expect(r.slowBeat).toBe(false);
	});

	it('derived from the common-practice rule: the safe angles of 23.976 fps on 60 Hz are whole pulses, 360 × 23.976 × n / 120', () => {
		expect(angles(23.976, 60)).toEqual([71.928, 143.856, 215.784, 287.712, 359.64]);
	});
});

describe('high speed: no safe shutter above twice the mains', () => {
	it('common practice: the limit is 100 fps on 50 Hz and 120 fps on 60 Hz', () => {
		expect(maxFlickerFreeFps(50)).toBe(100);
		expect(maxFlickerFreeFps(60)).toBe(120);
	});

	it('derived from the common-practice rule: no safe shutter above 100 fps on 50 Hz', () => {
		for (const fps of [100.5, 120, 200, 240, 1000]) {
			const r = analyseFlicker(fps, 50);
			expect(r.noSafeShutter).toBe(true);
			expect(r.inStep).toBe(false);
			expect(r.exposures).toEqual([]);
			const c = setting(fps, 50, 360);
			expect(c.safe).toBe(false);
			expect(c.nearest).toBeNull();
			expect(c.offsetDeg).toBeNaN();
		}
	});

	it('derived from the common-practice rule: exactly 100 fps on 50 Hz is still in step (one pulse a frame)', () => {
		const r = analyseFlicker(100, 50);
		expect(r.noSafeShutter).toBe(false);
		expect(r.inStep).toBe(true);
	});

	it('derived from the common-practice rule: 240 fps on 60 Hz has no safe shutter, 120 fps does', () => {
		expect(analyseFlicker(240, 60).noSafeShutter).toBe(true);
		expect(analyseFlicker(120, 60).noSafeShutter).toBe(false);
	});
});

describe('angle and exposure conversion', () => {
	it('derived (t = angle / (360 × fps)): 180° at 24 fps is 1/48 s, and back', () => {
		expect(shutterAngleToExposureS(24, 180)).toBeCloseTo(1 / 48, 12);
		expect(exposureSToShutterAngle(24, 1 / 48)).toBeCloseTo(180, 9);
	});
});

describe('bad input', () => {
	it('zero, negative, NaN and infinite frame rates give clear messages', () => {
		expect(flickerInputErrors(0, 50)).toEqual(['The frame rate must be above 0 fps.']);
		expect(flickerInputErrors(-24, 50)).toEqual(['The frame rate must be above 0 fps.']);
		expect(flickerInputErrors(NaN, 50)).toEqual(['Enter a frame rate in frames per second.']);
		expect(flickerInputErrors(Infinity, 50)).toEqual(['The frame rate must be a finite number.']);
	});

	it('mains other than 50/60 is allowed when positive; zero, negative and NaN are not', () => {
		expect(flickerInputErrors(24, 400)).toEqual([]);
		expect(analyseFlicker(24, 59.5).unusualMains).toBe(true);
		expect(analyseFlicker(24, 50).unusualMains).toBe(false);
		expect(flickerInputErrors(24, 0)).toEqual(['The mains frequency must be above 0 Hz.']);
		expect(flickerInputErrors(24, -50)).toEqual(['The mains frequency must be above 0 Hz.']);
		expect(flickerInputErrors(24, NaN)).toEqual(['Enter the mains frequency in hertz (50 or 60).']);
		expect(flickerInputErrors(NaN, NaN)).toHaveLength(2);
	});

	it('throws a RangeError with the message', () => {
		expect(() => analyseFlicker(0, 50)).toThrow(RangeError);
		expect(() => analyseFlicker(0, 50)).toThrow('The frame rate must be above 0 fps.');
		expect(() => assertFlickerInput(24, -1)).toThrow('The mains frequency must be above 0 Hz.');
		expect(() => beatFrequencyHz(NaN, 60)).toThrow(RangeError);
		expect(() => checkShutterAngle(24, 50, 0)).toThrow('The shutter angle must be above 0°.');
		expect(() => checkShutterAngle(24, 50, 400)).toThrow('The shutter angle cannot be wider than 360°.');
		expect(() => checkShutterAngle(24, 50, NaN)).toThrow('Enter a shutter angle in degrees.');
		expect(() => checkExposure(24, 50, 1 / 20)).toThrow('longer than one frame');
		expect(() => checkExposure(24, 50, -1)).toThrow('positive time');
	});

	it('angle and exposure messages', () => {
		expect(shutterAngleErrors(180)).toEqual([]);
		expect(shutterAngleErrors(360)).toEqual([]);
		expect(exposureErrors(24, 1 / 24)).toEqual([]);
		expect(exposureErrors(24, 1 / 20)).toEqual(['An exposure cannot be longer than one frame (1/24 s at 24 fps).']);
		expect(exposureErrors(0, 1 / 50)).toEqual(['The frame rate must be above 0 fps.']);
	});
});

describe('presets', () => {
	it('offers the usual frame rates and a high-speed one', () => {
		const fps = FRAME_RATE_PRESETS.map((p) => p.fps);
		for (const f of [23.976, 24, 25, 29.97, 30, 48, 50, 59.94, 60, 96, 100, 120, 240]) expect(fps).toContain(f);
	});
});

describe('standing notes', () => {
	it('common practice: drivers vary, electronic ballasts are steady, magnetic ones and discharge lamps flicker, test first', () => {
		const text = FLICKER_NOTES.join(' ');
		expect(text).toMatch(/PWM dimming/);
		expect(text).toMatch(/Electronic ballasts don't flicker/);
		expect(text).toMatch(/magnetic ballasts and discharge lamps do/);
		expect(text).toMatch(/test shot/);
	});
});
