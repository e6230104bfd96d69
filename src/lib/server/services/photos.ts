/**
 * Photos of the set. The browser never sends the bytes through the app:
 *
 *   1. `requestUpload`: permission, declared type and size checked; a pending row; a presigned PUT
 *      (a few minutes) to an "incoming" key.
 *   2. The browser PUTs the file straight to storage.
 *   3. `completeUpload`: the server reads the object back, decides from the bytes (not the declared
 *      type) whether it is a photo we take, re-encodes it without any metadata (orientation applied
 *      first, GPS and everything else gone, colour profile kept), writes the cleaned original and a
 *      thumbnail to their final keys, deletes the incoming object and marks the row ready; or marks it
 *      rejected with a reason a person can act on.
 *
 * Reading goes through `photoObjectUrl`: the app checks permission, then redirects to a presigned
 * GET that lasts a minute.
 */
import { randomUUID } from 'node:crypto';
import exifr from 'exifr';
import sharp, { type Metadata } from 'sharp';
import { z } from 'zod';
import { ApiError } from '$lib/server/api';
import type { ProjectAccess } from '$lib/server/authz';
import * as activity from '$lib/server/db/activity';
import * as lights from '$lib/server/db/lights';
import * as photos from '$lib/server/db/photos';
import * as setups from '$lib/server/db/setups';
import type { Photo, PhotoStatus } from '$lib/server/db/photos';
import * as storage from '$lib/server/storage';
import { StorageConfigError } from '$lib/server/storage';

/** 15 MiB: a full-size phone JPEG is 2–8 MB; anything bigger is usually a RAW or a panorama. */
export const MAX_PHOTO_BYTES = 15 * 1024 * 1024;
/** 100 megapixels: refuses decompression bombs (a small file that expands to gigabytes of pixels). */
export const MAX_PHOTO_PIXELS = 100_000_000;
/** How long the browser has to start its PUT. */
export const PUT_URL_SECONDS = 300;
/** How long a presigned GET lasts after the app's permission check. */
export const GET_URL_SECONDS = 60;
export const THUMBNAIL_WIDTH = 480;
/** Pending photos older than this were abandoned (upload never sent, or never finished). */
export const STALE_PENDING_MS = 24 * 60 * 60 * 1000;

export type PhotoFormat = 'jpeg' | 'png' | 'webp' | 'heic';

const FORMAT_TYPES: Record<PhotoFormat, string> = { jpeg: 'image/jpeg', png: 'image/png', webp: 'image/webp', heic: 'image/heic' };
const TYPE_ALIASES: Record<string, PhotoFormat> = {
	'image/jpeg': 'jpeg',
	'image/jpg': 'jpeg',
	'image/pjpeg': 'jpeg',
	'image/png': 'png',
	'image/webp': 'webp',
	'image/heic': 'heic',
	'image/heif': 'heic',
	'image/heic-sequence': 'heic',
	'image/heif-sequence': 'heic'
};
const EXTENSIONS: Record<string, PhotoFormat> = { jpg: 'jpeg', jpeg: 'jpeg', jpe: 'jpeg', jfif: 'jpeg', png: 'png', webp: 'webp', heic: 'heic', heif: 'heic' };

export const HEIC_REFUSED =
	'HEIC photos cannot be read on this server. Export the photo as JPEG (most phones offer JPEG when sharing, or a “most compatible” camera setting), then upload it again.';

let heic: boolean | undefined;

/**
 * Whether this build of sharp decodes HEIC (HEVC-coded HEIF). The prebuilt sharp binaries read
 * AVIF but not HEVC; libvips then lists only ".avif" among the HEIF loader's suffixes.
 */
export function heicSupported(): boolean {
	heic ??= (sharp.format.heif?.input?.fileSuffix ?? []).some((s) => s.toLowerCase() === '.heic');
	return heic;
}

/** The rules an uploader can check before asking (the server checks again either way). */
export interface UploadRules {
	maxBytes: number;
	types: string[];
	heic: boolean;
	heicMessage: string;
}

export function uploadRules(): UploadRules {
	const types = ['image/jpeg', 'image/png', 'image/webp', ...(heicSupported() ? ['image/heic', 'image/heif'] : [])];
	return { maxBytes: MAX_PHOTO_BYTES, types, heic: heicSupported(), heicMessage: HEIC_REFUSED };
}

