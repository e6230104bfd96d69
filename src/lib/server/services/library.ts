/**
 * The library: filters and fixture profiles, shared site-wide (managed by a site admin) and per
 * project. Built-in filters come from $lib/matching with each project's overrides of their nominal
 * figures; custom filters come from a measured transmission CSV; fixture profiles from measured
 * channel spectra (one column per channel) and each channel's maximum output.
 *
 * CSV files are read by the readings importer ($lib/import), whose long spectral layout
 * (`wavelength_nm,<label>…`) suits both: a transmission is one spectrum, a fixture one spectrum
 * per channel. Characterisation (mired and Duv shift on 3200 K and 5600 K Planckians, light loss
 * in stops) is the matching module's; this file turns stored rows into solver inputs and into
 * plain views for pages and the API.
 *
 * Who may change what is checked by the callers (routes) through $lib/server/authz: the shared
 * library needs `canSite(user, 'library.manage')`; a project's library needs `light.edit`.
 */
import { createHash } from 'node:crypto';
import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { alignSpectrum, displaySwatch, makeSpectrum, spectrumEnd, SpectrumError, valueAt, type Spectrum } from '$lib/colour';
import { isImportError, parseReadings, type ParsedReading, type ParseReport } from '$lib/import';
import {
	customGel,
	FILTER_GRID,
	gelDefinition,
	gelLibrary,
	GEL_DEFINITIONS,
	GEL_HEAT_CAUTION,
	GENERIC_FIXTURES,
	normaliseTransmission,
	resolveFixture,
	TransmissionError,
	validateGelOverrides,
	type FixtureProfile,
	type Gel,
	type GelFamily,
	type GelOverrides,
	type ValueRange
} from '$lib/matching';
import { ApiError } from '$lib/server/api';
import { db } from '$lib/server/db';
import * as activity from '$lib/server/db/activity';
import * as customGels from '$lib/server/db/custom-gels';
import * as filterOverrides from '$lib/server/db/filter-overrides';
import * as fixtureProfiles from '$lib/server/db/fixture-profiles';
import type { CustomGelRow, Scope, StoredSpectrum } from '$lib/server/db/custom-gels';
import type { FixtureProfileRow, StoredChannel } from '$lib/server/db/fixture-profiles';

export type { Scope } from '$lib/server/db/custom-gels';

/** Largest library upload (a measured spectrum at 1 nm is a few kilobytes). */
export const MAX_LIBRARY_UPLOAD_BYTES = 2 * 1024 * 1024;
/** Custom filters per scope: every one joins the stack search, which grows with the cube of the filter count. */
export const MAX_CUSTOM_GELS = 20;
export const MAX_FIXTURE_PROFILES = 50;
export const MAX_CHANNELS = 16;
/** The built-in filters' range that every custom filter is extended to (ends held), so both are treated alike. */
const FULL_RANGE_NM = [FILTER_GRID.start, FILTER_GRID.end] as const;
/** Curves for the pages: 380–780 nm every 5 nm. */
const CURVE = { start: 380, end: 780, interval: 5 } as const;

export const HEAT_CAUTION = GEL_HEAT_CAUTION;

// ---------------------------------------------------------------------------------------------
// Views (plain data for pages and the API)

export interface CurveView {
	/** nm */
	start: number;
	interval: number;
	values: number[];
}

export interface EffectView {
	/** Planckian source, K. */
	sourceK: number;
	/** M_out − M_in, mired. */
	miredShift: number;
	/** Duv_out − Duv_in. */
	duvShift: number;
	/** Light loss on this source, stops. */
	lossStops: number;
}

export interface FilterOverrideView {
	miredShift: number | null;
	lossStops: number | null;
	note: string;
	updatedBy: string | null;
	updatedAt: string;
}

export interface FilterView {
	id: string;
	label: string;
	family: GelFamily;
	strength: number;
	basis: string;
	/** The nominal shift the arithmetic uses (the project's figure when overridden). */
	miredShift: number;
	/** Quoted figures disagree (common practice, disputed): the range to show instead of one number. */
	miredRange: ValueRange | null;
	/** True when the shift is derived from our model rather than a trade figure (plus/minus green). */
	miredDerived: boolean;
	lossStops: number;
	lossRange: ValueRange | null;
	lossDerived: boolean;
	/** Source the nominal figures refer to, K. */
	referenceK: number;
	/** The built-in figures, when the project overrides them. */
	builtIn: { miredShift: number; lossStops: number } | null;
	override: FilterOverrideView | null;
	effects: EffectView[];
	curve: CurveView;
	warnings: string[];
}

export interface CustomGelView {
	id: number;
	/** The id the solvers and accepted fixes use. */
	gelId: string;
	scope: 'shared' | 'project';
	name: string;
	notes: string;
	sourceUnit: 'percent' | 'fraction';
	originalName: string;
	/** The measured range and step, nm. */
	measured: { start: number; end: number; interval: number };
	/** Mean of the shifts on 3200 K and 5600 K, for the arithmetic view. */
	miredShift: number;
	/** Light loss on 3200 K. */
	lossStops: number;
	effects: EffectView[];
	curve: CurveView;
	/** What was done to read and use the file (unit chosen, range extended, values clipped). */
	processingNotes: string[];
	createdBy: string | null;
	createdAt: string;
}

