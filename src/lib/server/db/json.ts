/** MariaDB keeps JSON columns as LONGTEXT: mysql2 hands them back as strings. */
export function parseJson<T>(value: unknown): T | null {
	if (value === null || value === undefined) return null;
	if (typeof value === 'string') return JSON.parse(value) as T;
	if (Buffer.isBuffer(value)) return JSON.parse(value.toString('utf8')) as T;
	return value as T;
}

export function toJson(value: unknown): string | null {
	return value === null || value === undefined ? null : JSON.stringify(value);
}

/** A DATETIME for MariaDB (UTC, millisecond precision) from a Date or ISO string. */
export function toDateTime(value: Date | string | null | undefined): Date | null {
	if (value === null || value === undefined || value === '') return null;
	const d = value instanceof Date ? value : new Date(value);
	return Number.isNaN(d.getTime()) ? null : d;
}