/** A reason to refuse a file, with the HTTP status and code the API answers with. */
export class PhotoRejection extends Error {
	constructor(
		readonly status: number,
		readonly code: string,
		message: string
	) {
		super(message);
	}
}

export function megabytes(bytes: number): string {
	const mb = bytes / (1024 * 1024);
	return `${mb >= 10 ? Math.round(mb) : Math.round(mb * 10) / 10} MB`;
}

const extensionOf = (name: string) => (/\.([A-Za-z0-9]{1,8})$/.exec(name)?.[1] ?? '').toLowerCase();

/**
 * Checks what the browser says it will send. Returns the format and the content type the PUT must
 * carry; throws PhotoRejection (413 too large, 415 not a type we take, 400 empty).
 */
export function checkDeclaredFile(f: { filename: string; type: string; size: number }): { format: PhotoFormat; contentType: string } {
	const declared = f.type.trim().toLowerCase();
	const fromType = TYPE_ALIASES[declared];
	const fromName = EXTENSIONS[extensionOf(f.filename)];
	// Some browsers send no type (or a generic one) for HEIC and for files from other apps.
	const format = fromType ?? (declared === '' || declared === 'application/octet-stream' ? fromName : undefined);
	if (!format) {
		const what = declared ? `a file of type ${declared}` : 'a file of unknown type';
		throw new PhotoRejection(415, 'unsupported_type', `“${f.filename}” is ${what}. Photos can be JPEG, PNG or WebP${heicSupported() ? ' or HEIC' : ''}.`);
	}
	if (format === 'heic' && !heicSupported()) throw new PhotoRejection(415, 'heic_unsupported', HEIC_REFUSED);
	if (!Number.isFinite(f.size) || f.size <= 0) throw new PhotoRejection(400, 'empty_file', `“${f.filename}” is empty. Pick the photo again.`);
	if (f.size > MAX_PHOTO_BYTES) {
		throw new PhotoRejection(
			413,
			'too_large',
			`“${f.filename}” is ${megabytes(f.size)}; photos can be up to ${megabytes(MAX_PHOTO_BYTES)}. Export a smaller JPEG (phones usually offer a smaller size when sharing) and try again.`
		);
	}
	return { format, contentType: FORMAT_TYPES[format] };
}

/** HEIF-family brands that mean HEVC coding (HEIC), from the file's `ftyp` box. */
const HEIC_BRANDS = new Set(['heic', 'heix', 'hevc', 'hevx', 'heim', 'heis', 'hevm', 'hevs']);

export function looksLikeHeic(bytes: Uint8Array): boolean {
	if (bytes.byteLength < 12) return false;
	const text = (from: number, to: number) => String.fromCharCode(...bytes.subarray(from, to));
	if (text(4, 8) !== 'ftyp') return false;
	const boxSize = Math.min(((bytes[0] << 24) | (bytes[1] << 16) | (bytes[2] << 8) | bytes[3]) >>> 0, bytes.byteLength, 256);
	const brands = [text(8, 12)];
	for (let i = 16; i + 4 <= boxSize; i += 4) brands.push(text(i, i + 4));
	return brands.some((b) => HEIC_BRANDS.has(b));
}

const finite = (v: unknown) => typeof v === 'number' && Number.isFinite(v);
const hasCoordinates = (g: object | undefined | null): boolean => {
	const r = g as Record<string, unknown> | undefined | null;
	if (!r) return false;
	return (finite(r.latitude) && finite(r.longitude)) || r.GPSLatitude !== undefined || r.GPSLongitude !== undefined;
};

/** Whether the file carries GPS coordinates, in its EXIF (any container) or its XMP. */
export async function hasLocation(bytes: Uint8Array, meta: Metadata): Promise<boolean> {
	const buffer = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	try {
		if (hasCoordinates(await exifr.gps(buffer))) return true;
	} catch {
		// exifr does not know every container (WebP among them): the EXIF block sharp found follows.
	}
	if (meta.exif?.byteLength) {
		const exif = meta.exif.subarray(0, 6).toString('latin1') === 'Exif\0\0' ? meta.exif.subarray(6) : meta.exif;
		try {
			if (hasCoordinates(await exifr.parse(exif, { gps: true, tiff: true, exif: false, interop: false, ifd1: false, translateValues: false }))) return true;
		} catch {
			// An EXIF block exifr cannot parse: it is dropped by the re-encode all the same.
		}
	}
	if (meta.xmp?.byteLength && /GPS(Latitude|Longitude)/.test(meta.xmp.toString('utf8'))) return true;
	return false;
}