export interface ChannelView {
	id: string;
	label: string;
	/** Y at full on the fixture's own scale. */
	output: number;
	/** Share of the fixture's output with every channel at full. */
	share: number;
	x: number;
	y: number;
	u_prime: number;
	v_prime: number;
	peakNm: number;
	/** A display colour for the channel's chromaticity (sRGB, gamut-mapped). */
	colour: string;
}

export interface FixtureView {
	/** What lights name in their fixture profile field. */
	key: string;
	/** Row id for uploaded profiles. */
	id: number | null;
	scope: 'generic' | 'shared' | 'project';
	name: string;
	description: string;
	kind: string;
	outputBasis: 'modelled' | 'max_output' | 'as_measured';
	channels: ChannelView[];
	/** Each channel's emission at full, 380–780 nm every 5 nm, scaled by the largest value of all channels. */
	curves: { start: number; interval: number; series: number[][] };
	grid: { start: number; end: number; interval: number };
	originalName: string | null;
	createdBy: string | null;
	createdAt: string | null;
}

function sampleCurve(s: Spectrum, outside: 'zero' | 'hold'): number[] {
	const out: number[] = [];
	for (let nm = CURVE.start; nm <= CURVE.end; nm += CURVE.interval) out.push(round(valueAt(s, nm, outside), 5));
	return out;
}

const round = (v: number, digits: number) => (Number.isFinite(v) ? Number(v.toFixed(digits)) : v);

function effectViews(g: Gel): EffectView[] {
	return g.effects.map((e) => ({ sourceK: e.sourceK, miredShift: e.miredShift, duvShift: e.duvShift, lossStops: e.lossStops }));
}

let builtInDefaults: Map<string, Gel> | null = null;
function defaults(): Map<string, Gel> {
	builtInDefaults ??= new Map(gelLibrary().map((g) => [g.id, g]));
	return builtInDefaults;
}

/** Every built-in filter, with the project's overrides applied when given. */
export function filterViews(overrides: filterOverrides.FilterOverride[] = []): FilterView[] {
	const map = overridesMap(overrides);
	const byId = new Map(overrides.map((o) => [o.gelId, o]));
	return gelLibrary(map).map((g) => {
		const def = gelDefinition(g.id);
		const o = byId.get(g.id);
		const base = defaults().get(g.id) as Gel;
		return {
			id: g.id,
			label: g.label,
			family: g.family as GelFamily,
			strength: g.strength,
			basis: g.basis,
			miredShift: g.miredShift,
			miredRange: g.overridden.miredShift ? null : g.miredRange,
			miredDerived: def?.miredShift === null && !g.overridden.miredShift,
			lossStops: g.lossStops,
			lossRange: g.overridden.lossStops ? null : g.lossRange,
			lossDerived: def?.lossStops === null && !g.overridden.lossStops,
			referenceK: g.referenceK,
			builtIn: o ? { miredShift: base.miredShift, lossStops: base.lossStops } : null,
			override: o
				? { miredShift: o.miredShift, lossStops: o.lossStops, note: o.note, updatedBy: o.updatedByName, updatedAt: o.updatedAt.toISOString() }
				: null,
			effects: effectViews(g),
			curve: { start: CURVE.start, interval: CURVE.interval, values: sampleCurve(g.transmission, 'hold') },
			warnings: g.warnings
		};
	});
}

/** Stored overrides as the solvers take them. */
export function overridesMap(list: filterOverrides.FilterOverride[]): GelOverrides {
	const out: Record<string, { miredShift?: number; lossStops?: number }> = {};
	for (const o of list) {
		if (!gelDefinition(o.gelId)) continue; // a filter retired from the built-in list
		const entry: { miredShift?: number; lossStops?: number } = {};
		if (o.miredShift !== null) entry.miredShift = o.miredShift;
		if (o.lossStops !== null) entry.lossStops = o.lossStops;
		out[o.gelId] = entry;
	}
	return out;
}

// ---------------------------------------------------------------------------------------------
// Reading CSV files

export type TransmissionUnit = 'auto' | 'percent' | 'fraction';

function readCsv(bytes: Uint8Array, what: string): ParseReport {
	if (bytes.length === 0) throw new ApiError(400, 'empty', 'The file is empty.');
	if (bytes.length > MAX_LIBRARY_UPLOAD_BYTES) throw new ApiError(413, 'too_large', `The file is larger than the ${MAX_LIBRARY_UPLOAD_BYTES / 1024 / 1024} MB limit for ${what}.`);
	let report: ParseReport;
	try {
		report = parseReadings(bytes, { limits: { maxBytes: MAX_LIBRARY_UPLOAD_BYTES, maxRows: 10_000, maxColumns: MAX_CHANNELS + 8 } });
	} catch (e) {
		if (isImportError(e)) {
			const status = e.code === 'too_large' || e.code === 'too_many_rows' || e.code === 'too_many_columns' ? 413 : 400;
			throw new ApiError(status, e.code, e.message);
		}
		throw e;
	}
	if (report.errors.length > 0) {
		const first = report.errors.slice(0, 20).map((r) => ({ row: r.row, column: r.column, message: r.message }));
		const where = (r: (typeof first)[number]) => (r.row === 0 ? `column ${r.column ?? ''}` : `row ${r.row}${r.column ? ` (${r.column})` : ''}`);
		throw new ApiError(
			400,
			'csv_invalid',
			`The file has ${report.errors.length} problem${report.errors.length === 1 ? '' : 's'}, first: ${where(first[0])}: ${first[0].message}. Fix the file and upload it again.`,
			first
		);
	}
	if (report.format !== 'wide_spectral' && report.format !== 'long_spectral') {
		throw new ApiError(
			400,
			'not_spectral',
			`${what[0].toUpperCase()}${what.slice(1)} needs wavelengths: a wavelength_nm column and one column of values per spectrum. This file holds ${report.format.replace(/_/g, ' ')} values.`
		);
	}
	return report;
}

