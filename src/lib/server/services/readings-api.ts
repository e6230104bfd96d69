/**
 * The readings API's rules on top of the readings service: references must belong to the project,
 * conflicts say who saved first, files are checked for size and type before they are read.
 */
import { DEFAULT_LIMITS, ImportError, columnMappingSchema, parseReadings, analyzeReport, toAnalyzeJson } from '$lib/import';
import { ApiError } from '$lib/server/api';
import * as lights from '$lib/server/db/lights';
import * as readings from '$lib/server/db/readings';
import * as setups from '$lib/server/db/setups';
import * as users from '$lib/server/db/users';
import { assertSetupOpen } from '$lib/server/services/log';
import type { Reading } from '$lib/server/db/readings';
import { confirmUpload, createReading, previewUpload, UnusableInputError } from '$lib/server/services/readings';
import { createReadingSchema, type CreateReadingInput } from '$lib/schemas/readings';
import type { z } from 'zod';
import type { patchReadingSchema } from '$lib/schemas/readings';

export const MAX_UPLOAD_BYTES = DEFAULT_LIMITS.maxBytes;

/** A reading as the API sends it. The spectrum (which can be large) only when asked for. */
export function toApiReading(r: Reading, { spectrum }: { spectrum: boolean }) {
	const raw = r.raw.kind === 'spectral' && !spectrum ? { kind: 'spectral', spectrum: { start: r.raw.spectrum.start, interval: r.raw.spectrum.interval, bands: r.raw.spectrum.values.length, scale: r.raw.spectrum.scale } } : r.raw;
	return {
		id: r.id,
		project_id: r.projectId,
		setup_id: r.setupId,
		light_id: r.lightId,
		upload_id: r.uploadId,
		source_row: r.sourceRow,
		label: r.label,
		kind: r.kind,
		taken_at: r.takenAt,
		meter: r.meter,
		notes: r.notes,
		raw,
		...r.computed,
		computation_version: r.computationVersion,
		version: r.version,
		created_at: r.createdAt,
		updated_at: r.updatedAt
	};
}

async function checkAssignment(projectId: number, setupId: number | null | undefined, lightId: number | null | undefined) {
	if (setupId != null && !(await setups.exists(projectId, setupId))) {
		throw new ApiError(400, 'invalid', `Setup ${setupId} is not in this project.`, [{ path: 'setupId', message: 'No such setup in this project.' }]);
	}
	if (lightId != null) {
		const lightSetup = await lights.setupOf(projectId, lightId);
		if (lightSetup === null) throw new ApiError(400, 'invalid', `Light ${lightId} is not in this project.`, [{ path: 'lightId', message: 'No such light in this project.' }]);
		if (setupId != null && lightSetup !== setupId) {
			throw new ApiError(400, 'invalid', `Light ${lightId} belongs to another setup.`, [{ path: 'lightId', message: 'That light is in another setup.' }]);
		}
		return { setupId: setupId ?? lightSetup, lightId };
	}
	return { setupId: setupId ?? null, lightId: null };
}

export async function createReadingChecked(projectId: number, userId: number, body: CreateReadingInput): Promise<Reading> {
	const assign = await checkAssignment(projectId, body.setupId, body.lightId);
	// A locked setup is frozen: no new readings on it.
	await assertSetupOpen(projectId, assign.setupId);
	try {
		return await createReading(projectId, userId, { ...body, ...assign });
	} catch (e) {
		return unusable(e);
	}
}

export async function patchReadingChecked(projectId: number, id: number, userId: number, body: z.infer<typeof patchReadingSchema>): Promise<Reading> {
	const current = await readings.read(projectId, id);
	if (!current) throw new ApiError(404, 'not_found', 'There is no such reading in this project.');
	if (body.setupId !== undefined || body.lightId !== undefined) {
		const assign = await checkAssignment(projectId, body.setupId === undefined ? current.setupId : body.setupId, body.lightId === undefined ? current.lightId : body.lightId);
		body = { ...body, ...assign };
	}
	// Neither the setup a reading is in nor the one it moves to may be locked.
	await assertSetupOpen(projectId, current.setupId);
	if (body.setupId != null) await assertSetupOpen(projectId, body.setupId);
	const { version, ...patch } = body;
	const result = await readings.update(projectId, id, patch, version, userId);
	if (!result) throw new ApiError(404, 'not_found', 'There is no such reading in this project.');
	if ('conflict' in result) {
		const by = result.conflict.updatedBy ? await users.read(result.conflict.updatedBy) : null;
		throw new ApiError(409, 'conflict', `${by?.name || by?.email || 'Someone'} changed this reading first (now version ${result.conflict.version}). Review their change and save again.`, {
			current: toApiReading(result.conflict, { spectrum: false }),
			changedBy: by ? { id: by.id, name: by.name } : null
		});
	}
	return result.reading;
}

