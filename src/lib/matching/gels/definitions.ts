/**
 * The built-in filter library: generic correction filters described in our own terms (ids such as
 * `cto-full`, `ctb-half`, `plusgreen-quarter`, `nd-0.6`). These are descriptions of filter kinds,
 * not of any maker's product; the figures below are trade rules of thumb, labelled as such.
 *
 * Nominal figures (common practice):
 *   - Full CTO ≈ +159 mired (converts 6500 K to about 3200 K); full CTB ≈ −131 mired (3200 K to
 *     about 5500 K). Fractions (¾, ½, ¼, ⅛) are taken proportionally to the full strength, since a
 *     fraction is the same dye at a fraction of the density and, for a filter shaped like a ratio of
 *     Planckians, the mired shift is proportional to density (see `transmission.ts`).
 *   - Quoted shifts per strength disagree by up to about 15 mired between sources (disputed):
 *     CTO ⅛ +20, ¼ +42, ½ +81, full ≈ +159; CTB ⅛ −12 (or −10), ¼ −30 (or −35), ½ −68 (or −80),
 *     full −131 (or −137; "3200 K to 5500, 5600 or 5700 K"). Each gel's `miredRange` is the hull of
 *     its proportional nominal ± 15 × strength mired and the figures quoted for that strength.
 *   - Light loss: full CTO ≈ ⅔ stop (common practice); full CTB 1–2 stops (disputed; nominal here
 *     the middle, 1.5 stops). A fraction keeps the sheet's clear-base loss (surface reflections,
 *     CLEAR_BASE_TRANSMISSION = 0.9, ours: 0.15 stop) and a proportional share of the dye's loss
 *     (density is proportional to strength): loss(f) = base + f·(full − base) (derived). So a
 *     stack of thin sheets costs more light than one sheet of the same total strength, as it does.
 *   - Plus green and minus green: "a full plus green is about CC 30" (common practice), i.e. a peak
 *     density of 0.30 in the absorbed band (CC value = density × 100). Our own band designs are
 *     calibrated to that peak density; their effect in Duv and their light loss are derived from
 *     the band model, not from any swatch (see `transmission.ts`, `library.ts`).
 *   - Neutral density: loss = density × log2(10) stops exactly (0.3 ≈ 1 stop).
 *
 * References:
 *   Mired: M = 10⁶ / T (T in kelvin); shifts add along a stack.
 *   CC (colour compensating) units: peak optical density × 100 in the absorbed band, so CC 30 is a
 *   peak density of 0.30 (photographic convention, common practice).
 */

export type GelFamily = 'CTO' | 'CTB' | 'plus-green' | 'minus-green' | 'ND';

export interface ValueRange {
	min: number;
	max: number;
}

/** Planck-ratio conversion filter: τ(λ) ∝ P(λ, toK) / P(λ, fromK). */
export interface ConversionModel {
	kind: 'conversion';
	/** Reference source the nominal conversion starts from, K. */
	fromK: number;
}

/** A smooth absorption band: optical density peakDensity·exp(−½((λ − centre)/sigma)²). */
export interface AbsorptionBand {
	centre: number; // nm
	sigma: number; // nm
	peakDensity: number; // base-10 optical density at the centre
}

export interface BandModel {
	kind: 'band';
	bands: AbsorptionBand[];
}

export interface NeutralModel {
	kind: 'neutral';
	density: number;
}

export type GelModel = ConversionModel | BandModel | NeutralModel;

export interface GelDefinition {
	id: string;
	label: string;
	family: GelFamily;
	/** Strength as a fraction of full (1, 0.75, 0.5, 0.25, 0.125); for ND the density. */
	strength: number;
	/** Nominal mired shift (common practice for CTO/CTB; null = derived from the model). */
	miredShift: number | null;
	miredRange: ValueRange | null;
	/** Nominal light loss in stops (null = derived from the model). */
	lossStops: number | null;
	lossRange: ValueRange | null;
	/** Where the nominal figures come from, in a few words. */
	basis: string;
	model: GelModel;
}

/** Transmission of a filter's clear base: surface and base losses, ours (about 8 % reflected at two faces, plus absorption). */
export const CLEAR_BASE_TRANSMISSION = 0.9;
/** The clear base's loss in stops: −log2(0.9) ≈ 0.152. */
export const CLEAR_BASE_LOSS_STOPS = -Math.log2(CLEAR_BASE_TRANSMISSION);

/** loss(f) = base + f·(full − base) (see header). */
export function fractionLossStops(full: number, f: number): number {
	return CLEAR_BASE_LOSS_STOPS + f * (full - CLEAR_BASE_LOSS_STOPS);
}

