/**
 * Fixture profiles: channels with an emission spectrum at full level and a maximum output.
 * The built-in profiles are generic and invented (no real fixture is described): a bi-colour
 * panel, RGB, RGBW, and a seven-colour unit (R, G, B, amber, cyan, lime, white), with modelled
 * spectra after Ohno 2005 (see `ohno2005.ts`). Real fixtures are added as profiles with measured
 * channel spectra.
 *
 * References:
 *   Y. Ohno, "Spectral design considerations for white LED color rendering", Optical Engineering
 *   44(11), 111302, 2005, doi:10.1117/1.2130694 (emitter shapes).
 *
 * Maximum output: a channel gives either `maxFlux`, its relative luminous flux at full level
 * (the spectrum is rescaled so that its photopic Y, k = 1, equals maxFlux), or `scale`, a factor
 * applied to the given spectrum as it is (for measured channels on a common absolute scale).
 * Outputs of one fixture are comparable with each other, not across fixtures.
 */
import { spectrumToXYZ, XYZToXy, xyToUvPrime, type Spectrum, type XYZ } from '../../colour';
import { LED_GRID, ledSpectrumOhno2005, phosphorLedSpectrum, type EmissionBand, type SpectralGrid } from './ohno2005';

export type ChannelEmitter =
	| { kind: 'led'; peak: number; halfWidth: number }
	| { kind: 'phosphor'; bands: EmissionBand[] }
	| { kind: 'measured'; spectrum: Spectrum };

export interface ChannelDefinition {
	id: string;
	label: string;
	emitter: ChannelEmitter;
	/** Relative luminous flux at full level (photopic Y on the fixture's common scale). */
	maxFlux?: number;
	/** Or: a factor on the given spectrum (use for measured spectra already on one scale). */
	scale?: number;
}

export type FixtureKind = 'bicolour' | 'rgb' | 'rgbw' | 'seven-colour' | 'custom';

export interface FixtureProfile {
	id: string;
	label: string;
	kind: FixtureKind;
	description: string;
	/** True for the built-in demonstration profiles: invented, not a real product. */
	generic: boolean;
	channels: ChannelDefinition[];
}

export interface ResolvedChannel {
	id: string;
	label: string;
	/** Emission at full level, on the fixture's common scale. */
	spectrum: Spectrum;
	XYZ: XYZ;
	x: number;
	y: number;
	u_prime: number;
	v_prime: number;
}

export interface ResolvedFixture {
	profile: FixtureProfile;
	channels: ResolvedChannel[];
	/** Y with every channel at full. */
	totalY: number;
	grid: SpectralGrid;
}

// Phosphor whites of our own design (tuned so the warm white sits near 2700 K and the cool white
// near 5650 K, both within ±0.001 Duv of the Planckian locus: regression, see the profile tests).
const WARM_WHITE: EmissionBand[] = [
	{ peak: 450, halfWidth: 22, weight: 0.25 },
	{ peak: 560, halfWidth: 100, weight: 0.48 },
	{ peak: 625, halfWidth: 60, weight: 0.75 }
];
const COOL_WHITE: EmissionBand[] = [
	{ peak: 450, halfWidth: 22, weight: 1 },
	{ peak: 555, halfWidth: 100, weight: 0.58 },
	{ peak: 620, halfWidth: 70, weight: 0.22 }
];
const LIME: EmissionBand[] = [
	{ peak: 450, halfWidth: 22, weight: 0.15 },
	{ peak: 555, halfWidth: 90, weight: 1 }
];

const red = (maxFlux: number): ChannelDefinition => ({ id: 'R', label: 'Red', emitter: { kind: 'led', peak: 630, halfWidth: 20 }, maxFlux });
const green = (maxFlux: number): ChannelDefinition => ({ id: 'G', label: 'Green', emitter: { kind: 'led', peak: 525, halfWidth: 35 }, maxFlux });
const blue = (maxFlux: number): ChannelDefinition => ({ id: 'B', label: 'Blue', emitter: { kind: 'led', peak: 455, halfWidth: 22 }, maxFlux });