type SpectralReading = ParsedReading & { kind: 'spectral'; spectrum: Spectrum };

/** The importer's own range note speaks of missing power; for filters and channels we say what we do instead. */
function importerNotes(report: ParseReport, r: ParsedReading): string[] {
	return [...report.warnings, ...r.warnings].filter((w) => !/taken as zero power/.test(w));
}

export interface ReadTransmission {
	/** Fractions 0..1 on the measured grid. */
	transmission: Spectrum;
	sourceUnit: 'percent' | 'fraction';
	/** The column's header (or the row's label in a wide file). */
	columnLabel: string;
	notes: string[];
}

/**
 * One measured transmission from a CSV: a wavelength column and one column of values, % (0–100) or
 * fractions (0–1). `auto` takes values above 1 as percent (a filter cannot pass more than all the
 * light) and says which it chose.
 */
export function readTransmissionCsv(bytes: Uint8Array, unit: TransmissionUnit = 'auto'): ReadTransmission {
	const report = readCsv(bytes, 'a measured transmission');
	const spectra = report.readings.filter((r): r is SpectralReading => r.kind === 'spectral');
	if (spectra.length !== 1) {
		const names = spectra.map((r) => r.column ?? r.label).slice(0, 6);
		throw new ApiError(
			400,
			'one_filter_per_file',
			`One filter per file: this file has ${spectra.length} transmission columns (${names.join(', ')}${spectra.length > 6 ? ', …' : ''}). Upload each filter's column on its own.`
		);
	}
	const r = spectra[0];
	let max = 0;
	for (const v of r.spectrum.values) max = Math.max(max, v);
	const percent = unit === 'percent' || (unit === 'auto' && max > 1.01);
	const notes = importerNotes(report, r);
	if (unit === 'auto') {
		notes.push(
			percent
				? `Read as percent (the largest value is ${round(max, 2)}).`
				: `Read as fractions 0–1 (the largest value is ${round(max, 4)}); choose percent if the file is in %.`
		);
	} else if (unit === 'percent' && max <= 1.01) {
		notes.push(`Read as percent as asked, so this filter passes at most ${round(max, 3)} %: check that the file is not in fractions 0–1.`);
	}
	let transmission: Spectrum;
	try {
		const n = normaliseTransmission(r.spectrum, { percent });
		transmission = n.transmission;
		notes.push(...n.warnings);
	} catch (e) {
		if (e instanceof TransmissionError) throw new ApiError(400, 'transmission_invalid', e.message);
		throw e;
	}
	return { transmission, sourceUnit: percent ? 'percent' : 'fraction', columnLabel: r.column ?? r.label, notes };
}

export interface ReadChannels {
	channels: Array<{ label: string; spectrum: Spectrum }>;
	grid: { start: number; end: number; interval: number };
	notes: string[];
}

/**
 * Measured channel spectra from a CSV: a wavelength column and one column per channel (each
 * measured with only that channel at full). Channels that cover part of the range are put on the
 * file's whole range with zero emission outside their own, and the notes say so.
 */
export function readChannelsCsv(bytes: Uint8Array): ReadChannels {
	const report = readCsv(bytes, 'a fixture profile');
	const spectra = report.readings.filter((r): r is SpectralReading => r.kind === 'spectral');
	if (spectra.length === 0) throw new ApiError(400, 'no_channels', 'The file has no channel columns after the wavelength column.');
	if (spectra.length > MAX_CHANNELS) throw new ApiError(400, 'too_many_channels', `A fixture profile has at most ${MAX_CHANNELS} channels; this file has ${spectra.length}.`);
	const interval = spectra[0].spectrum.interval;
	if (spectra.some((r) => Math.abs(r.spectrum.interval - interval) > 1e-9)) {
		throw new ApiError(400, 'mixed_steps', 'The channels are on different wavelength steps; give every channel on one step.');
	}
	const start = Math.min(...spectra.map((r) => r.spectrum.start));
	const end = Math.max(...spectra.map((r) => spectrumEnd(r.spectrum)));
	const notes = [...new Set(spectra.flatMap((r) => importerNotes(report, r)))];
	const channels = spectra.map((r) => {
		const a = alignSpectrum(r.spectrum, start, end, interval, { outside: 'zero' });
		const label = (r.column ?? r.label).trim() || `Channel ${r.row}`;
		if (a.note) notes.push(`${label}: ${a.note}.`);
		return { label, spectrum: a.spectrum };
	});
	if (start > 380 || end < 780) notes.push(`Measured over ${start}–${end} nm: emission outside that range is taken as zero.`);
	return { channels, grid: { start, end, interval }, notes };
}

