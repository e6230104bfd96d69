/** Route handles and small steps shared by the photo suites. */
import type { SessionUser } from '../../../src/lib/server/auth/types';
import * as list from '../../../src/routes/api/v1/projects/[projectId]/photos/+server';
import * as one from '../../../src/routes/api/v1/projects/[projectId]/photos/[photoId]/+server';
import * as complete from '../../../src/routes/api/v1/projects/[projectId]/photos/[photoId]/complete/+server';
import * as original from '../../../src/routes/api/v1/projects/[projectId]/photos/[photoId]/original/+server';
import * as thumbnail from '../../../src/routes/api/v1/projects/[projectId]/photos/[photoId]/thumbnail/+server';
import { call } from '../helpers/route';

export const routes = { list, one, complete, original, thumbnail };

export const base = (projectId: number) => `/api/v1/projects/${projectId}/photos`;

export interface Grant {
	photo: { id: number; status: string; setup_id: number | null; light_id: number | null };
	upload: { method: string; url: string; headers: Record<string, string>; expires_at: string };
	complete_url: string;
}

export async function askUpload(projectId: number, user: SessionUser | null, body: Record<string, unknown>) {
	return call(list.POST, base(projectId), { params: { projectId: String(projectId) }, user, json: body });
}

export async function put(grant: Grant, bytes: Uint8Array) {
	return fetch(grant.upload.url, { method: 'PUT', headers: grant.upload.headers, body: new Uint8Array(bytes) });
}

export async function finish(projectId: number, user: SessionUser | null, photoId: number) {
	return call(complete.POST, `${base(projectId)}/${photoId}/complete`, { params: { projectId: String(projectId), photoId: String(photoId) }, user, method: 'POST' });
}

/** The whole flow for one photo; returns the completed photo's JSON. */
export async function uploadPhoto(projectId: number, user: SessionUser, bytes: Uint8Array, body: Record<string, unknown>) {
	const res = await askUpload(projectId, user, { filename: 'set.jpg', type: 'image/jpeg', size: bytes.byteLength, ...body });
	if (res.status !== 201) throw new Error(`upload refused: ${res.status} ${await res.text()}`);
	const grant = (await res.json()) as Grant;
	const sent = await put(grant, bytes);
	if (!sent.ok) throw new Error(`PUT failed: ${sent.status}`);
	const done = await finish(projectId, user, grant.photo.id);
	if (done.status !== 200) throw new Error(`complete failed: ${done.status} ${await done.text()}`);
	return done.json();
}
