/** Browser helpers for the upload page: the preview worker and a multipart POST with progress. */
import type { PreviewResult } from '../../import';

export function previewInWorker(file: File): Promise<{ ok: true; preview: PreviewResult } | { ok: false; message: string }> {
	return new Promise((resolve) => {
		const worker = new Worker(new URL('./preview.worker.ts', import.meta.url), { type: 'module' });
		worker.onmessage = (e) => {
			resolve(e.data);
			worker.terminate();
		};
		worker.onerror = () => {
			resolve({ ok: false, message: 'The preview could not run in this browser.' });
			worker.terminate();
		};
		worker.postMessage({ file });
	});
}

/** POSTs a form with upload progress (0–1) reported as it goes; resolves with status and JSON body. */
export function postWithProgress(url: string, form: FormData, onProgress: (fraction: number) => void): Promise<{ status: number; body: any }> {
	return new Promise((resolve, reject) => {
		const xhr = new XMLHttpRequest();
		xhr.open('POST', url);
		xhr.responseType = 'json';
		xhr.upload.onprogress = (e) => {
			if (e.lengthComputable) onProgress(e.loaded / e.total);
		};
		xhr.onload = () => resolve({ status: xhr.status, body: xhr.response });
		xhr.onerror = () => reject(new Error('The upload did not reach the server. Check the connection and try again.'));
		xhr.send(form);
	});
}