// ---------------------------------------------------------------------------------------------
// Custom filters

/** The custom filter's transmission on the built-in filters' range, ends held, with a note when it was extended. */
function extendedTransmission(t: Spectrum): { spectrum: Spectrum; note: string | null } {
	const [lo, hi] = FULL_RANGE_NM;
	const end = spectrumEnd(t);
	if (t.start <= lo && end >= hi) return { spectrum: t, note: null };
	const start = t.start > lo ? t.start - Math.ceil((t.start - lo) / t.interval - 1e-9) * t.interval : t.start;
	const last = end < hi ? end + Math.ceil((hi - end) / t.interval - 1e-9) * t.interval : end;
	const a = alignSpectrum(t, start, last, t.interval, { outside: 'hold' });
	return {
		spectrum: a.spectrum,
		note: `Measured over ${round(t.start, 3)}–${round(end, 3)} nm; beyond that the end values are held (flat), as for every filter in a stack.`
	};
}

export const customGelId = (rowId: number) => `custom-${rowId}`;

function toStored(s: Spectrum): StoredSpectrum {
	return { start: s.start, interval: s.interval, values: Array.from(s.values) };
}

function fromStored(s: StoredSpectrum): Spectrum {
	return makeSpectrum(s.start, s.interval, s.values);
}

/** A stored custom filter as the solvers take it (id `custom-<row id>`, label the user's name). */
export function gelFromRow(row: Pick<CustomGelRow, 'id' | 'name' | 'transmission' | 'projectId'>): { gel: Gel; notes: string[] } {
	const measured = fromStored(row.transmission);
	const ext = extendedTransmission(measured);
	const gel = customGel({
		id: customGelId(row.id),
		label: row.name,
		transmission: ext.spectrum,
		basis: row.projectId === null ? 'measured transmission (shared library)' : 'measured transmission (this project)'
	});
	return { gel, notes: [...(ext.note ? [ext.note] : []), ...gel.warnings] };
}

export function customGelView(row: CustomGelRow): CustomGelView {
	const { gel, notes } = gelFromRow(row);
	const t = row.transmission;
	return {
		id: row.id,
		gelId: gel.id,
		scope: row.projectId === null ? 'shared' : 'project',
		name: row.name,
		notes: row.notes,
		sourceUnit: row.sourceUnit,
		originalName: row.originalName,
		measured: { start: t.start, end: t.start + (t.values.length - 1) * t.interval, interval: t.interval },
		miredShift: gel.miredShift,
		lossStops: gel.lossStops,
		effects: effectViews(gel),
		curve: { start: CURVE.start, interval: CURVE.interval, values: sampleCurve(gel.transmission, 'hold') },
		processingNotes: notes,
		createdBy: row.createdByName,
		createdAt: row.createdAt.toISOString()
	};
}

const text = (max: number, what: string) => z.string().trim().max(max, `Keep ${what} under ${max} characters.`);

export const customGelFieldsSchema = z.object({
	name: text(160, 'the name').min(1, 'Give the filter a name.'),
	notes: text(2000, 'the notes').default(''),
	unit: z.enum(['auto', 'percent', 'fraction']).default('auto')
});

export interface UploadedFile {
	name: string;
	bytes: Uint8Array;
}

/** The `file` field of a form, checked for presence and size. */
export async function formFile(form: FormData, field = 'file'): Promise<UploadedFile> {
	const f = form.get(field);
	if (!(f instanceof File) || (f.size === 0 && !f.name)) throw new ApiError(400, 'file_missing', 'Attach the CSV file as the "file" field.');
	if (f.size > MAX_LIBRARY_UPLOAD_BYTES) throw new ApiError(413, 'too_large', `The file is larger than the ${MAX_LIBRARY_UPLOAD_BYTES / 1024 / 1024} MB limit.`);
	return { name: f.name, bytes: new Uint8Array(await f.arrayBuffer()) };
}

/** A multipart request's form, or 415/400/413. */
export async function multipartForm(request: Request): Promise<FormData> {
	const type = request.headers.get('content-type') ?? '';
	if (!type.startsWith('multipart/form-data')) throw new ApiError(415, 'unsupported_media_type', 'Send the file as multipart/form-data with a "file" field.');
	const length = Number(request.headers.get('content-length') ?? 0);
	if (length > MAX_LIBRARY_UPLOAD_BYTES + 64 * 1024) throw new ApiError(413, 'too_large', `The file is larger than the ${MAX_LIBRARY_UPLOAD_BYTES / 1024 / 1024} MB limit.`);
	try {
		return await request.formData();
	} catch {
		throw new ApiError(400, 'bad_request', 'The upload could not be read as a form.');
	}
}

const fieldsOf = (form: FormData) => Object.fromEntries([...form.entries()].filter(([, v]) => typeof v === 'string')) as Record<string, string>;

function scopeWords(scope: Scope) {
	return scope === null ? 'the shared library' : 'this project’s library';
}

