/**
 * Flicker-safe shutter arithmetic for light sources that pulse with the mains.
 *
 * A lamp fed from an AC supply of frequency f follows the instantaneous power
 * p(t) = V·I·sin²(2πft) = (V·I / 2)·(1 − cos 4πft), so its light pulses at 2f: 100 Hz on 50 Hz mains,
 * 120 Hz on 60 Hz. Every frame is equally bright in two cases:
 *
 *  1. **In step**: each frame period 1/fps holds a whole number of pulses (2f / fps is a whole number),
 *     so every exposure starts at the same point of the pulse and any shutter angle works
 *     (24 fps on 60 Hz, 25 fps on 50 Hz).
 *  2. **Whole pulses per exposure**: the exposure t = angle / (360 · fps) holds n whole pulses; the
 *     integral of a periodic wave over whole periods does not depend on where it starts, so the frame
 *     rate no longer matters: angle = 360 · fps · n / (2f), n = 1, 2, … while angle ≤ 360°.
 *
 * Otherwise the start of each exposure slides along the pulse from frame to frame and the brightness
 * beats at the distance of 2f from the nearest whole multiple of fps (the alias of 2f sampled at fps):
 * 120 − 5 × 23.976 = 0.12 Hz for 23.976 fps on 60 Hz. Above fps = 2f even a 360° exposure is shorter
 * than one pulse and no shutter is safe.
 *
 * The rule (cases 1 and 2 and the 2f limit) is common practice among film lighting crews; every number
 * this file returns is derived from it by arithmetic. It only covers sources whose light follows the
 * mains: LED drivers (PWM dimming) and ballasts have their own behaviour, which a test shot settles.
 *
 * Units: frame rates in frames per second (fps), frequencies in hertz, shutter angles in degrees
 * (0 < angle ≤ 360), exposures in seconds.
 *
 * References:
 *  - Common practice (film lighting crews' flicker rule): the project's trade notes, section "Flicker".
 *  - Instantaneous power of a sinusoidal supply, p(t) = V_m·I_m·sin²(ωt) for a resistive load:
 *    J. W. Nilsson and S. A. Riedel, Electric Circuits, 10th ed., Pearson, 2015, ch. 10
 *    (chapter from memory).
 *  - Aliasing of a periodic signal sampled at a lower rate: A. V. Oppenheim and R. W. Schafer,
 *    Discrete-Time Signal Processing, 3rd ed., Pearson, 2010, ch. 4 (chapter from memory).
 */

/** A mains-driven source gives two light pulses per mains cycle (one per half-cycle). */
export const PULSES_PER_MAINS_CYCLE = 2;

/** The two mains frequencies in use around the world, hertz. Others are allowed (generators, 400 Hz). */
export const MAINS_PRESETS_HZ: readonly number[] = [50, 60];

export interface FrameRatePreset {
	fps: number;
	label: string;
}

/**
 * Frame rates offered as one-tap choices. The 1000/1001 rates are entered as their usual decimals
 * (23.976 for 24000/1001): the beat they give differs from the exact rate by under 0.1 %.
 */
export const FRAME_RATE_PRESETS: readonly FrameRatePreset[] = [
	23.976, 24, 25, 29.97, 30, 48, 50, 59.94, 60, 96, 100, 120, 240
].map((fps) => ({ fps, label: String(fps) }));

/**
 * Our own choice, not a trade figure: how close to a whole number of pulses an exposure must be to count
 * as flicker-free, as a fraction of one pulse. 0.001 accepts angles typed to 0.1° (143.9° for 143.856°).
 */
export const DEFAULT_PULSE_TOLERANCE = 0.001;

/** Our own choice: beats slower than this (hertz) are called a slow beat, easy to miss on a monitor. */
export const SLOW_BEAT_HZ = 1;

/** Relative tolerance for "a whole number" in exact arithmetic (floating-point noise only). */
const EXACT = 1e-9;

/**
 * Plain-language problems with a frame rate and mains frequency; an empty list means both are usable.
 * Mains frequencies other than 50 and 60 Hz are allowed as long as they are positive and finite.
 */
