/** The browser side of keeping the set tools' state between visits (see $lib/settools/storage). */

/** The saved text under `key`, or null when there is none or storage is off. */
export function readSaved(key: string): string | null {
	try {
		return localStorage.getItem(key);
	} catch {
		return null;
	}
}

/** Saves `text` under `key`; private mode or a full quota only means the page forgets. */
export function writeSaved(key: string, text: string): void {
	try {
		localStorage.setItem(key, text);
	} catch {
		// The page still works, it just forgets.
	}
}