/** Adds a custom filter from an uploaded transmission CSV and returns it characterised. */
export async function addCustomGel(scope: Scope, userId: number, form: FormData): Promise<CustomGelView> {
	const fields = customGelFieldsSchema.parse(fieldsOf(form));
	const file = await formFile(form);
	const read = readTransmissionCsv(file.bytes, fields.unit);
	// Characterise before storing, so a filter that passes no light is refused here.
	try {
		gelFromRow({ id: 0, name: fields.name, transmission: toStored(read.transmission), projectId: scope });
	} catch (e) {
		if (e instanceof TransmissionError || e instanceof RangeError || e instanceof SpectrumError) throw new ApiError(400, 'transmission_invalid', e.message);
		throw e;
	}
	return db.transaction(async (trx) => {
		if ((await customGels.count(scope, trx)) >= MAX_CUSTOM_GELS) {
			throw new ApiError(409, 'library_full', `${scopeWords(scope)} already has ${MAX_CUSTOM_GELS} custom filters, the most a search can stack with. Remove one first.`);
		}
		if (await customGels.nameTaken(scope, fields.name, trx)) {
			throw new ApiError(409, 'name_taken', `${scopeWords(scope)} already has a filter called “${fields.name}”. Choose another name.`);
		}
		const row = await customGels.create(
			scope,
			{
				name: fields.name,
				notes: fields.notes,
				transmission: toStored(read.transmission),
				sourceUnit: read.sourceUnit,
				originalName: file.name,
				sha256: createHash('sha256').update(file.bytes).digest('hex'),
				sourceCsv: file.bytes
			},
			userId,
			trx
		);
		if (scope !== null) {
			await activity.create(scope, { userId, action: 'library.gel.add', subjectType: 'project', subjectId: scope, summary: `added the custom filter “${row.name}” to the project library` }, trx);
		}
		const view = customGelView(row);
		return { ...view, processingNotes: [...read.notes, ...view.processingNotes] };
	});
}

export async function removeCustomGel(scope: Scope, userId: number, id: number): Promise<void> {
	const row = await customGels.read(scope, id);
	if (!row) throw new ApiError(404, 'not_found', 'There is no such custom filter here.');
	await customGels.destroy(scope, id);
	if (scope !== null) {
		await activity.create(scope, { userId, action: 'library.gel.remove', subjectType: 'project', subjectId: scope, summary: `removed the custom filter “${row.name}” from the project library` });
	}
}

export async function readCustomGel(scope: Scope, id: number): Promise<CustomGelView> {
	const row = await customGels.read(scope, id);
	if (!row) throw new ApiError(404, 'not_found', 'There is no such custom filter here.');
	return customGelView(row);
}

// ---------------------------------------------------------------------------------------------
// Fixture profiles

/** A stored profile as the solvers take it. */
export function profileFromRow(row: Pick<FixtureProfileRow, 'key' | 'name' | 'notes' | 'channels'>): FixtureProfile {
	return {
		id: row.key,
		label: row.name,
		kind: 'custom',
		description: row.notes || 'Measured channel spectra.',
		generic: false,
		channels: row.channels.map((c) => ({
			id: c.id,
			label: c.label,
			emitter: { kind: 'measured' as const, spectrum: fromStored(c.spectrum) },
			...(c.maxFlux !== null ? { maxFlux: c.maxFlux } : { scale: 1 })
		}))
	};
}

function fixtureView(
	profile: FixtureProfile,
	meta: { id: number | null; scope: FixtureView['scope']; outputBasis: FixtureView['outputBasis']; originalName: string | null; createdBy: string | null; createdAt: Date | null }
): FixtureView {
	const resolved = resolveFixture(profile);
	let peak = 0;
	const series = resolved.channels.map((c) => {
		const v = sampleCurve(c.spectrum, 'zero');
		for (const x of v) peak = Math.max(peak, x);
		return v;
	});
	return {
		key: profile.id,
		id: meta.id,
		scope: meta.scope,
		name: profile.label,
		description: profile.description,
		kind: profile.kind,
		outputBasis: meta.outputBasis,
		channels: resolved.channels.map((c) => {
			let at = 0;
			for (let i = 1; i < c.spectrum.values.length; i++) if (c.spectrum.values[i] > c.spectrum.values[at]) at = i;
			let colour = '#888888';
			try {
				colour = displaySwatch({ x: c.x, y: c.y }).hex;
			} catch {
				// an odd chromaticity keeps the grey
			}
			return {
				id: c.id,
				label: c.label,
				output: c.XYZ.Y,
				share: c.XYZ.Y / resolved.totalY,
				x: c.x,
				y: c.y,
				u_prime: c.u_prime,
				v_prime: c.v_prime,
				peakNm: c.spectrum.start + at * c.spectrum.interval,
				colour
			};
		}),
		curves: { start: CURVE.start, interval: CURVE.interval, series: series.map((v) => v.map((x) => (peak > 0 ? round(x / peak, 4) : 0))) },
		grid: resolved.grid,
		originalName: meta.originalName,
		createdBy: meta.createdBy,
		createdAt: meta.createdAt ? meta.createdAt.toISOString() : null
	};
}

let genericViews: FixtureView[] | null = null;
export function genericFixtureViews(): FixtureView[] {
	genericViews ??= GENERIC_FIXTURES.map((p) =>
		fixtureView(p, { id: null, scope: 'generic', outputBasis: 'modelled', originalName: null, createdBy: null, createdAt: null })
	);
	return genericViews;
}