export function flickerInputErrors(fps: number, mainsHz: number): string[] {
	const errors: string[] = [];
	if (typeof fps !== 'number' || Number.isNaN(fps)) errors.push('Enter a frame rate in frames per second.');
	else if (!Number.isFinite(fps)) errors.push('The frame rate must be a finite number.');
	else if (fps <= 0) errors.push('The frame rate must be above 0 fps.');
	if (typeof mainsHz !== 'number' || Number.isNaN(mainsHz)) errors.push('Enter the mains frequency in hertz (50 or 60).');
	else if (!Number.isFinite(mainsHz)) errors.push('The mains frequency must be a finite number.');
	else if (mainsHz <= 0) errors.push('The mains frequency must be above 0 Hz.');
	return errors;
}

/** Throws a RangeError carrying the messages of `flickerInputErrors` when the input is unusable. */
export function assertFlickerInput(fps: number, mainsHz: number): void {
	const errors = flickerInputErrors(fps, mainsHz);
	if (errors.length > 0) throw new RangeError(errors.join(' '));
}

/** True for a mains frequency that is neither 50 nor 60 Hz (worth a second look, not an error). */
export function isUnusualMains(mainsHz: number): boolean {
	return !MAINS_PRESETS_HZ.includes(mainsHz);
}

/** Pulse frequency of a mains-driven source, Hz: 2 × mains (common practice; sin² has twice the frequency). */
export function pulseFrequencyHz(mainsHz: number): number {
	assertFlickerInput(1, mainsHz);
	return PULSES_PER_MAINS_CYCLE * mainsHz;
}

/** Pulses in one frame period: 2f / fps (dimensionless). */
export function pulsesPerFrame(fps: number, mainsHz: number): number {
	assertFlickerInput(fps, mainsHz);
	return pulseFrequencyHz(mainsHz) / fps;
}

function isWhole(x: number, tolerance: number): boolean {
	const k = Math.round(x);
	return k >= 1 && Math.abs(x - k) <= tolerance;
}

/** In step: each frame period holds a whole number (≥ 1) of pulses, so any shutter angle is flicker-free. */
export function isInStep(fps: number, mainsHz: number): boolean {
	const r = pulsesPerFrame(fps, mainsHz);
	return isWhole(r, EXACT * Math.max(1, r));
}

/** Exposure time of a shutter angle, seconds: t = angle / (360 · fps). */
export function shutterAngleToExposureS(fps: number, angleDeg: number): number {
	assertFlickerInput(fps, 1);
	return angleDeg / (360 * fps);
}

/** Shutter angle of an exposure time, degrees: angle = 360 · fps · t. */
export function exposureSToShutterAngle(fps: number, exposureS: number): number {
	assertFlickerInput(fps, 1);
	return 360 * fps * exposureS;
}

/** The highest frame rate with any flicker-free shutter, fps: 2 × mains (a 360° exposure holds one pulse). */
export function maxFlickerFreeFps(mainsHz: number): number {
	return pulseFrequencyHz(mainsHz);
}

/** Above 2 × mains fps even a 360° exposure is shorter than one pulse: no shutter is safe. */
export function hasNoSafeShutter(fps: number, mainsHz: number): boolean {
	return pulsesPerFrame(fps, mainsHz) < 1 - EXACT;
}

/**
 * Beat frequency of the frame-to-frame brightness, Hz: |2f − k · fps| with k the whole number nearest
 * 2f / fps (the alias of the pulse frequency at the frame rate). 0 when in step.
 */
export function beatFrequencyHz(fps: number, mainsHz: number): number {
	if (isInStep(fps, mainsHz)) return 0;
	const p = pulseFrequencyHz(mainsHz);
	return Math.abs(p - Math.round(p / fps) * fps);
}

/** Seconds for one brightness cycle of the beat: 1 / beat; Infinity when in step. */
export function beatPeriodS(fps: number, mainsHz: number): number {
	const beat = beatFrequencyHz(fps, mainsHz);
	return beat === 0 ? Infinity : 1 / beat;
}

/** One flicker-free exposure: `pulses` whole pulses, as a shutter angle and as an exposure time. */
export interface FlickerFreeExposure {
	/** n, the whole number of pulses the exposure holds. */
	pulses: number;
	/** degrees, 0 < angle ≤ 360 */
	angleDeg: number;
	/** seconds: n / (2 × mains) */
	exposureS: number;
	/** True when n is even: the exposure also holds whole mains cycles (derived: safer if a source's two half-cycles differ). */
	wholeMainsCycles: boolean;
}

/** How many flicker-free exposures fit in one frame: ⌊2f / fps⌋ (0 above 2 × mains fps). */
export function flickerFreeExposureCount(fps: number, mainsHz: number): number {
	const r = pulsesPerFrame(fps, mainsHz);
	return Math.floor(r + EXACT * Math.max(1, r));
}

