import { db } from '$lib/server/db';

export interface DatabaseHealth {
	ok: boolean;
	/** Server version string, when the database answered. */
	version?: string;
	/** Round trip of `SELECT VERSION()` in milliseconds. */
	ms?: number;
	error?: string;
}

/** Runs a real query, so "ok" means the database answered, not just that a pool exists. */
export async function checkDatabase(): Promise<DatabaseHealth> {
	const started = performance.now();
	try {
		const [rows] = (await db.raw('SELECT VERSION() AS version')) as [{ version: string }[]];
		return { ok: true, version: rows[0]?.version, ms: Math.round((performance.now() - started) * 10) / 10 };
	} catch (e) {
		return { ok: false, error: e instanceof Error ? e.message : String(e) };
	}
}