export interface CleanedImage {
	format: PhotoFormat;
	hadLocation: boolean;
	original: { bytes: Uint8Array; contentType: string; extension: string; width: number; height: number };
	thumbnail: { bytes: Uint8Array; contentType: 'image/webp'; width: number; height: number };
}

const NOT_AN_IMAGE =
	'That file is not a photo we can read: it may be damaged, cut short, or not an image at all, whatever its name says. Export it as JPEG and upload it again.';

/**
 * Decides from the bytes what the file is, then re-encodes it without metadata: orientation is
 * applied to the pixels first (`rotate()`), GPS and every other EXIF/XMP/IPTC field are left out,
 * the colour profile is kept (the original) or converted to sRGB (the thumbnail). Throws
 * PhotoRejection for anything that is not a JPEG, PNG or WebP (or HEIC, where readable).
 */
export async function cleanImage(bytes: Uint8Array, { maxPixels = MAX_PHOTO_PIXELS }: { maxPixels?: number } = {}): Promise<CleanedImage> {
	if (looksLikeHeic(bytes) && !heicSupported()) throw new PhotoRejection(415, 'heic_unsupported', HEIC_REFUSED);
	const input = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	let meta: Metadata;
	try {
		meta = await sharp(input, { limitInputPixels: false }).metadata();
	} catch {
		throw new PhotoRejection(422, 'not_an_image', NOT_AN_IMAGE);
	}
	let format: PhotoFormat;
	if (meta.format === 'jpeg' || meta.format === 'png' || meta.format === 'webp') format = meta.format;
	else if (meta.format === 'heif' && meta.compression === 'hevc') {
		if (!heicSupported()) throw new PhotoRejection(415, 'heic_unsupported', HEIC_REFUSED);
		format = 'heic';
	} else {
		const name = meta.format === 'heif' ? 'AVIF' : String(meta.format ?? 'unknown').toUpperCase();
		throw new PhotoRejection(415, 'unsupported_type', `That file is in ${name} format. Photos can be JPEG, PNG or WebP${heicSupported() ? ' or HEIC' : ''}: export it as JPEG and upload it again.`);
	}
	if (!meta.width || !meta.height) throw new PhotoRejection(422, 'not_an_image', NOT_AN_IMAGE);
	if (meta.width * meta.height > maxPixels) {
		throw new PhotoRejection(413, 'too_many_pixels', `That photo is ${meta.width} × ${meta.height} pixels; the limit is ${Math.round(maxPixels / 1e5) / 10} megapixels. Export a smaller copy and try again.`);
	}
	const hadLocation = await hasLocation(bytes, meta);

	// A decoder error (not a mere warning) means the file is damaged; warnings are common in phone files.
	const pipeline = () => sharp(input, { limitInputPixels: maxPixels, failOn: 'error' }).rotate();
	try {
		const out = format === 'png' ? 'png' : format === 'webp' ? 'webp' : 'jpeg';
		const original = pipeline().keepIccProfile();
		const encoded = out === 'png' ? original.png({ compressionLevel: 8 }) : out === 'webp' ? original.webp({ quality: 90 }) : original.jpeg({ quality: 90 });
		const [o, t] = await Promise.all([
			encoded.toBuffer({ resolveWithObject: true }),
			pipeline().resize({ width: THUMBNAIL_WIDTH, withoutEnlargement: true }).webp({ quality: 75 }).toBuffer({ resolveWithObject: true })
		]);
		return {
			format,
			hadLocation,
			original: { bytes: new Uint8Array(o.data), contentType: `image/${out}`, extension: out === 'jpeg' ? 'jpg' : out, width: o.info.width, height: o.info.height },
			thumbnail: { bytes: new Uint8Array(t.data), contentType: 'image/webp', width: t.info.width, height: t.info.height }
		};
	} catch {
		throw new PhotoRejection(422, 'not_an_image', NOT_AN_IMAGE);
	}
}

/**
 * A photo coming back from a project backup, before it is written to storage: the original must be
 * a JPEG, PNG or WebP within the limits (its type is taken from the bytes, never from the file), and
 * a photo that carries a location is cleaned as on upload. Backups made here hold photos cleaned
 * already, so their bytes are kept exactly; a missing or unreadable thumbnail is made again.
 * Throws PhotoRejection otherwise.
 */