export function storedFixtureView(row: FixtureProfileRow): FixtureView {
	return fixtureView(profileFromRow(row), {
		id: row.id,
		scope: row.projectId === null ? 'shared' : 'project',
		outputBasis: row.outputBasis,
		originalName: row.originalName,
		createdBy: row.createdByName,
		createdAt: row.createdAt
	});
}

const KEY_RE = /^[a-z0-9][a-z0-9-]{0,62}$/;

/** A profile key from a name: lower case letters, digits and dashes. */
export function keyFromName(name: string): string {
	const k = name
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 60)
		.replace(/-+$/, '');
	return k || 'fixture';
}

function channelId(label: string, taken: Set<string>, position: number): string {
	let base = label
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.replace(/[^A-Za-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 24);
	if (!base) base = `ch${position}`;
	let id = base;
	for (let n = 2; taken.has(id.toLowerCase()); n++) id = `${base}-${n}`;
	taken.add(id.toLowerCase());
	return id;
}

const outputNumber = z.preprocess(
	(v) => (typeof v === 'string' ? parseDecimalField(v) : v),
	z.number({ error: 'Give each channel’s maximum output as a number.' }).finite().gt(0, 'A channel’s maximum output must be above 0.').max(1e9, 'That output is implausibly large.')
);

export const fixtureFieldsSchema = z.object({
	name: text(160, 'the name').min(1, 'Give the profile a name.'),
	key: z
		.string()
		.trim()
		.toLowerCase()
		.max(63, 'Keep the key under 64 characters.')
		.refine((k) => k === '' || KEY_RE.test(k), 'A key is lower-case letters, digits and dashes, starting with a letter or digit.')
		.refine((k) => !k.startsWith('generic-'), 'Keys starting with “generic-” belong to the built-in profiles.')
		.default(''),
	notes: text(2000, 'the notes').default(''),
	asMeasured: z.preprocess((v) => v === 'on' || v === 'true' || v === '1' || v === true, z.boolean()).default(false)
});

/**
 * Each channel's maximum output from a form: `outputs` as JSON (an array in column order, or an
 * object keyed by column header), or fields `output_1`, `output_2`, … in column order.
 */
export function outputsFromForm(form: FormData, labels: string[]): Array<number | undefined> {
	const raw = form.get('outputs');
	if (typeof raw === 'string' && raw.trim()) {
		let parsed: unknown;
		try {
			parsed = JSON.parse(raw);
		} catch {
			throw new ApiError(400, 'invalid', 'The "outputs" field is not valid JSON: give an array in column order or an object keyed by column header.');
		}
		if (Array.isArray(parsed)) return labels.map((_, i) => parsed[i] as number | undefined);
		if (parsed && typeof parsed === 'object') {
			const entries = Object.entries(parsed as Record<string, unknown>);
			return labels.map((l) => (entries.find(([k]) => k === l) ?? entries.find(([k]) => k.trim().toLowerCase() === l.toLowerCase()))?.[1] as number | undefined);
		}
		throw new ApiError(400, 'invalid', 'The "outputs" field must be an array or an object.');
	}
	return labels.map((_, i) => {
		const v = form.get(`output_${i + 1}`);
		return typeof v === 'string' && v.trim() !== '' ? (v as unknown as number) : undefined;
	});
}

/** Adds a fixture profile from uploaded channel spectra and each channel's maximum output. */
export async function addFixtureProfile(scope: Scope, userId: number, form: FormData): Promise<FixtureView & { processingNotes: string[] }> {
	const fields = fixtureFieldsSchema.parse(fieldsOf(form));
	const file = await formFile(form);
	const read = readChannelsCsv(file.bytes);
	const labels = read.channels.map((c) => c.label);
	let outputs: Array<number | null>;
	if (fields.asMeasured) {
		outputs = labels.map(() => null);
	} else {
		const given = outputsFromForm(form, labels);
		const missing = labels.filter((_, i) => given[i] === undefined || given[i] === null);
		if (missing.length > 0) {
			throw new ApiError(
				400,
				'outputs_needed',
				`Give the maximum output of every channel (missing: ${missing.join(', ')}), or say the spectra are on one scale as measured.`,
				{ channels: labels }
			);
		}
		outputs = given.map((v, i) => {
			const r = outputNumber.safeParse(v);
			if (!r.success) throw new ApiError(400, 'invalid_output', `${labels[i]}: ${r.error.issues[0]?.message ?? 'not a number'}`, { channels: labels });
			return r.data;
		});
	}
	const taken = new Set<string>();
	const channels: StoredChannel[] = read.channels.map((c, i) => ({ id: channelId(c.label, taken, i + 1), label: c.label.slice(0, 120), spectrum: toStored(c.spectrum), maxFlux: outputs[i] }));
	const key = fields.key || keyFromName(fields.name);
	if (key.startsWith('generic-')) throw new ApiError(400, 'invalid', 'Keys starting with “generic-” belong to the built-in profiles.');
	// Resolve once before storing: every channel must emit visible light.
	try {
		resolveFixture(profileFromRow({ key, name: fields.name, notes: fields.notes, channels }));
	} catch (e) {
		if (e instanceof RangeError || e instanceof SpectrumError) throw new ApiError(400, 'profile_invalid', e.message);
		throw e;
	}
	return db.transaction(async (trx) => {
		if ((await fixtureProfiles.count(scope, trx)) >= MAX_FIXTURE_PROFILES) {
			throw new ApiError(409, 'library_full', `${scopeWords(scope)} already has ${MAX_FIXTURE_PROFILES} fixture profiles. Remove one first.`);
		}
		if (await fixtureProfiles.readByKey(scope, key, trx)) {
			throw new ApiError(409, 'key_taken', `${scopeWords(scope)} already has a profile with the key “${key}”. Choose another key.`);
		}
		if (await fixtureProfiles.nameTaken(scope, fields.name, trx)) {
			throw new ApiError(409, 'name_taken', `${scopeWords(scope)} already has a profile called “${fields.name}”. Choose another name.`);
		}
		const row = await fixtureProfiles.create(
			scope,
			{
				key,
				name: fields.name,
				notes: fields.notes,
				channels,
				outputBasis: fields.asMeasured ? 'as_measured' : 'max_output',
				originalName: file.name,
				sha256: createHash('sha256').update(file.bytes).digest('hex'),
				sourceCsv: file.bytes
			},
			userId,
			trx
		);
		if (scope !== null) {
			await activity.create(scope, { userId, action: 'library.fixture.add', subjectType: 'project', subjectId: scope, summary: `added the fixture profile “${row.name}” (${row.key}) to the project library` }, trx);
		}
		return { ...storedFixtureView(row), processingNotes: read.notes };
	});
}

/** Removes a profile. For a project, says how many of its lights still name the key (they fall back to a generic profile by kind). */
export async function removeFixtureProfile(scope: Scope, userId: number, id: number): Promise<{ lightsNamingIt: number }> {
	const row = await fixtureProfiles.read(scope, id);
	if (!row) throw new ApiError(404, 'not_found', 'There is no such fixture profile here.');
	await fixtureProfiles.destroy(scope, id);
	let lightsNamingIt = 0;
	if (scope !== null) {
		const r = await db('lights').where({ project_id: scope, fixture_profile: row.key }).whereNull('deleted_at').count({ n: '*' }).first();
		lightsNamingIt = Number(r?.n ?? 0);
		await activity.create(scope, { userId, action: 'library.fixture.remove', subjectType: 'project', subjectId: scope, summary: `removed the fixture profile “${row.name}” (${row.key}) from the project library` });
	}
	return { lightsNamingIt };
}

export async function readFixtureProfile(scope: Scope, id: number): Promise<FixtureView> {
	const row = await fixtureProfiles.read(scope, id);
	if (!row) throw new ApiError(404, 'not_found', 'There is no such fixture profile here.');
	return storedFixtureView(row);
}

// ---------------------------------------------------------------------------------------------
// Overrides

/** A typed number: decimal point or comma, and the typographic minus (“−68”) as well as “-68”. */
export function parseDecimalField(s: string): number {
	const t = s.trim().replace(/^[\u2212\u2013]/, '-').replace(',', '.');
	if (t === '' || !/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t)) return Number.NaN;
	return Number(t);
}

