/**
 * The one error a readings import throws: the file as a whole cannot be used.
 * Problems with single rows are never thrown; they are reported as `RowError`s.
 */

export type ImportErrorCode =
	| 'empty'
	| 'binary'
	| 'too_large'
	| 'too_many_rows'
	| 'too_many_columns'
	| 'unrecognised';

/** A file-level refusal with a one-sentence `message` meant for the person who uploaded it. */
export class ImportError extends Error {
	readonly code: ImportErrorCode;

	constructor(code: ImportErrorCode, message: string) {
		super(message);
		this.name = 'ImportError';
		this.code = code;
	}
}

export function isImportError(e: unknown): e is ImportError {
	return e instanceof ImportError;
}