/** Nominal figures for full strength (common practice, see header). */
export const FULL_CTO_MIRED = 159;
export const FULL_CTB_MIRED = -131;
/**
 * The source each conversion filter's Planck-ratio model is built on (T_from in `transmission.ts`).
 * Full CTO: 6500 K, the conversion it is quoted for (6500 K → about 3200 K). The fractions of CTO
 * are quoted on daylight, 5600 K, and CTB at every strength on tungsten, 3200 K (common practice:
 * the sources they are mostly put on). The modelled shift is exact on that source and drifts a
 * little on others (Planck vs Wien); on Planckians from 2000 K up to it every strength stays within
 * 5 % of nominal (tested; ⅛ CTO, the weakest and so the furthest in relative terms, −3.5 % at 2000 K,
 * where a 6500 K base would take it to −5.5 %).
 */
export const CTO_REFERENCE_K = 6500;
export const CTO_FRACTION_REFERENCE_K = 5600;
export const CTB_REFERENCE_K = 3200;
export const FULL_CTO_LOSS_STOPS = 2 / 3;
export const FULL_CTB_LOSS_STOPS = 1.5;
export const FULL_CTB_LOSS_RANGE: ValueRange = { min: 1, max: 2 };
/** Peak density of a full plus green or minus green (≈ CC 30, common practice). */
export const FULL_GREEN_PEAK_DENSITY = 0.3;
/** Largest disagreement between quoted shifts of one strength (common practice, disputed). */
export const MIRED_DISPUTE = 15;

/**
 * Our band designs (ours, not measured): centres and widths in nm. Chosen by a coarse search over
 * centre and width so that the filter's side effect on colour temperature is balanced between a
 * 3200 K and a 5600 K source (it cannot vanish on both: the isotemperature lines turn along the
 * locus), keeping a strong Duv effect. Minus green: one band in the green. Plus green: one band in
 * the blue and one in the deep red, both at the same peak density.
 */
export const MINUS_GREEN_BANDS: ReadonlyArray<Omit<AbsorptionBand, 'peakDensity'>> = [{ centre: 560, sigma: 35 }];
export const PLUS_GREEN_BANDS: ReadonlyArray<Omit<AbsorptionBand, 'peakDensity'>> = [
	{ centre: 445, sigma: 35 },
	{ centre: 660, sigma: 30 }
];

const STRENGTHS: ReadonlyArray<{ key: string; f: number; name: string }> = [
	{ key: 'full', f: 1, name: 'Full' },
	{ key: 'threequarter', f: 0.75, name: '¾' },
	{ key: 'half', f: 0.5, name: '½' },
	{ key: 'quarter', f: 0.25, name: '¼' },
	{ key: 'eighth', f: 0.125, name: '⅛' }
];

/** Shifts quoted for each strength in trade writing (common practice, disputed; see header). */
const QUOTED_MIRED: Record<'CTO' | 'CTB', Record<string, number[]>> = {
	CTO: { full: [159], half: [81], quarter: [42], eighth: [20] },
	CTB: { full: [-131, -137, 1e6 / 5600 - 1e6 / 3200, 1e6 / 5700 - 1e6 / 3200], half: [-68, -80], quarter: [-30, -35], eighth: [-12, -10] }
};

function hull(values: number[]): ValueRange {
	return { min: Math.min(...values), max: Math.max(...values) };
}

function conversionGel(family: 'CTO' | 'CTB', s: (typeof STRENGTHS)[number]): GelDefinition {
	const full = family === 'CTO' ? FULL_CTO_MIRED : FULL_CTB_MIRED;
	const nominal = full * s.f;
	const quoted = QUOTED_MIRED[family][s.key] ?? [];
	const spread = MIRED_DISPUTE * s.f;
	const fullLoss = family === 'CTO' ? FULL_CTO_LOSS_STOPS : FULL_CTB_LOSS_STOPS;
	return {
		id: `${family.toLowerCase()}-${s.key}`,
		label: `${s.name} ${family}`,
		family,
		strength: s.f,
		miredShift: nominal,
		miredRange: hull([nominal - spread, nominal + spread, ...quoted]),
		lossStops: fractionLossStops(fullLoss, s.f),
		lossRange:
			family === 'CTB'
				? { min: fractionLossStops(FULL_CTB_LOSS_RANGE.min, s.f), max: fractionLossStops(FULL_CTB_LOSS_RANGE.max, s.f) }
				: null,
		basis:
			family === 'CTO'
				? 'common practice: full CTO ≈ +159 mired (6500 K → 3200 K), ≈ ⅔ stop; fractions: shift proportional, loss = base + share'
				: 'common practice: full CTB ≈ −131 mired (3200 K → 5500 K), 1–2 stops (disputed); fractions: shift proportional, loss = base + share',
		model: { kind: 'conversion', fromK: family === 'CTB' ? CTB_REFERENCE_K : s.f === 1 ? CTO_REFERENCE_K : CTO_FRACTION_REFERENCE_K }
	};
}

