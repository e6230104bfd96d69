/**
 * Readings in: analyse raw input with the colour core, preview and import uploaded files (the
 * original always kept), typed entry, and recomputation when the colour computation changes.
 */
import {
	analyzeChromaticity,
	analyzeSpectrum,
	COMPUTATION_VERSION,
	makeSpectrum,
	type ReadingAnalysis
} from '$lib/colour';
import {
	analyzeReport,
	ImportError,
	parseReadings,
	type ColumnMapping,
	type ParsedReading,
	type RowError
} from '$lib/import';
import { db } from '$lib/server/db';
import * as readings from '$lib/server/db/readings';
import * as uploads from '$lib/server/db/uploads';
import type { Computed, RawReading } from '$lib/server/db/readings';

/** Computed values for a raw reading, by the current colour computation. Throws on unusable input. */
export function analyzeRaw(raw: RawReading): Computed {
	const lux = raw.lux ?? null;
	let a: ReadingAnalysis;
	switch (raw.kind) {
		case 'spectral': {
			const s = raw.spectrum;
			a = analyzeSpectrum(makeSpectrum(s.start, s.interval, s.values, s.scale));
			if (a.lux === null && lux !== null) a = { ...a, lux };
			break;
		}
		case 'chromaticity_xy':
			a = analyzeChromaticity({ x: raw.x, y: raw.y }, lux);
			break;
		case 'chromaticity_uv_prime':
			a = analyzeChromaticity({ u_prime: raw.u_prime, v_prime: raw.v_prime }, lux);
			break;
		case 'cct_duv':
			a = analyzeChromaticity({ cct_k: raw.cct_k, duv: raw.duv }, lux);
			break;
		case 'tristimulus':
			a = analyzeChromaticity({ X: raw.X, Y: raw.Y, Z: raw.Z }, lux);
			break;
	}
	return a;
}

/** The importer's reading as it is stored (typed arrays become plain numbers). */
export function rawFromParsed(r: ParsedReading): RawReading {
	const lux = r.lux ?? null;
	switch (r.kind) {
		case 'spectral':
			return {
				kind: 'spectral',
				spectrum: { start: r.spectrum.start, interval: r.spectrum.interval, values: Array.from(r.spectrum.values), scale: r.spectrum.scale },
				lux
			};
		case 'chromaticity_xy':
			return { kind: r.kind, x: r.x, y: r.y, lux };
		case 'chromaticity_uv_prime':
			return { kind: r.kind, u_prime: r.u_prime, v_prime: r.v_prime, lux };
		case 'cct_duv':
			return { kind: r.kind, cct_k: r.cct_k, duv: r.duv, lux };
		case 'tristimulus':
			return { kind: r.kind, X: r.X, Y: r.Y, Z: r.Z, lux };
	}
}

export interface PreviewRow {
	row: number;
	label: string;
	kind: string;
	takenAt: string | null;
	computed: Computed;
}

export interface UploadPreview {
	uploadId: number;
	filename: string;
	sizeBytes: number;
	sha256: string;
	format: string;
	delimiter: string;
	encoding: string;
	/** Earlier uploads of the very same bytes to this project. */
	sameAs: { id: number; filename: string; createdAt: string; status: string }[];
	readings: PreviewRow[];
	errors: RowError[];
	warnings: string[];
	totalReadings: number;
}

/** Input that cannot be read or analysed at all; `message` is a sentence for the person. */
export class UnusableInputError extends Error {
	constructor(
		message: string,
		readonly code: string
	) {
		super(message);
	}
}

function analyseBytes(bytes: Uint8Array, mapping: ColumnMapping | undefined) {
	try {
		const report = parseReadings(bytes, mapping ? { mapping } : {});
		return { ...analyzeReport(report), delimiter: report.delimiter, encoding: report.encoding };
	} catch (e) {
		if (e instanceof ImportError) throw new UnusableInputError(e.message, e.code);
		throw e;
	}
}

/**
 * Stores the file (always, byte for byte) and returns what would be imported, for the person to
 * confirm. Nothing is imported yet. Throws UnusableInputError for a file that cannot be read at all
 * (the file is still kept, so it can be re-read after a fix).
 */
