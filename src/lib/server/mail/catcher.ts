/**
 * Reads what the local mail catcher (scripts/mail-catcher.ts) stored: `<time>-<id>.eml` with a
 * `<time>-<id>.json` envelope beside it. Used by `/dev/mail` and by the tests. Relative imports only.
 */
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { parseMail, type ParsedMail } from './mime';

export interface CapturedEnvelope {
	id: string;
	receivedAt: string;
	from: string | null;
	to: string[];
}

export interface CapturedMail extends CapturedEnvelope {
	mail: ParsedMail;
}

const ID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

async function files(dir: string): Promise<string[]> {
	try {
		return (await readdir(dir)).filter((f) => f.endsWith('.json'));
	} catch {
		return [];
	}
}

/** Every captured message, newest first. */
export async function listCaptured(dir: string): Promise<CapturedMail[]> {
	const out: CapturedMail[] = [];
	for (const f of await files(dir)) {
		try {
			const envelope = JSON.parse(await readFile(join(dir, f), 'utf8')) as CapturedEnvelope;
			const raw = await readFile(join(dir, f.replace(/\.json$/, '.eml')));
			out.push({ ...envelope, mail: parseMail(raw) });
		} catch {
			// Half-written by the catcher right now: it shows up on the next look.
		}
	}
	return out.sort((a, b) => b.receivedAt.localeCompare(a.receivedAt) || b.id.localeCompare(a.id));
}

/** One message by the id in its envelope, or null (also for anything that is not an id). */
export async function readCaptured(dir: string, id: string): Promise<CapturedMail | null> {
	if (!ID.test(id)) return null;
	const f = (await files(dir)).find((name) => name.endsWith(`-${id}.json`));
	if (!f) return null;
	const envelope = JSON.parse(await readFile(join(dir, f), 'utf8')) as CapturedEnvelope;
	const raw = await readFile(join(dir, f.replace(/\.json$/, '.eml')));
	return { ...envelope, mail: parseMail(raw) };
}