const optionalNumber = (what: string, min: number, max: number) =>
	z.preprocess(
		(v) => (v === '' || v === undefined ? null : typeof v === 'string' ? parseDecimalField(v) : v),
		z.number({ error: `${what} must be a number.` }).finite(`${what} must be a number.`).min(min, `${what} must be at least ${min}.`).max(max, `${what} must be at most ${max}.`).nullable()
	);

export const overrideSchema = z
	.object({
		miredShift: optionalNumber('The mired shift', -400, 400),
		lossStops: optionalNumber('The light loss', 0, 10),
		note: text(500, 'the note').default('')
	})
	.refine((o) => o.miredShift !== null || o.lossStops !== null, { message: 'Give a mired shift or a light loss (or clear the override).', path: ['miredShift'] });

export type OverrideInput = z.infer<typeof overrideSchema>;

/** Sets the project's figures for one built-in filter (“our swatch book says ½ CTB is −68”). */
export async function setOverride(projectId: number, userId: number, gelId: string, input: OverrideInput): Promise<FilterView> {
	const def = gelDefinition(gelId);
	if (!def) throw new ApiError(404, 'not_found', `There is no built-in filter “${gelId}”.`);
	const o = { ...(input.miredShift !== null ? { miredShift: input.miredShift } : {}), ...(input.lossStops !== null ? { lossStops: input.lossStops } : {}) };
	try {
		validateGelOverrides({ [gelId]: o });
	} catch (e) {
		if (e instanceof RangeError) throw new ApiError(400, 'invalid_override', e.message);
		throw e;
	}
	const saved = await filterOverrides.upsert(projectId, gelId, { miredShift: input.miredShift, lossStops: input.lossStops, note: input.note }, userId);
	const parts = [input.miredShift !== null ? `${input.miredShift > 0 ? '+' : ''}${input.miredShift} mired` : null, input.lossStops !== null ? `${input.lossStops} stops` : null].filter(Boolean);
	await activity.create(projectId, { userId, action: 'library.override.set', subjectType: 'project', subjectId: projectId, summary: `set ${def.label} to ${parts.join(', ')} for this project`, details: { gelId, ...o } });
	return filterViews([saved]).find((f) => f.id === gelId) as FilterView;
}

