/**
 * The filter library with modelled spectra: each built-in definition (see `definitions.ts`) gets a
 * transmission spectrum (see `transmission.ts`), its effect on 3200 K and 5600 K Planckian sources
 * (mired shift, Duv shift, light loss: derived from the model), and the nominal figures the mired
 * arithmetic uses, with per-project overrides applied.
 *
 * Light loss. The Planck-ratio shape is exact for the colour shift, but it keeps falling across
 * the whole spectrum where a real filter is flat over much of its passband, so at a 0.9 peak it
 * passes less light than real filters (a full CTO model loses ≈ 2 stops on 6500 K where ⅔ stop is
 * common practice). The library therefore reports light loss as the nominal figure on the
 * filter's reference source (common practice, or the project's override) plus the model's change
 * of loss from that source to the actual one: `lossOffsetStops` = nominal − model loss on the
 * reference source, added to every spectral loss. Colour predictions never use this offset (a
 * grey factor does not move chromaticity). Band filters (plus/minus green) and ND are physical
 * designs: their loss is the model's own, offset 0, unless overridden.
 *
 * References:
 *   Light loss in stops = −log2(Y_filtered / Y_source), Y photopic (CIE 15:2004 §7.1).
 *   CCT and Duv: Y. Ohno, LEUKOS 10(1), 47–55, 2014, doi:10.1080/15502724.2013.839020 (via the
 *   colour core).
 */
import { planckianSpectrum, spectrumToXYZ, type Spectrum, type XYZ } from '../../colour';
import { summariseXYZ } from '../chromaticity';
import {
	GEL_DEFINITIONS,
	validateGelOverrides,
	type GelDefinition,
	type GelFamily,
	type GelOverrides,
	type ValueRange
} from './definitions';
import { bandTransmission, conversionTransmission, neutralTransmission } from './transmission';

/** The two sources every filter is characterised on (common reference points on set). */
export const EFFECT_SOURCES_K: readonly number[] = Object.freeze([3200, 5600]);

export interface GelEffect {
	/** Planckian source temperature, K. */
	sourceK: number;
	/** M_out − M_in, mired (CCTs by Ohno 2013). */
	miredShift: number;
	/** Duv_out − Duv_in. */
	duvShift: number;
	/** Light loss on this source, stops (including the library's loss offset). */
	lossStops: number;
	CCT: number | null;
	Duv: number | null;
}

export interface Gel {
	id: string;
	label: string;
	family: GelFamily | 'custom';
	strength: number;
	basis: string;
	/** Nominal mired shift for the arithmetic view (common practice, override, or derived from the model on 3200 K and 5600 K). */
	miredShift: number;
	miredRange: ValueRange | null;
	/** Nominal light loss on the reference source, stops. */
	lossStops: number;
	lossRange: ValueRange | null;
	/** Source the nominal figures refer to, K. */
	referenceK: number;
	/** Modelled (or measured) transmission 0..1. */
	transmission: Spectrum;
	/** Added to every spectrally computed loss (see header). */
	lossOffsetStops: number;
	/** Effects on the 3200 K and 5600 K Planckians (derived). */
	effects: GelEffect[];
	/** Which nominal figures the project overrode. */
	overridden: { miredShift: boolean; lossStops: boolean };
	custom: boolean;
	warnings: string[];
}

/** Planckian spectra on a grid, cached (they are reused for every gel). */
const planckCache = new Map<string, Spectrum>();
export function planckianOnGrid(T: number, like: Spectrum): Spectrum {
	const end = like.start + (like.values.length - 1) * like.interval;
	const key = `${T}|${like.start}|${like.interval}|${like.values.length}`;
	let p = planckCache.get(key);
	if (!p) {
		p = planckianSpectrum(T, like.start, end, like.interval);
		if (planckCache.size > 64) planckCache.clear();
		planckCache.set(key, p);
	}
	return p;
}

/** XYZ of a source before and after a transmission, both on τ's grid. */
function throughFilter(source: Spectrum, tau: Spectrum): { before: XYZ; after: XYZ } {
	const v = new Float64Array(tau.values.length);
	for (let i = 0; i < v.length; i++) v[i] = source.values[i] * tau.values[i];
	return { before: spectrumToXYZ(source), after: spectrumToXYZ({ ...source, values: v }) };
}

/** Model light loss (stops) of τ on a Planckian at T, without any offset: −log2(Y_after / Y_before). */
export function modelLossStops(tau: Spectrum, T: number): number {
	const r = throughFilter(planckianOnGrid(T, tau), tau);
	return -Math.log2(r.after.Y / r.before.Y);
}

/** Effect of a transmission on a Planckian at T (mired, Duv, loss + offset). */
export function effectOnPlanckian(tau: Spectrum, T: number, lossOffsetStops = 0): GelEffect {
	const r = throughFilter(planckianOnGrid(T, tau), tau);
	const inn = summariseXYZ(r.before);
	const out = summariseXYZ(r.after);
	return {
		sourceK: T,
		miredShift: inn.mired !== null && out.mired !== null ? out.mired - inn.mired : Number.NaN,
		duvShift: out.Duv !== null && inn.Duv !== null ? out.Duv - inn.Duv : Number.NaN,
		lossStops: -Math.log2(r.after.Y / r.before.Y) + lossOffsetStops,
		CCT: out.CCT,
		Duv: out.Duv
	};
}