export async function restoredPhoto(original: Uint8Array, thumbnail: Uint8Array | null): Promise<Omit<CleanedImage, 'hadLocation' | 'format'>> {
	if (original.byteLength === 0) throw new PhotoRejection(422, 'not_an_image', NOT_AN_IMAGE);
	if (original.byteLength > MAX_PHOTO_BYTES) throw new PhotoRejection(413, 'too_large', `A photo in the backup is ${megabytes(original.byteLength)}; photos can be up to ${megabytes(MAX_PHOTO_BYTES)}.`);
	let meta: Metadata;
	try {
		meta = await sharp(Buffer.from(original), { limitInputPixels: MAX_PHOTO_PIXELS }).metadata();
	} catch {
		throw new PhotoRejection(422, 'not_an_image', NOT_AN_IMAGE);
	}
	if ((meta.format !== 'jpeg' && meta.format !== 'png' && meta.format !== 'webp') || !meta.width || !meta.height) {
		throw new PhotoRejection(415, 'unsupported_type', 'A photo in the backup is not a JPEG, PNG or WebP image.');
	}
	if (await hasLocation(original, meta)) {
		const cleaned = await cleanImage(original);
		return { original: cleaned.original, thumbnail: cleaned.thumbnail };
	}
	const out = meta.format;
	let thumb: CleanedImage['thumbnail'] | null = null;
	if (thumbnail?.byteLength) {
		const t = await sharp(Buffer.from(thumbnail)).metadata().catch(() => null);
		if (t?.format === 'webp' && t.width && t.height) thumb = { bytes: thumbnail, contentType: 'image/webp', width: t.width, height: t.height };
	}
	if (!thumb) {
		const t = await sharp(Buffer.from(original), { limitInputPixels: MAX_PHOTO_PIXELS }).rotate().resize({ width: THUMBNAIL_WIDTH, withoutEnlargement: true }).webp({ quality: 75 }).toBuffer({ resolveWithObject: true });
		thumb = { bytes: new Uint8Array(t.data), contentType: 'image/webp', width: t.info.width, height: t.info.height };
	}
	return {
		original: { bytes: original, contentType: `image/${out}`, extension: out === 'jpeg' ? 'jpg' : out, width: meta.width, height: meta.height },
		thumbnail: thumb
	};
}

// --- keys ---------------------------------------------------------------------------------------

export function incomingKey(projectId: number, photoId: number): string {
	return `incoming/${projectId}/${photoId}-${randomUUID()}`;
}

export function finalKeys(projectId: number, photoId: number, extension: string): { original: string; thumbnail: string } {
	const base = `projects/${projectId}/photos/${photoId}`;
	return { original: `${base}/original.${extension}`, thumbnail: `${base}/thumbnail.webp` };
}

/** The key prefixes under which a project's objects live (the trailing slash keeps project 1 off project 12). */
export function projectPrefixes(projectId: number): string[] {
	return [`projects/${projectId}/`, `incoming/${projectId}/`];
}

/**
 * Deletes every stored object of a project: the keys its photo rows named (`knownKeys`, read before
 * the rows went) and anything else under its prefixes (an upload that never finished, an object a
 * failed delete left behind). Returns how many objects were asked to go. Without storage set up
 * there is nothing to delete unless rows named keys, which is then an error.
 */
export async function removeProjectObjects(projectId: number, knownKeys: readonly string[] = []): Promise<number> {
	try {
		storage.bucket();
	} catch (e) {
		if (e instanceof StorageConfigError && knownKeys.length === 0) return 0;
		throw e;
	}
	const listed = (await Promise.all(projectPrefixes(projectId).map((prefix) => storage.list(prefix)))).flat();
	const keys = [...new Set([...knownKeys, ...listed])];
	await storage.remove(keys);
	return keys.length;
}

// --- API shapes -----------------------------------------------------------------------------------

const id = z.number().int().positive().max(4_294_967_295);

export const createPhotoSchema = z.object({
	filename: z.string().trim().min(1, 'Name the file.').max(255),
	type: z.string().max(100).default(''),
	size: z.number().int().nonnegative(),
	setupId: id.nullish(),
	lightId: id.nullish(),
	caption: z.string().trim().max(500, 'Keep the caption under 500 characters.').default('')
});
export type CreatePhotoInput = z.input<typeof createPhotoSchema>;

