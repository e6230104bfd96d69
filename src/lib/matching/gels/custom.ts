/**
 * Custom filters from a measured transmission: its mired and Duv shifts on 3200 K and 5600 K
 * Planckian sources (or others), and its light loss in stops, so it can join the library and be
 * stacked like a built-in filter.
 *
 * References:
 *   Light loss in stops = −log2(Y_filtered / Y_source), Y photopic (CIE 15:2004 §7.1).
 *   CCT and Duv: Y. Ohno, LEUKOS 10(1), 47–55, 2014, doi:10.1080/15502724.2013.839020 (via the
 *   colour core).
 *
 * Units: transmission 0..1 per wavelength (or 0..100 % with `percent: true`), nm.
 */
import { makeSpectrum, type Spectrum } from '../../colour';
import type { Gel, GelEffect } from './library';
import { EFFECT_SOURCES_K, effectOnPlanckian } from './library';

export interface MeasuredTransmissionOptions {
	/** Values are percent (0..100) rather than fractions (0..1). */
	percent?: boolean;
	/** Planckian sources to characterise on, K (default 3200 and 5600). */
	sourcesK?: readonly number[];
}

export class TransmissionError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'TransmissionError';
	}
}

/** Values above 1 by less than this are taken as measurement noise and clipped to 1. */
const OVER_ONE_NOISE = 0.01;

/** Checks and converts a measured transmission to fractions 0..1 (clips noise; throws with a hint otherwise). */
export function normaliseTransmission(t: Spectrum, options: { percent?: boolean } = {}): { transmission: Spectrum; warnings: string[] } {
	if (!t || !(t.values instanceof Float64Array)) throw new TransmissionError('A transmission must be a spectrum with values 0..1 (or 0..100 with percent).');
	const k = options.percent ? 0.01 : 1;
	const warnings: string[] = [];
	const v = new Float64Array(t.values.length);
	let max = 0;
	let clipped = 0;
	for (let i = 0; i < v.length; i++) {
		const x = t.values[i] * k;
		if (!Number.isFinite(x)) throw new TransmissionError(`Transmission value ${i} is not a number.`);
		if (x > max) max = x;
		v[i] = x;
	}
	if (max > 1 + OVER_ONE_NOISE) {
		throw new TransmissionError(
			options.percent
				? `Transmission reaches ${(max * 100).toFixed(1)} %: a filter cannot pass more than 100 %.`
				: `Transmission reaches ${max.toFixed(3)}: values must be 0..1; if these are percentages, pass percent: true.`
		);
	}
	for (let i = 0; i < v.length; i++) {
		if (v[i] > 1) {
			v[i] = 1;
			clipped++;
		}
		if (v[i] < 0) {
			if (v[i] < -OVER_ONE_NOISE) throw new TransmissionError(`Transmission at index ${i} is negative (${v[i]}): check the dark reference.`);
			v[i] = 0;
			clipped++;
		}
	}
	if (clipped) warnings.push(`${clipped} value${clipped === 1 ? '' : 's'} just outside 0..1 clipped as measurement noise.`);
	return { transmission: makeSpectrum(t.start, t.interval, v), warnings };
}

export interface TransmissionCharacterisation {
	effects: GelEffect[];
	/** Convenience: the 3200 K and 5600 K effects when those were asked for. */
	at3200: GelEffect | null;
	at5600: GelEffect | null;
	warnings: string[];
}

/** Mired shift, Duv shift and light loss of a measured transmission on Planckian sources. */
export function characteriseTransmission(t: Spectrum, options: MeasuredTransmissionOptions = {}): TransmissionCharacterisation {
	const { transmission, warnings } = normaliseTransmission(t, options);
	const sources = options.sourcesK ?? EFFECT_SOURCES_K;
	for (const T of sources) if (!Number.isFinite(T) || T < 1000 || T > 25000) throw new TransmissionError(`Source temperature must be 1000–25000 K, got ${T}.`);
	const effects = sources.map((T) => effectOnPlanckian(transmission, T));
	for (const e of effects) {
		if (!Number.isFinite(e.lossStops)) throw new TransmissionError('The filter passes no visible light.');
	}
	return {
		effects,
		at3200: effects.find((e) => e.sourceK === 3200) ?? null,
		at5600: effects.find((e) => e.sourceK === 5600) ?? null,
		warnings
	};
}

/** A filter made from a measured transmission, ready to stack with the library's filters. */
export function customGel(input: { id: string; label: string; transmission: Spectrum; percent?: boolean; basis?: string }): Gel {
	if (!input.id || !/^[a-z0-9][a-z0-9._-]*$/i.test(input.id)) throw new TransmissionError('A custom filter needs an id of letters, digits, dots, dashes or underscores.');
	const { transmission, warnings } = normaliseTransmission(input.transmission, { percent: input.percent });
	const effects = EFFECT_SOURCES_K.map((T) => effectOnPlanckian(transmission, T));
	if (effects.some((e) => !Number.isFinite(e.lossStops))) throw new TransmissionError('The filter passes no visible light.');
	const miredShift = effects.reduce((s, e) => s + e.miredShift, 0) / effects.length;
	return {
		id: input.id,
		label: input.label,
		family: 'custom',
		strength: 1,
		basis: input.basis ?? 'measured transmission',
		miredShift,
		miredRange: null,
		lossStops: effects[0].lossStops,
		lossRange: null,
		referenceK: 3200,
		transmission,
		lossOffsetStops: 0,
		effects,
		overridden: { miredShift: false, lossStops: false },
		custom: true,
		warnings
	};
}