function buildGel(def: GelDefinition, overrides: GelOverrides | undefined): Gel {
	const o = overrides?.[def.id] ?? {};
	const warnings: string[] = [];
	let transmission: Spectrum;
	let referenceK: number;
	let miredShift: number;
	switch (def.model.kind) {
		case 'conversion':
			miredShift = o.miredShift ?? (def.miredShift as number);
			referenceK = def.model.fromK;
			transmission = conversionTransmission(referenceK, miredShift);
			break;
		case 'band':
			transmission = bandTransmission(def.model.bands);
			referenceK = 3200;
			miredShift = Number.NaN; // derived below
			break;
		case 'neutral':
			transmission = neutralTransmission(def.model.density);
			referenceK = 3200;
			miredShift = 0;
			break;
	}
	const modelLoss = modelLossStops(transmission, referenceK);
	const nominalLoss = o.lossStops ?? def.lossStops ?? modelLoss;
	const lossOffsetStops = nominalLoss - modelLoss;
	const effects = EFFECT_SOURCES_K.map((T) => effectOnPlanckian(transmission, T, lossOffsetStops));
	if (def.model.kind === 'band') {
		const derived = effects.reduce((s, e) => s + e.miredShift, 0) / effects.length;
		if (o.miredShift !== undefined) warnings.push('A mired override on a plus/minus green filter changes the arithmetic view only; its modelled spectrum is unchanged.');
		miredShift = o.miredShift ?? derived;
	}
	return {
		id: def.id,
		label: def.label,
		family: def.family,
		strength: def.strength,
		basis: def.basis,
		miredShift,
		miredRange: def.miredRange,
		lossStops: nominalLoss,
		lossRange: def.lossRange,
		referenceK,
		transmission,
		lossOffsetStops,
		effects,
		overridden: { miredShift: o.miredShift !== undefined, lossStops: o.lossStops !== undefined },
		custom: false,
		warnings
	};
}

let defaultLibrary: Gel[] | null = null;

/** Every built-in filter with modelled spectra; `overrides` changes nominal figures per project. */
export function gelLibrary(overrides?: GelOverrides): Gel[] {
	validateGelOverrides(overrides);
	if (!defaultLibrary) defaultLibrary = GEL_DEFINITIONS.map((d) => buildGel(d, undefined));
	if (!overrides || Object.keys(overrides).length === 0) return defaultLibrary;
	return defaultLibrary.map((g) => (overrides[g.id] ? buildGel(GEL_DEFINITIONS.find((d) => d.id === g.id) as GelDefinition, overrides) : g));
}

export function getGel(id: string, overrides?: GelOverrides): Gel {
	const g = gelLibrary(overrides).find((x) => x.id === id);
	if (!g) throw new RangeError(`Unknown filter id "${id}".`);
	return g;
}

export interface GelEffectRow {
	id: string;
	label: string;
	miredShift: number;
	lossStops: number;
	at3200: GelEffect;
	at5600: GelEffect;
}

/** The table of derived effects (3200 K and 5600 K) for every filter, for the library page and docs. */
export function gelEffectsTable(overrides?: GelOverrides): GelEffectRow[] {
	return gelLibrary(overrides).map((g) => ({
		id: g.id,
		label: g.label,
		miredShift: g.miredShift,
		lossStops: g.lossStops,
		at3200: g.effects[0],
		at5600: g.effects[1]
	}));
}

/** Effect of plus green and minus green filters on 3200 K and 5600 K Planckians in Duv (derived from our band model). */
export function greenFilterDuvEffects(): Array<{ id: string; label: string; duvAt3200: number; duvAt5600: number; miredAt3200: number; miredAt5600: number; lossStops: number }> {
	return gelLibrary()
		.filter((g) => g.family === 'plus-green' || g.family === 'minus-green')
		.map((g) => ({
			id: g.id,
			label: g.label,
			duvAt3200: g.effects[0].duvShift,
			duvAt5600: g.effects[1].duvShift,
			miredAt3200: g.effects[0].miredShift,
			miredAt5600: g.effects[1].miredShift,
			lossStops: g.lossStops
		}));
}

/**
 * Mired and Duv shift of a filter on a source of mired M, for the arithmetic estimate:
 * CTO/CTB use their nominal shift; Duv (and the green filters' mired) are interpolated linearly in
 * source mired between the 3200 K and 5600 K effects, held beyond them.
 */
export function arithmeticShift(g: Gel, sourceMired: number): { mired: number; duv: number } {
	const [a, b] = [g.effects[0], g.effects[1]];
	const ma = 1e6 / a.sourceK;
	const mb = 1e6 / b.sourceK;
	const t = Math.min(1, Math.max(0, (sourceMired - ma) / (mb - ma)));
	const lerp = (p: number, q: number) => (Number.isFinite(p) && Number.isFinite(q) ? p + (q - p) * t : 0);
	const conversion = g.family === 'CTO' || g.family === 'CTB';
	return {
		mired: conversion || g.overridden.miredShift ? g.miredShift : lerp(a.miredShift, b.miredShift),
		duv: lerp(a.duvShift, b.duvShift)
	};
}
