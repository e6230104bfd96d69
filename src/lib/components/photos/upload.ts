/**
 * The browser's half of a photo upload: ask the app for an upload, PUT the file straight to object
 * storage with progress (XMLHttpRequest, because fetch reports no upload progress), then ask the app
 * to check and finish it. No server code here; the types are the API's.
 */
import type { ApiPhoto, UploadGrant, UploadRules } from '$lib/server/services/photos';

export type UploadPhase = 'asking' | 'sending' | 'checking';

export class UploadError extends Error {
	constructor(
		message: string,
		readonly code: string
	) {
		super(message);
	}
}

export interface UploadTarget {
	projectId: number;
	setupId?: number | null;
	lightId?: number | null;
	caption?: string;
}

export interface UploadCallbacks {
	onphase?: (phase: UploadPhase) => void;
	/** 0…1 of the bytes sent to storage. */
	onprogress?: (fraction: number) => void;
	signal?: AbortSignal;
}

const mb = (bytes: number) => `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;

/** The checks the server will make anyway, made first so a phone on a slow link does not wait for a refusal. */
export function precheck(file: File, rules: UploadRules | undefined): string | null {
	if (!rules) return null;
	const name = file.name || 'That file';
	const heicByName = /\.(heic|heif)$/i.test(file.name);
	const type = file.type.toLowerCase();
	if (!rules.heic && (type === 'image/heic' || type === 'image/heif' || (heicByName && (type === '' || type === 'application/octet-stream')))) return rules.heicMessage;
	if (type && type !== 'application/octet-stream' && !rules.types.includes(type) && !(type === 'image/jpg' || type === 'image/pjpeg')) {
		return `“${name}” is a file of type ${type}. Photos can be JPEG, PNG or WebP${rules.heic ? ' or HEIC' : ''}.`;
	}
	if (file.size === 0) return `“${name}” is empty. Pick the photo again.`;
	if (file.size > rules.maxBytes) return `“${name}” is ${mb(file.size)}; photos can be up to ${mb(rules.maxBytes)}. Export a smaller JPEG and try again.`;
	return null;
}

async function apiError(res: Response, fallback: string): Promise<UploadError> {
	try {
		const body = (await res.json()) as { error?: { message?: string; code?: string } };
		return new UploadError(body.error?.message ?? fallback, body.error?.code ?? `http_${res.status}`);
	} catch {
		return new UploadError(fallback, `http_${res.status}`);
	}
}

/** PUTs the file to the presigned URL, reporting progress; rejects with UploadError. */
export function putWithProgress(grant: UploadGrant['upload'], file: Blob, onprogress?: (f: number) => void, signal?: AbortSignal): Promise<void> {
	return new Promise((resolve, reject) => {
		const xhr = new XMLHttpRequest();
		xhr.open(grant.method, grant.url);
		for (const [k, v] of Object.entries(grant.headers)) xhr.setRequestHeader(k, v);
		xhr.upload.onprogress = (e) => {
			if (e.lengthComputable && e.total > 0) onprogress?.(e.loaded / e.total);
		};
		xhr.onload = () => {
			if (xhr.status >= 200 && xhr.status < 300) {
				onprogress?.(1);
				resolve();
			} else reject(new UploadError(`Storage refused the photo (status ${xhr.status}). Try again; if it keeps failing, the upload link may have run out: pick the photo again.`, 'storage_refused'));
		};
		xhr.onerror = () => reject(new UploadError('The photo could not reach storage. Check the connection and try again.', 'network'));
		xhr.ontimeout = () => reject(new UploadError('Sending the photo took too long. Try again on a better connection.', 'timeout'));
		xhr.onabort = () => reject(new UploadError('Upload cancelled.', 'aborted'));
		signal?.addEventListener('abort', () => xhr.abort(), { once: true });
		xhr.send(file);
	});
}

/** The whole flow. Resolves with the ready photo; rejects with UploadError carrying the server's sentence. */
export async function uploadPhoto(file: File, target: UploadTarget, cb: UploadCallbacks = {}): Promise<ApiPhoto> {
	const base = `/api/v1/projects/${target.projectId}/photos`;
	cb.onphase?.('asking');
	let res: Response;
	try {
		res = await fetch(base, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify({ filename: file.name || 'photo', type: file.type, size: file.size, setupId: target.setupId ?? null, lightId: target.lightId ?? null, caption: target.caption ?? '' }),
			signal: cb.signal
		});
	} catch {
		throw new UploadError('Chromaslate could not be reached. Check the connection and try again.', 'network');
	}
	if (!res.ok) throw await apiError(res, 'The upload was refused.');
	const grant = (await res.json()) as UploadGrant;

	cb.onphase?.('sending');
	try {
		await putWithProgress(grant.upload, file, cb.onprogress, cb.signal);
	} catch (e) {
		// Nothing usable arrived: let go of the pending photo rather than leave it waiting.
		void fetch(`${base}/${grant.photo.id}`, { method: 'DELETE' }).catch(() => undefined);
		throw e;
	}

	cb.onphase?.('checking');
	let done: Response;
	try {
		done = await fetch(grant.complete_url, { method: 'POST', signal: cb.signal });
	} catch {
		throw new UploadError('The photo arrived, but Chromaslate could not be reached to finish it. Try again.', 'network');
	}
	if (!done.ok) throw await apiError(done, 'The photo could not be finished.');
	return (await done.json()) as ApiPhoto;
}
