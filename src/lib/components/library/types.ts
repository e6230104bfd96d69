/** The shape library form actions send back (see `libraryAction` in the library service). */
export interface LibraryFormResult {
	action?: string;
	ok?: boolean;
	message?: string;
	code?: string;
	issues?: Record<string, string[]>;
	values?: Record<string, string>;
	details?: unknown;
	[key: string]: unknown;
}

/** The result when it belongs to this action, else null. */
export function resultFor(form: unknown, action: string): LibraryFormResult | null {
	const f = form as LibraryFormResult | null | undefined;
	return f && f.action === action ? f : null;
}

export const inputClass =
	'min-h-touch w-full rounded-panel border border-surface-line bg-surface-sunken px-4 text-base text-ink placeholder:text-ink-faint focus:border-cue focus:outline-none aria-[invalid=true]:border-verdict-bad';