/** Reads a multipart upload with its size and type checked first. */
async function uploadedFile(request: Request): Promise<{ file: File; mapping: unknown }> {
	const type = request.headers.get('content-type') ?? '';
	if (!type.startsWith('multipart/form-data')) throw new ApiError(415, 'unsupported_media_type', 'Send the file as multipart/form-data with a "file" field.');
	const length = Number(request.headers.get('content-length') ?? 0);
	if (length > MAX_UPLOAD_BYTES + 64 * 1024) throw new ApiError(413, 'too_large', `The file is larger than the ${MAX_UPLOAD_BYTES / 1024 / 1024} MB limit.`);
	let form: FormData;
	try {
		form = await request.formData();
	} catch {
		throw new ApiError(400, 'bad_request', 'The upload could not be read as a form.');
	}
	const file = form.get('file');
	if (!(file instanceof File)) throw new ApiError(400, 'invalid', 'Attach the readings file as the "file" field.');
	if (file.size > MAX_UPLOAD_BYTES) throw new ApiError(413, 'too_large', `The file is larger than the ${MAX_UPLOAD_BYTES / 1024 / 1024} MB limit.`);
	const mappingText = form.get('mapping');
	let mapping: unknown;
	if (typeof mappingText === 'string' && mappingText.trim()) {
		try {
			mapping = JSON.parse(mappingText);
		} catch {
			throw new ApiError(400, 'invalid', 'The column mapping is not valid JSON.');
		}
	}
	return { file, mapping };
}

function unusable(e: unknown): never {
	if (e instanceof UnusableInputError || e instanceof ImportError) {
		const status = e.code === 'too_large' || e.code === 'too_many_rows' || e.code === 'too_many_columns' ? 413 : e.code === 'not_found' ? 404 : e.code === 'already_imported' ? 409 : 400;
		throw new ApiError(status, e.code, e.message);
	}
	throw e;
}

export async function previewUploadRequest(request: Request, projectId: number, userId: number) {
	const { file, mapping } = await uploadedFile(request);
	const parsedMapping = mapping === undefined ? undefined : columnMappingSchema.parse(mapping);
	const bytes = new Uint8Array(await file.arrayBuffer());
	try {
		return await previewUpload(projectId, userId, { name: file.name, type: file.type, bytes }, parsedMapping);
	} catch (e) {
		return unusable(e);
	}
}

export async function confirmUploadChecked(projectId: number, uploadId: number, userId: number, assign: { setupId?: number | null; lightId?: number | null }) {
	const checked = await checkAssignment(projectId, assign.setupId, assign.lightId);
	await assertSetupOpen(projectId, checked.setupId);
	try {
		return await confirmUpload(projectId, uploadId, userId, checked);
	} catch (e) {
		return unusable(e);
	}
}

/** Stateless analysis: a CSV body (text/csv, or multipart `file`) or JSON `{ readings: [...] }`. */
export async function analyzeRequest(request: Request) {
	const type = request.headers.get('content-type') ?? '';
	if (type.includes('application/json')) {
		let body: unknown;
		try {
			body = await request.json();
		} catch {
			throw new ApiError(400, 'invalid_json', 'The body is not valid JSON.');
		}
		const list = (body as { readings?: unknown })?.readings;
		if (!Array.isArray(list) || list.length === 0 || list.length > 1000) throw new ApiError(400, 'invalid', 'Send { "readings": [ … ] } with 1 to 1000 readings.');
		const { analyzeRaw } = await import('$lib/server/services/readings');
		const out = [];
		const errors = [];
		for (let i = 0; i < list.length; i++) {
			const parsed = createReadingSchema.shape.raw.safeParse((list[i] as { raw?: unknown })?.raw ?? list[i]);
			if (!parsed.success) {
				errors.push({ index: i, message: parsed.error.issues.map((x) => `${x.path.join('.') || 'reading'}: ${x.message}`).join('; ') });
				continue;
			}
			try {
				out.push({ index: i, kind: parsed.data.kind, ...analyzeRaw(parsed.data) });
			} catch (e) {
				errors.push({ index: i, message: (e as Error).message });
			}
		}
		return { readings: out, errors };
	}
	let bytes: Uint8Array;
	if (type.startsWith('multipart/form-data')) {
		bytes = new Uint8Array(await (await uploadedFile(request)).file.arrayBuffer());
	} else if (type.startsWith('text/') || type === 'application/octet-stream' || type === '') {
		const length = Number(request.headers.get('content-length') ?? 0);
		if (length > MAX_UPLOAD_BYTES) throw new ApiError(413, 'too_large', `The file is larger than the ${MAX_UPLOAD_BYTES / 1024 / 1024} MB limit.`);
		bytes = new Uint8Array(await request.arrayBuffer());
	} else {
		throw new ApiError(415, 'unsupported_media_type', 'Send a CSV (text/csv or multipart "file") or JSON readings.');
	}
	try {
		return toAnalyzeJson(analyzeReport(parseReadings(bytes)));
	} catch (e) {
		return unusable(e);
	}
}