export async function previewUpload(
	projectId: number,
	userId: number | null,
	file: { name: string; type: string; bytes: Uint8Array },
	mapping?: ColumnMapping,
	{ previewRows = 200 }: { previewRows?: number } = {}
): Promise<UploadPreview> {
	const hash = uploads.sha256(file.bytes);
	const same = await uploads.findSame(projectId, hash);
	let result: ReturnType<typeof analyseBytes> | undefined;
	let failure: UnusableInputError | undefined;
	try {
		result = analyseBytes(file.bytes, mapping);
	} catch (e) {
		if (!(e instanceof UnusableInputError)) throw e;
		failure = e;
	}
	const summary = result
		? { format: result.format, readings: result.readings.length, errors: result.errors.length }
		: { unusable: failure?.message, code: failure?.code };
	const upload = await uploads.create({
		projectId,
		filename: file.name || 'upload.csv',
		contentType: file.type || 'text/csv',
		bytes: file.bytes,
		uploadedBy: userId,
		mapping: mapping ?? null,
		report: summary
	});
	if (failure || !result) throw failure;
	return {
		uploadId: upload.id,
		filename: upload.filename,
		sizeBytes: upload.sizeBytes,
		sha256: upload.sha256,
		format: result.format,
		delimiter: result.delimiter,
		encoding: result.encoding,
		sameAs: same.map((u) => ({ id: u.id, filename: u.filename, createdAt: u.createdAt, status: u.status })),
		readings: result.readings.slice(0, previewRows).map(({ reading, analysis }) => ({
			row: reading.row,
			label: reading.label,
			kind: reading.kind,
			takenAt: reading.taken_at ?? null,
			computed: analysis
		})),
		errors: result.errors,
		warnings: result.warnings,
		totalReadings: result.readings.length
	};
}

/**
 * Imports every good reading of a previewed upload in one transaction (all or nothing), assigned to
 * a setup and/or light when given. Re-reads the stored bytes, so what is imported is exactly the file.
 */
export async function confirmUpload(
	projectId: number,
	uploadId: number,
	userId: number | null,
	assign: { setupId?: number | null; lightId?: number | null } = {}
): Promise<{ imported: number; errors: RowError[] }> {
	const upload = await uploads.read(projectId, uploadId);
	if (!upload) throw new UnusableInputError('That upload does not exist in this project.', 'not_found');
	if (upload.status === 'imported') throw new UnusableInputError('This upload has already been imported.', 'already_imported');
	const bytes = await uploads.content(projectId, uploadId);
	if (!bytes) throw new UnusableInputError('The stored file is missing.', 'not_found');
	const result = analyseBytes(new Uint8Array(bytes), (upload.mapping as ColumnMapping | null) ?? undefined);
	const rows = result.readings.map(({ reading, analysis }) => ({
		projectId,
		setupId: assign.setupId ?? null,
		lightId: assign.lightId ?? null,
		uploadId,
		sourceRow: reading.row,
		label: reading.label,
		takenAt: reading.taken_at ?? null,
		meter: reading.meter ?? null,
		notes: reading.notes ?? null,
		raw: rawFromParsed(reading),
		computed: analysis,
		computationVersion: result.computationVersion,
		createdBy: userId
	}));
	await db.transaction(async (trx) => {
		await readings.createMany(rows, trx);
		await uploads.markImported(uploadId, upload.mapping, { format: result.format, imported: rows.length, errors: result.errors.length }, trx);
	});
	return { imported: rows.length, errors: result.errors };
}

/** One reading typed by hand or sent as JSON. Throws (a plain Error with a sentence) on unusable input. */
export async function createReading(
	projectId: number,
	userId: number | null,
	input: { raw: RawReading; label: string; setupId?: number | null; lightId?: number | null; takenAt?: string | null; meter?: string | null; notes?: string | null }
) {
	let computed: Computed;
	try {
		computed = analyzeRaw(input.raw);
	} catch (e) {
		throw new UnusableInputError(e instanceof Error ? e.message : String(e), 'unusable_reading');
	}
	return readings.create({
		projectId,
		setupId: input.setupId ?? null,
		lightId: input.lightId ?? null,
		label: input.label,
		takenAt: input.takenAt ?? null,
		meter: input.meter ?? null,
		notes: input.notes ?? null,
		raw: input.raw,
		computed,
		computationVersion: COMPUTATION_VERSION,
		createdBy: userId
	});
}

/** Recomputes readings made by an older computation version, in batches. Returns how many. */
export async function recomputeStale(batch = 500): Promise<number> {
	let done = 0;
	for (;;) {
		const stale = await readings.listStale(COMPUTATION_VERSION, batch);
		if (stale.length === 0) return done;
		for (const r of stale) {
			let computed: Computed;
			try {
				computed = analyzeRaw(r.raw);
			} catch (e) {
				computed = { ...r.computed, warnings: [...(r.computed?.warnings ?? []), `Could not recompute: ${(e as Error).message}`] };
			}
			await readings.saveComputed(r.id, computed, COMPUTATION_VERSION);
			done += 1;
		}
	}
}