/**
 * Shutter angles whose exposure holds a whole number of pulses (common practice):
 * angle = 360 · fps · n / (2 · mains), n = 1, 2, … while ≤ 360°. At most `limit` entries, smallest first.
 */
export function flickerFreeExposures(fps: number, mainsHz: number, limit = 100): FlickerFreeExposure[] {
	const count = Math.min(flickerFreeExposureCount(fps, mainsHz), Math.max(0, Math.floor(limit)));
	const out: FlickerFreeExposure[] = [];
	for (let n = 1; n <= count; n++) out.push(exposureOfPulses(fps, mainsHz, n));
	return out;
}

/** The exposure holding n whole pulses: angle = 360 · fps · n / (2 · mains) degrees, t = n / (2 · mains) s. */
function exposureOfPulses(fps: number, mainsHz: number, n: number): FlickerFreeExposure {
	const p = PULSES_PER_MAINS_CYCLE * mainsHz;
	return { pulses: n, angleDeg: Math.min(360, (360 * fps * n) / p), exposureS: n / p, wholeMainsCycles: n % 2 === 0 };
}

/** Everything the shutter panel shows for one frame rate and mains frequency. */
export interface FlickerReport {
	fps: number;
	mainsHz: number;
	/** Hz, 2 × mains */
	pulseHz: number;
	pulsesPerFrame: number;
	/** Any shutter angle is flicker-free. */
	inStep: boolean;
	/** Even 360° is shorter than one pulse: no shutter is flicker-free. */
	noSafeShutter: boolean;
	/** fps above which no shutter is safe (2 × mains). */
	maxSafeFps: number;
	/** Whole-pulse exposures, smallest first (at most 100). */
	exposures: FlickerFreeExposure[];
	/** How many whole-pulse exposures exist in all (may exceed `exposures.length` at very low fps). */
	exposureCount: number;
	/** Hz; 0 when in step. What an angle outside `exposures` shows. */
	beatHz: number;
	/** Seconds per brightness cycle; Infinity when in step. */
	beatPeriodS: number;
	/** A beat slower than SLOW_BEAT_HZ: the rate is just off step and the drift is easy to miss. */
	slowBeat: boolean;
	/** Mains other than 50 or 60 Hz. */
	unusualMains: boolean;
}

/** The whole picture for a frame rate on a mains frequency (throws RangeError on unusable input). */
export function analyseFlicker(fps: number, mainsHz: number): FlickerReport {
	assertFlickerInput(fps, mainsHz);
	const inStep = isInStep(fps, mainsHz);
	const beatHz = beatFrequencyHz(fps, mainsHz);
	return {
		fps,
		mainsHz,
		pulseHz: pulseFrequencyHz(mainsHz),
		pulsesPerFrame: pulsesPerFrame(fps, mainsHz),
		inStep,
		noSafeShutter: hasNoSafeShutter(fps, mainsHz),
		maxSafeFps: maxFlickerFreeFps(mainsHz),
		exposures: flickerFreeExposures(fps, mainsHz),
		exposureCount: flickerFreeExposureCount(fps, mainsHz),
		beatHz,
		beatPeriodS: beatPeriodS(fps, mainsHz),
		slowBeat: !inStep && beatHz > 0 && beatHz < SLOW_BEAT_HZ,
		unusualMains: isUnusualMains(mainsHz)
	};
}

/**
 * Standing notes beside every flicker answer (common practice): the rule above covers sources that
 * follow the mains, not every driver, and only a test shot proves a setting.
 */
export const FLICKER_NOTES: readonly string[] = [
	'LED drivers and ballasts vary. PWM dimming can pulse at its own rate, unrelated to the mains, and its roll bars are often invisible on set and cannot be fixed in post.',
	"Electronic ballasts don't flicker; magnetic ballasts and discharge lamps do.",
	'A test shot at the frame rate and shutter you will use, before the take, is the final word.'
];

/** The verdict on one shutter setting. */
export interface ShutterCheck {
	angleDeg: number;
	exposureS: number;
	/** Pulses the exposure holds: exposure × 2f. */
	pulses: number;
	safe: boolean;
	/** Why it is safe: the rate is in step, or the exposure holds whole pulses; 'none' when unsafe. */
	reason: 'in-step' | 'whole-pulses' | 'none';
	/** The flicker-free exposure nearest the setting (null when none exists). */
	nearest: FlickerFreeExposure | null;
	/** degrees: setting − nearest flicker-free angle (positive when the setting is wider); NaN when none. */
	offsetDeg: number;
	/** seconds: setting − nearest flicker-free exposure; NaN when none. */
	offsetS: number;
	/** The nearest flicker-free exposures at or below and at or above the setting. */
	below: FlickerFreeExposure | null;
	above: FlickerFreeExposure | null;
	/** Hz of the brightness beat the setting would show; 0 when safe. */
	beatHz: number;
}