export async function clearOverride(projectId: number, userId: number, gelId: string): Promise<void> {
	const def = gelDefinition(gelId);
	if (!def || !(await filterOverrides.destroy(projectId, gelId))) throw new ApiError(404, 'not_found', 'This project does not override that filter.');
	await activity.create(projectId, { userId, action: 'library.override.clear', subjectType: 'project', subjectId: projectId, summary: `put ${def.label} back to the built-in figures`, details: { gelId } });
}

export interface OverrideListItem {
	gelId: string;
	label: string;
	miredShift: number | null;
	lossStops: number | null;
	note: string;
	updatedBy: string | null;
	updatedAt: string;
}

function overrideList(list: filterOverrides.FilterOverride[]): OverrideListItem[] {
	return list.map((o) => ({
		gelId: o.gelId,
		label: gelDefinition(o.gelId)?.label ?? o.gelId,
		miredShift: o.miredShift,
		lossStops: o.lossStops,
		note: o.note,
		updatedBy: o.updatedByName,
		updatedAt: o.updatedAt.toISOString()
	}));
}

export async function listOverrides(projectId: number): Promise<OverrideListItem[]> {
	return overrideList(await filterOverrides.list(projectId));
}

// ---------------------------------------------------------------------------------------------
// Whole libraries

export interface SharedLibrary {
	filters: FilterView[];
	customGels: CustomGelView[];
	fixtures: FixtureView[];
	heatCaution: string;
}

let sharedFilters: FilterView[] | null = null;

/** The shared library: built-in filters, shared custom filters, generic and shared fixture profiles. */
export async function sharedLibrary(): Promise<SharedLibrary> {
	sharedFilters ??= filterViews();
	const [gels, profiles] = await Promise.all([customGels.list(null), fixtureProfiles.list(null)]);
	return {
		filters: sharedFilters,
		customGels: gels.map(customGelView),
		fixtures: [...genericFixtureViews(), ...profiles.map(storedFixtureView)],
		heatCaution: HEAT_CAUTION
	};
}

export interface ProjectLibrary extends SharedLibrary {
	overrides: OverrideListItem[];
}

/** A project's library: built-in filters with its overrides, its and the shared custom filters, and every profile it can use. */
export async function projectLibrary(projectId: number): Promise<ProjectLibrary> {
	const [overrides, own, shared, ownProfiles, sharedProfiles] = await Promise.all([
		filterOverrides.list(projectId),
		customGels.list(projectId),
		customGels.list(null),
		fixtureProfiles.list(projectId),
		fixtureProfiles.list(null)
	]);
	return {
		filters: filterViews(overrides),
		overrides: overrideList(overrides),
		customGels: [...own.map(customGelView), ...shared.map(customGelView)],
		fixtures: [...genericFixtureViews(), ...ownProfiles.map(storedFixtureView), ...sharedProfiles.map(storedFixtureView)],
		heatCaution: HEAT_CAUTION
	};
}

/** Everything the solvers need for a project: overrides, custom filters (its own, then shared) and fixture lookup. */
export async function solverLibrary(projectId: number): Promise<{
	overrides: GelOverrides;
	extraGels: Gel[];
	findFixture: (key: string) => Promise<FixtureProfile | null>;
}> {
	const [overrides, own, shared] = await Promise.all([filterOverrides.list(projectId), customGels.list(projectId), customGels.list(null)]);
	const extraGels: Gel[] = [];
	for (const row of [...own, ...shared]) {
		try {
			extraGels.push(gelFromRow(row).gel);
		} catch {
			// A row that no longer characterises (should not happen: checked on upload) is left out of the search.
		}
	}
	return {
		overrides: overridesMap(overrides),
		extraGels,
		findFixture: (key) => findFixture(projectId, key)
	};
}

/** A fixture profile by key: a generic id first, then the project's profiles, then the shared ones. */
export async function findFixture(projectId: number, rawKey: string): Promise<FixtureProfile | null> {
	const key = rawKey.trim();
	if (!key) return null;
	const generic = GENERIC_FIXTURES.find((f) => f.id === key);
	if (generic) return generic;
	const row = (await fixtureProfiles.readByKey(projectId, key)) ?? (await fixtureProfiles.readByKey(null, key));
	return row ? profileFromRow(row) : null;
}

/** Built-in filter ids in display order, for forms. */
export function builtInFilterChoices(): Array<{ id: string; label: string; family: GelFamily; canShiftMired: boolean }> {
	return GEL_DEFINITIONS.map((d) => ({ id: d.id, label: d.label, family: d.family, canShiftMired: d.family !== 'ND' }));
}

// ---------------------------------------------------------------------------------------------
// Form actions

/** Runs a library form action: ApiErrors and zod issues become `fail(status, …)` with the values sent back. */
export async function libraryAction(form: FormData, action: string, run: () => Promise<Record<string, unknown> | void>) {
	const values = fieldsOf(form);
	try {
		const r = await run();
		return { action, ok: true as const, ...(r ?? {}) };
	} catch (e) {
		if (e instanceof ApiError) return fail(e.status, { action, message: e.message, code: e.code, details: e.details ?? null, values, issues: {} as Record<string, string[]> });
		if (e instanceof z.ZodError) {
			const issues: Record<string, string[]> = {};
			for (const i of e.issues) (issues[String(i.path[0] ?? 'form')] ??= []).push(i.message);
			return fail(400, { action, message: 'Some fields need a second look.', code: 'invalid', details: null, values, issues });
		}
		throw e;
	}
}