/** Built-in generic profiles (invented for demonstration; outputs are relative). */
export const GENERIC_FIXTURES: readonly FixtureProfile[] = Object.freeze([
	{
		id: 'generic-bicolour',
		label: 'Generic bi-colour panel (invented)',
		kind: 'bicolour',
		description: 'Warm white (about 2700 K) and cool white (about 5650 K) phosphor emitters; an invented example.',
		generic: true,
		channels: [
			{ id: 'WW', label: 'Warm white', emitter: { kind: 'phosphor', bands: WARM_WHITE }, maxFlux: 1 },
			{ id: 'CW', label: 'Cool white', emitter: { kind: 'phosphor', bands: COOL_WHITE }, maxFlux: 1.1 }
		]
	},
	{
		id: 'generic-rgb',
		label: 'Generic RGB unit (invented)',
		kind: 'rgb',
		description: 'Red, green and blue emitters only: white from these is a metamer; an invented example.',
		generic: true,
		channels: [red(0.3), green(0.6), blue(0.12)]
	},
	{
		id: 'generic-rgbw',
		label: 'Generic RGBW unit (invented)',
		kind: 'rgbw',
		description: 'Red, green, blue and a cool phosphor white; an invented example.',
		generic: true,
		channels: [red(0.3), green(0.6), blue(0.12), { id: 'W', label: 'White', emitter: { kind: 'phosphor', bands: COOL_WHITE }, maxFlux: 1 }]
	},
	{
		id: 'generic-seven',
		label: 'Generic seven-colour unit (invented)',
		kind: 'seven-colour',
		description: 'Red, green, blue, amber, cyan, lime and white emitters; an invented example.',
		generic: true,
		channels: [
			red(0.25),
			green(0.45),
			blue(0.1),
			{ id: 'A', label: 'Amber', emitter: { kind: 'led', peak: 595, halfWidth: 18 }, maxFlux: 0.3 },
			{ id: 'C', label: 'Cyan', emitter: { kind: 'led', peak: 500, halfWidth: 30 }, maxFlux: 0.3 },
			{ id: 'L', label: 'Lime', emitter: { kind: 'phosphor', bands: LIME }, maxFlux: 0.8 },
			{ id: 'W', label: 'White', emitter: { kind: 'phosphor', bands: COOL_WHITE }, maxFlux: 0.9 }
		]
	}
]);

export function genericFixture(id: string): FixtureProfile {
	const p = GENERIC_FIXTURES.find((f) => f.id === id);
	if (!p) throw new RangeError(`Unknown fixture profile "${id}".`);
	return p;
}

function emitterSpectrum(e: ChannelEmitter, grid: SpectralGrid): Spectrum {
	switch (e.kind) {
		case 'led':
			return ledSpectrumOhno2005(e.peak, e.halfWidth, grid);
		case 'phosphor':
			return phosphorLedSpectrum(e.bands, grid);
		case 'measured':
			return e.spectrum;
	}
}

function scaled(s: Spectrum, k: number): Spectrum {
	const v = new Float64Array(s.values.length);
	for (let i = 0; i < v.length; i++) v[i] = s.values[i] * k;
	return { ...s, values: v };
}

const cache = new WeakMap<FixtureProfile, ResolvedFixture>();

/**
 * Builds each channel's full-level spectrum and its XYZ (CIE 1931 2°, k = 1 for relative spectra).
 * Measured channels keep their own grid; all channels of one fixture must share one grid so that
 * mixing is a plain weighted sum (align them first with the colour core's alignSpectrum).
 */
export function resolveFixture(profile: FixtureProfile, grid: SpectralGrid = LED_GRID): ResolvedFixture {
	const hit = grid === LED_GRID ? cache.get(profile) : undefined;
	if (hit) return hit;
	if (!profile.channels || profile.channels.length < 1) throw new RangeError(`Fixture "${profile.id}" has no channels.`);
	const ids = new Set<string>();
	const channels = profile.channels.map((c) => {
		if (ids.has(c.id)) throw new RangeError(`Fixture "${profile.id}" has two channels called "${c.id}".`);
		ids.add(c.id);
		if (c.maxFlux !== undefined && c.scale !== undefined) {
			throw new RangeError(`Channel "${c.id}": give either maxFlux or scale, not both.`);
		}
		const raw = emitterSpectrum(c.emitter, grid);
		const rawXYZ = spectrumToXYZ(raw);
		if (!(rawXYZ.Y > 0)) throw new RangeError(`Channel "${c.id}" emits no visible light.`);
		let k: number;
		if (c.scale !== undefined) {
			if (!Number.isFinite(c.scale) || c.scale <= 0) throw new RangeError(`Channel "${c.id}": scale must be above 0.`);
			k = c.scale;
		} else {
			const flux = c.maxFlux ?? 1;
			if (!Number.isFinite(flux) || flux <= 0) throw new RangeError(`Channel "${c.id}": maxFlux must be above 0.`);
			k = flux / rawXYZ.Y;
		}
		const spectrum = scaled(raw, k);
		const XYZ = { X: rawXYZ.X * k, Y: rawXYZ.Y * k, Z: rawXYZ.Z * k };
		const xy = XYZToXy(XYZ);
		const uvp = xyToUvPrime(xy);
		return { id: c.id, label: c.label, spectrum, XYZ, x: xy.x, y: xy.y, u_prime: uvp.u_prime, v_prime: uvp.v_prime };
	});
	const s0 = channels[0].spectrum;
	for (const c of channels) {
		if (c.spectrum.start !== s0.start || c.spectrum.interval !== s0.interval || c.spectrum.values.length !== s0.values.length) {
			throw new RangeError(
				`Fixture "${profile.id}": channel "${c.id}" is on a different wavelength grid from "${channels[0].id}"; align the measured spectra to one grid first.`
			);
		}
	}
	const resolved: ResolvedFixture = {
		profile,
		channels,
		totalY: channels.reduce((s, c) => s + c.XYZ.Y, 0),
		grid: { start: s0.start, interval: s0.interval, end: s0.start + (s0.values.length - 1) * s0.interval }
	};
	if (grid === LED_GRID) cache.set(profile, resolved);
	return resolved;
}