export const patchPhotoSchema = z.object({ caption: z.string().trim().max(500, 'Keep the caption under 500 characters.') });

export const listPhotosQuery = z.object({
	setup: z.coerce.number().int().positive().optional(),
	light: z.coerce.number().int().positive().optional(),
	status: z.enum(['pending', 'ready', 'rejected', 'any']).default('ready'),
	limit: z.coerce.number().int().min(1).max(200).default(100),
	offset: z.coerce.number().int().min(0).default(0)
});

/** A photo as the API sends it. The URLs are the app's own (permission-checked) addresses. */
export function toApiPhoto(p: Photo) {
	const base = `/api/v1/projects/${p.projectId}/photos/${p.id}`;
	const ready = p.status === 'ready';
	return {
		id: p.id,
		project_id: p.projectId,
		setup_id: p.setupId,
		light_id: p.lightId,
		caption: p.caption,
		status: p.status,
		reject_code: p.rejectCode,
		reject_reason: p.rejectReason,
		original_name: p.originalName,
		content_type: p.contentType,
		bytes: p.bytes,
		width: p.width,
		height: p.height,
		thumbnail_width: p.thumbnailWidth,
		thumbnail_height: p.thumbnailHeight,
		had_location: p.hadLocation,
		uploaded_by: p.uploadedBy === null ? null : { id: p.uploadedBy, name: p.uploadedByName ?? '' },
		created_at: p.createdAt,
		updated_at: p.updatedAt,
		completed_at: p.completedAt,
		thumbnail_url: ready ? `${base}/thumbnail` : null,
		original_url: ready ? `${base}/original` : null
	};
}
export type ApiPhoto = ReturnType<typeof toApiPhoto>;

// --- the flow ---------------------------------------------------------------------------------------

function asApiError(e: unknown): never {
	if (e instanceof PhotoRejection) throw new ApiError(e.status, e.code, e.message);
	if (e instanceof StorageConfigError) throw new ApiError(503, 'storage_unavailable', 'Photo storage is not set up on this server.');
	throw e;
}

async function checkSubject(projectId: number, setupId: number | null | undefined, lightId: number | null | undefined): Promise<{ setupId: number; lightId: number | null }> {
	if (lightId != null) {
		const lightSetup = await lights.setupOf(projectId, lightId);
		if (lightSetup === null) throw new ApiError(400, 'invalid', `Light ${lightId} is not in this project.`, [{ path: 'lightId', message: 'No such light in this project.' }]);
		if (setupId != null && setupId !== lightSetup) {
			throw new ApiError(400, 'invalid', `Light ${lightId} belongs to another setup.`, [{ path: 'lightId', message: 'That light is in another setup.' }]);
		}
		return { setupId: lightSetup, lightId };
	}
	if (setupId != null) {
		if (!(await setups.exists(projectId, setupId))) throw new ApiError(400, 'invalid', `Setup ${setupId} is not in this project.`, [{ path: 'setupId', message: 'No such setup in this project.' }]);
		return { setupId, lightId: null };
	}
	throw new ApiError(400, 'invalid', 'Choose the setup or the light this photo belongs to.', [{ path: 'setupId', message: 'Choose a setup or a light.' }]);
}

let lastSweep = 0;

/** Removes abandoned pending photos and their incoming objects. Returns how many went. */
export async function sweepStalePhotos(now = Date.now()): Promise<number> {
	const stale = await photos.stalePending(new Date(now - STALE_PENDING_MS));
	for (const p of stale) {
		await storage.remove([p.incomingKey]);
		await photos.destroy(p.projectId, p.id);
	}
	return stale.length;
}

function sweepNowAndThen(): void {
	const now = Date.now();
	if (now - lastSweep < 10 * 60 * 1000) return;
	lastSweep = now;
	void sweepStalePhotos(now).catch((e) => console.warn('[photos] sweeping abandoned uploads failed:', e));
}

export interface UploadGrant {
	photo: ApiPhoto;
	upload: { method: 'PUT'; url: string; headers: Record<string, string>; expires_at: string };
	complete_url: string;
}

