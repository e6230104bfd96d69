/**
 * Password hashing with argon2id (@node-rs/argon2). Parameters: 19 MiB memory, 2 passes, 1 lane,
 * the minimum the OWASP Password Storage Cheat Sheet recommends for argon2id (common practice).
 */
import { hash, verify } from '@node-rs/argon2';

const OPTIONS = { memoryCost: 19_456, timeCost: 2, parallelism: 1 } as const;

/** Shortest and longest password we accept (length, not composition rules, decides strength). */
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 200;

export function hashPassword(password: string): Promise<string> {
	return hash(password, OPTIONS);
}

let dummy: Promise<string> | undefined;

/**
 * True when `password` matches the stored hash. With no hash (unknown address, or a link-only
 * account) it still spends the time of one verification, so timing does not tell the cases apart.
 */
export async function verifyPassword(storedHash: string | null | undefined, password: string): Promise<boolean> {
	if (!storedHash) {
		dummy ??= hashPassword('no account has this password, it only costs time');
		await verify(await dummy, password).catch(() => false);
		return false;
	}
	try {
		return await verify(storedHash, password);
	} catch {
		return false;
	}
}
