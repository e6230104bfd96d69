/// <reference lib="webworker" />
// Reads the chosen file off the main thread (papaparse splits the rows inside the importer), so a
// 20 MB spectrometer export doesn't freeze the page while the preview is built.
import { isImportError, previewReadings } from '../../import';

self.onmessage = async (e: MessageEvent<{ file: File }>) => {
	try {
		const bytes = new Uint8Array(await e.data.file.arrayBuffer());
		self.postMessage({ ok: true, preview: previewReadings(bytes, { rows: 8 }) });
	} catch (err) {
		self.postMessage({ ok: false, message: isImportError(err) ? err.message : 'The file could not be read.' });
	}
};