/** Step 1: a pending photo and a presigned PUT. Needs `photo.edit` (checked by the caller's access). */
export async function requestUpload(access: ProjectAccess, input: z.output<typeof createPhotoSchema>): Promise<UploadGrant> {
	let declared: ReturnType<typeof checkDeclaredFile>;
	try {
		declared = checkDeclaredFile({ filename: input.filename, type: input.type, size: input.size });
	} catch (e) {
		asApiError(e);
	}
	const subject = await checkSubject(access.project.id, input.setupId, input.lightId);
	try {
		storage.bucket();
	} catch (e) {
		asApiError(e);
	}
	const photo = await photos.create(
		{
			projectId: access.project.id,
			setupId: subject.setupId,
			lightId: subject.lightId,
			caption: input.caption,
			originalName: input.filename,
			declaredType: declared.contentType,
			declaredBytes: input.size,
			uploadedBy: access.user.id
		},
		(photoId) => incomingKey(access.project.id, photoId)
	);
	const url = await storage.presignPut(photo.incomingKey, { contentType: declared.contentType, contentLength: input.size, expiresIn: PUT_URL_SECONDS });
	sweepNowAndThen();
	return {
		photo: toApiPhoto(photo),
		upload: { method: 'PUT', url, headers: { 'content-type': declared.contentType }, expires_at: new Date(Date.now() + PUT_URL_SECONDS * 1000).toISOString() },
		complete_url: `/api/v1/projects/${access.project.id}/photos/${photo.id}/complete`
	};
}

async function mustRead(projectId: number, photoId: number): Promise<Photo> {
	const photo = await photos.read(projectId, photoId);
	if (!photo) throw new ApiError(404, 'not_found', 'There is no such photo in this project.');
	return photo;
}

/** “photo “wide.jpg” of light “Key” in setup “Wide”” (or of the setup alone), for the activity log. */
async function photoSubject(photo: Photo): Promise<string> {
	const name = `photo “${photo.originalName || `#${photo.id}`}”`;
	const setup = photo.setupId === null ? null : await setups.read(photo.projectId, photo.setupId);
	const light = photo.lightId === null ? null : await lights.read(photo.projectId, photo.lightId, { includeDeleted: true });
	if (light) return `${name} of light “${light.label}”${setup ? ` in setup “${setup.name}”` : ''}`;
	return setup ? `${name} of setup “${setup.name}”` : name;
}

/** Writes who added or deleted a photo, and of which setup and light, to the project's activity. */
async function logPhoto(access: ProjectAccess, photo: Photo, action: 'photo.add' | 'photo.delete'): Promise<void> {
	const what = await photoSubject(photo);
	await activity.create(access.project.id, {
		userId: access.user.id,
		action,
		subjectType: 'photo',
		subjectId: photo.id,
		summary: `${action === 'photo.add' ? 'Added' : 'Deleted'} ${what}${action === 'photo.add' && photo.caption ? `: ${photo.caption}` : ''}`,
		details: { setupId: photo.setupId, lightId: photo.lightId, caption: photo.caption, originalName: photo.originalName }
	});
}

async function reject(photo: Photo, r: PhotoRejection, hadLocation: boolean | null = null): Promise<never> {
	await photos.markRejected(photo.projectId, photo.id, { code: r.code, reason: r.message, hadLocation });
	await storage.remove([photo.incomingKey]);
	throw new ApiError(r.status, r.code, r.message);
}

/**
 * Step 3: checks and cleans what arrived, writes the final objects, marks the photo ready (or
 * rejected). Calling it again on a ready photo returns it; on a rejected one repeats the reason.
 */