/** Problems with a shutter angle for the frame rate; empty when usable (0 < angle ≤ 360). */
export function shutterAngleErrors(angleDeg: number): string[] {
	if (typeof angleDeg !== 'number' || Number.isNaN(angleDeg)) return ['Enter a shutter angle in degrees.'];
	if (!Number.isFinite(angleDeg) || angleDeg <= 0) return ['The shutter angle must be above 0°.'];
	if (angleDeg > 360 * (1 + EXACT)) return ['The shutter angle cannot be wider than 360°.'];
	return [];
}

/** Problems with an exposure time for the frame rate; empty when usable (0 < t ≤ 1 / fps). */
export function exposureErrors(fps: number, exposureS: number): string[] {
	const input = flickerInputErrors(fps, 1);
	if (input.length > 0) return input;
	if (typeof exposureS !== 'number' || Number.isNaN(exposureS)) return ['Enter a shutter speed.'];
	if (!Number.isFinite(exposureS) || exposureS <= 0) return ['The shutter speed must be a positive time.'];
	if (exposureS > (1 / fps) * (1 + EXACT))
		return [`An exposure cannot be longer than one frame (1/${round(fps, 3)} s at ${round(fps, 3)} fps).`];
	return [];
}

function round(x: number, digits: number): number {
	return Number(x.toFixed(digits));
}

/**
 * Is this shutter angle flicker-free, and how far is it from the nearest one that is?
 * Safe when the rate is in step or the exposure holds whole pulses to within `tolerance` of a pulse.
 * Throws RangeError on unusable input.
 */
export function checkShutterAngle(fps: number, mainsHz: number, angleDeg: number, tolerance = DEFAULT_PULSE_TOLERANCE): ShutterCheck {
	assertFlickerInput(fps, mainsHz);
	const angleProblems = shutterAngleErrors(angleDeg);
	if (angleProblems.length > 0) throw new RangeError(angleProblems.join(' '));
	const exposureS = shutterAngleToExposureS(fps, angleDeg);
	const pulses = exposureS * pulseFrequencyHz(mainsHz);
	const inStep = isInStep(fps, mainsHz);
	const wholePulses = isWhole(pulses, tolerance);
	const safe = inStep || wholePulses;
	// The neighbours follow from n = pulses rounded down, up and to nearest, kept to 1 … count.
	const count = flickerFreeExposureCount(fps, mainsHz);
	const at = (n: number): FlickerFreeExposure | null => (n >= 1 && n <= count ? exposureOfPulses(fps, mainsHz, n) : null);
	const snapped = Math.abs(pulses - Math.round(pulses)) <= EXACT * Math.max(1, pulses) ? Math.round(pulses) : pulses;
	const below = at(Math.min(count, Math.floor(snapped)));
	const above = at(Math.max(1, Math.ceil(snapped)));
	const nearest =
		below && above ? (angleDeg - below.angleDeg <= above.angleDeg - angleDeg ? below : above) : (below ?? above);
	return {
		angleDeg,
		exposureS,
		pulses,
		safe,
		reason: inStep ? 'in-step' : wholePulses ? 'whole-pulses' : 'none',
		nearest,
		offsetDeg: nearest ? angleDeg - nearest.angleDeg : NaN,
		offsetS: nearest ? exposureS - nearest.exposureS : NaN,
		below,
		above,
		beatHz: safe ? 0 : beatFrequencyHz(fps, mainsHz)
	};
}

/** The same check for a camera set in shutter speed (exposure in seconds, e.g. 1/50). */
export function checkExposure(fps: number, mainsHz: number, exposureS: number, tolerance = DEFAULT_PULSE_TOLERANCE): ShutterCheck {
	assertFlickerInput(fps, mainsHz);
	const problems = exposureErrors(fps, exposureS);
	if (problems.length > 0) throw new RangeError(problems.join(' '));
	return checkShutterAngle(fps, mainsHz, Math.min(360, exposureSToShutterAngle(fps, exposureS)), tolerance);
}