function greenGel(family: 'plus-green' | 'minus-green', s: (typeof STRENGTHS)[number]): GelDefinition {
	const shape = family === 'plus-green' ? PLUS_GREEN_BANDS : MINUS_GREEN_BANDS;
	const cc = Math.round(FULL_GREEN_PEAK_DENSITY * 100 * s.f * 100) / 100;
	return {
		id: `${family === 'plus-green' ? 'plusgreen' : 'minusgreen'}-${s.key}`,
		label: `${s.name} ${family === 'plus-green' ? 'plus green' : 'minus green'}`,
		family,
		strength: s.f,
		miredShift: null,
		miredRange: null,
		lossStops: null,
		lossRange: null,
		basis: `our band model at peak density ${(FULL_GREEN_PEAK_DENSITY * s.f).toFixed(4).replace(/0+$/, '')} (≈ CC ${cc}; full ≈ CC 30 is common practice); Duv, mired and loss derived from the model`,
		model: { kind: 'band', bands: shape.map((b) => ({ ...b, peakDensity: FULL_GREEN_PEAK_DENSITY * s.f })) }
	};
}

function ndGel(density: number): GelDefinition {
	return {
		id: `nd-${density.toFixed(1)}`,
		label: `ND ${density.toFixed(1)}`,
		family: 'ND',
		strength: density,
		miredShift: 0,
		miredRange: null,
		lossStops: density * Math.log2(10),
		lossRange: null,
		basis: `optical density ${density.toFixed(1)}: transmits 10^−${density.toFixed(1)}, ${(density * Math.log2(10)).toFixed(2)} stops`,
		model: { kind: 'neutral', density }
	};
}

/** Every built-in filter, in display order. Pure data; `library.ts` adds modelled spectra. */
export const GEL_DEFINITIONS: readonly GelDefinition[] = Object.freeze([
	...STRENGTHS.map((s) => conversionGel('CTO', s)),
	...STRENGTHS.map((s) => conversionGel('CTB', s)),
	...STRENGTHS.filter((s) => s.f !== 0.75).map((s) => greenGel('plus-green', s)),
	...STRENGTHS.filter((s) => s.f !== 0.75).map((s) => greenGel('minus-green', s)),
	...[0.3, 0.6, 0.9].map(ndGel)
]);

export function gelDefinition(id: string): GelDefinition | undefined {
	return GEL_DEFINITIONS.find((g) => g.id === id);
}

/** Per-project changes to a built-in filter's nominal figures. */
export interface GelOverride {
	/** Mired shift; for CTO/CTB this rebuilds the modelled transmission for the new shift. */
	miredShift?: number;
	/** Light loss in stops on the filter's reference source. */
	lossStops?: number;
}
export type GelOverrides = Readonly<Record<string, GelOverride>>;

/** Checks an overrides map: known ids, finite numbers, a shift a filter can have. */
export function validateGelOverrides(overrides: GelOverrides | undefined): void {
	if (!overrides) return;
	for (const [id, o] of Object.entries(overrides)) {
		const def = gelDefinition(id);
		if (!def) throw new RangeError(`Unknown filter id "${id}" in overrides.`);
		if (o.miredShift !== undefined) {
			if (!Number.isFinite(o.miredShift)) throw new RangeError(`Override for "${id}": mired shift must be a finite number.`);
			if (def.model.kind === 'conversion' && 1e6 / def.model.fromK + o.miredShift <= 0) {
				throw new RangeError(`Override for "${id}": a shift of ${o.miredShift} mired from ${def.model.fromK} K has no colour temperature.`);
			}
			if (def.model.kind !== 'conversion' && o.miredShift !== 0 && def.family === 'ND') {
				throw new RangeError(`Override for "${id}": a neutral density filter has no mired shift.`);
			}
		}
		if (o.lossStops !== undefined && (!Number.isFinite(o.lossStops) || o.lossStops < 0)) {
			throw new RangeError(`Override for "${id}": light loss must be a number of stops ≥ 0.`);
		}
	}
}