export async function completeUpload(access: ProjectAccess, photoId: number): Promise<Photo> {
	const photo = await mustRead(access.project.id, photoId);
	if (photo.status === 'ready') return photo;
	if (photo.status === 'rejected') throw new ApiError(photo.rejectCode === 'too_large' ? 413 : 422, photo.rejectCode ?? 'rejected', photo.rejectReason ?? 'This photo was refused.');
	try {
		const info = await storage.head(photo.incomingKey);
		if (!info) throw new ApiError(409, 'not_uploaded', 'The photo has not reached storage yet. Send the file first, then finish the upload.');
		if (info.size > MAX_PHOTO_BYTES) {
			return await reject(photo, new PhotoRejection(413, 'too_large', `The file that arrived is ${megabytes(info.size)}; photos can be up to ${megabytes(MAX_PHOTO_BYTES)}. Export a smaller JPEG and try again.`));
		}
		const bytes = await storage.read(photo.incomingKey, MAX_PHOTO_BYTES);
		if (!bytes) throw new ApiError(409, 'not_uploaded', 'The photo has not reached storage yet. Send the file first, then finish the upload.');
		let cleaned: CleanedImage;
		try {
			cleaned = await cleanImage(bytes);
		} catch (e) {
			if (e instanceof PhotoRejection) return await reject(photo, e);
			throw e;
		}
		const keys = finalKeys(photo.projectId, photo.id, cleaned.original.extension);
		await storage.write(keys.original, cleaned.original.bytes, { contentType: cleaned.original.contentType });
		await storage.write(keys.thumbnail, cleaned.thumbnail.bytes, { contentType: cleaned.thumbnail.contentType });
		const marked = await photos.markReady(photo.projectId, photo.id, {
			originalKey: keys.original,
			thumbnailKey: keys.thumbnail,
			contentType: cleaned.original.contentType,
			bytes: cleaned.original.bytes.byteLength,
			width: cleaned.original.width,
			height: cleaned.original.height,
			thumbnailWidth: cleaned.thumbnail.width,
			thumbnailHeight: cleaned.thumbnail.height,
			hadLocation: cleaned.hadLocation
		});
		await storage.remove([photo.incomingKey]);
		// Only the call that made it ready logs it (two finishing at once log one upload).
		if (marked) await logPhoto(access, photo, 'photo.add');
		return mustRead(photo.projectId, photo.id);
	} catch (e) {
		return asApiError(e);
	}
}

function safeFilename(name: string, extension: string): string {
	const stem = name.replace(/\.[^.]*$/, '').replace(/[^\w\- ]+/g, '_').trim().slice(0, 80) || 'photo';
	return `${stem}.${extension}`;
}

/** A presigned GET for the photo's original or thumbnail, for `GET_URL_SECONDS`. 404 unless ready. */
export async function photoObjectUrl(access: ProjectAccess, photoId: number, which: 'original' | 'thumbnail'): Promise<string> {
	const photo = await mustRead(access.project.id, photoId);
	const key = which === 'original' ? photo.originalKey : photo.thumbnailKey;
	if (photo.status !== 'ready' || !key) throw new ApiError(404, 'not_ready', 'This photo is not ready to view.');
	try {
		const type = which === 'original' ? (photo.contentType ?? 'application/octet-stream') : 'image/webp';
		const extension = type.split('/')[1] === 'jpeg' ? 'jpg' : (type.split('/')[1] ?? 'bin');
		return await storage.presignGet(key, {
			expiresIn: GET_URL_SECONDS,
			contentType: type,
			disposition: `inline; filename="${safeFilename(photo.originalName, extension)}"`,
			cacheControl: 'private, max-age=3600'
		});
	} catch (e) {
		return asApiError(e);
	}
}

export async function listPhotos(access: ProjectAccess, q: z.output<typeof listPhotosQuery>) {
	const { items, total } = await photos.list(access.project.id, { setupId: q.setup, lightId: q.light, status: q.status as PhotoStatus | 'any', limit: q.limit, offset: q.offset });
	return { items: items.map(toApiPhoto), total };
}

export async function readPhoto(access: ProjectAccess, photoId: number): Promise<Photo> {
	return mustRead(access.project.id, photoId);
}

export async function setCaption(access: ProjectAccess, photoId: number, caption: string): Promise<Photo> {
	await mustRead(access.project.id, photoId);
	await photos.updateCaption(access.project.id, photoId, caption);
	return mustRead(access.project.id, photoId);
}

/**
 * Deletes the row and its objects. Deleting a photo that was ready is logged; an upload that never
 * finished (pending or refused) was never in the log, so its removal is not either.
 */
export async function deletePhoto(access: ProjectAccess, photoId: number): Promise<void> {
	const photo = await mustRead(access.project.id, photoId);
	const removed = await photos.destroy(photo.projectId, photo.id);
	if (removed && photo.status === 'ready') await logPhoto(access, photo, 'photo.delete');
	try {
		await storage.remove([photo.incomingKey, photo.originalKey, photo.thumbnailKey]);
	} catch (e) {
		// The row is gone, so nobody can reach the objects any more; say so in the log and carry on.
		console.warn(`[photos] objects of deleted photo ${photo.id} were not removed:`, e);
	}
}
