/** Small builders for test data: unique addresses, users with or without a password. */
import { randomBytes } from 'node:crypto';
import { hashPassword } from '../../../../src/lib/server/auth/password';
import * as users from '../../../../src/lib/server/db/users';
import type { User } from '../../../../src/lib/server/db/users';

export function uniqueEmail(prefix = 'person'): string {
	return `${prefix}-${randomBytes(5).toString('hex')}@example.test`;
}

/** A documentation-range address (RFC 5737), unique per call, so IP limits of one test touch no other. */
export function uniqueIp(): string {
	const b = randomBytes(2);
	return `203.0.${b[0]}.${b[1]}`;
}

export const TEST_PASSWORD = 'correct horse battery';

export async function makeUser(opts: { email?: string; name?: string; verified?: boolean; password?: string | null; isAdmin?: boolean } = {}): Promise<User> {
	const password = opts.password === undefined ? TEST_PASSWORD : opts.password;
	return users.create({
		email: opts.email ?? uniqueEmail(),
		name: opts.name ?? 'Test Person',
		emailVerified: opts.verified === false ? null : new Date(),
		passwordHash: password ? await hashPassword(password) : null,
		isAdmin: opts.isAdmin ?? false
	});
}
