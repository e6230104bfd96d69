import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '$lib/server/db';
import * as rateLimits from '$lib/server/db/rate-limits';
import { closeMail } from '$lib/server/mail';
import { countAttempt, forgetAttempts, LIMITS } from '$lib/server/auth/policy';
import { checkPassword, requestPasswordReset, signUp } from '$lib/server/services/auth';
import { makeUser, TEST_PASSWORD, uniqueEmail, uniqueIp } from './helpers/factories';

beforeAll(async () => {
	await db.migrate.latest();
});
afterAll(async () => {
	closeMail();
	await closeDb();
});

const ORIGIN = 'http://127.0.0.1:3999';

describe('rate_limits table', () => {
	it('counts hits per bucket, atomically under concurrency, in a window that opens at the first hit', async () => {
		const bucket = rateLimits.bucketOf('test', uniqueEmail());
		const now = new Date('2026-12-01T10:07:30Z');
		const counts = await Promise.all(Array.from({ length: 12 }, () => rateLimits.hit(bucket, 600, now)));
		expect(counts.map((c) => c.hits).sort((a, b) => a - b)).toEqual(Array.from({ length: 12 }, (_, i) => i + 1));
		for (const c of counts) expect(c.resetsAt.toISOString()).toBe('2026-12-01T10:17:30.000Z');
		expect((await rateLimits.read(bucket, now)).hits).toBe(12);
		// A clock boundary (10:10) opens no new window: the count goes on.
		const later = await rateLimits.hit(bucket, 600, new Date('2026-12-01T10:10:00Z'));
		expect(later).toEqual({ hits: 13, resetsAt: new Date('2026-12-01T10:17:30Z') });
		// Once the window has ended, the next hit opens a new one from zero.
		const next = await rateLimits.hit(bucket, 600, new Date('2026-12-01T10:17:30Z'));
		expect(next).toEqual({ hits: 1, resetsAt: new Date('2026-12-01T10:27:30Z') });
		expect((await rateLimits.read(bucket, new Date('2026-12-01T10:30:00Z'))).hits).toBe(0);
		expect(await db('rate_limits').where({ bucket })).toHaveLength(1);
	});

	it('stores a hash of the bucket, never the address', async () => {
		const email = uniqueEmail('private');
		await rateLimits.hit(rateLimits.bucketOf('sign-in:address', email), 60);
		const [rows] = await db.raw('SELECT bucket FROM rate_limits WHERE bucket = ?', [rateLimits.bucketOf('sign-in:address', email)]);
		expect(rows[0].bucket).toMatch(/^[0-9a-f]{64}$/);
		const [leak] = await db.raw('SELECT COUNT(*) AS n FROM rate_limits WHERE bucket LIKE ?', [`%${email}%`]);
		expect(Number(leak[0].n)).toBe(0);
	});

	it('destroyExpired removes ended windows only', async () => {
		const bucket = rateLimits.bucketOf('test', uniqueEmail('expiry'));
		await rateLimits.hit(bucket, 60, new Date(Date.now() - 3600_000));
		await rateLimits.hit(bucket, 60);
		await rateLimits.destroyExpired();
		const left = await db('rate_limits').where({ bucket });
		expect(left).toHaveLength(1);
	});
});

describe('countAttempt', () => {
	it('allows the limit per address, then refuses with the time until the window ends', async () => {
		const who = { address: uniqueEmail(), ip: uniqueIp() };
		const { max, windowSeconds } = LIMITS['sign-in'].address;
		const first = new Date('2026-12-01T10:14:55Z');
		const now = new Date('2026-12-01T10:15:05Z');
		expect((await countAttempt('sign-in', who, first)).allowed).toBe(true);
		for (let i = 1; i < max; i++) expect((await countAttempt('sign-in', who, now)).allowed).toBe(true);
		// The window runs from the first attempt, across the quarter hour: the wait is the rest of it.
		const refused = await countAttempt('sign-in', who, now);
		expect(refused).toEqual({ allowed: false, retryAfterSeconds: windowSeconds - 10 });
		// Another address from the same IP is still fine.
		expect((await countAttempt('sign-in', { ...who, address: uniqueEmail() }, now)).allowed).toBe(true);
		// Forgetting the address's attempts lets it in again.
		await forgetAttempts('sign-in', who.address);
		expect((await countAttempt('sign-in', who, now)).allowed).toBe(true);
	});

	it('refuses an IP over its limit whatever the address', async () => {
		const ip = uniqueIp();
		const { max } = LIMITS['magic-link'].ip;
		const now = new Date();
		for (let i = 0; i < max; i++) expect((await countAttempt('magic-link', { address: uniqueEmail(), ip }, now)).allowed).toBe(true);
		expect((await countAttempt('magic-link', { address: uniqueEmail(), ip }, now)).allowed).toBe(false);
	});

	it('keeps the steps apart', async () => {
		const who = { address: uniqueEmail(), ip: uniqueIp() };
		for (let i = 0; i < LIMITS.reset.address.max + 1; i++) await countAttempt('reset', who);
		expect((await countAttempt('reset', who)).allowed).toBe(false);
		expect((await countAttempt('sign-in', who)).allowed).toBe(true);
	});
});

describe('rate limits on the account steps', () => {
	it('password sign-in: after the limit even the right password is refused, for a real or an unknown address alike', async () => {
		const user = await makeUser();
		const ghost = uniqueEmail('ghost');
		const ip = uniqueIp();
		for (let i = 0; i < LIMITS['sign-in'].address.max; i++) {
			expect(await checkPassword(user.email, 'wrong wrong wrong', { origin: ORIGIN, ip })).toEqual({ ok: false, reason: 'invalid' });
			expect(await checkPassword(ghost, 'wrong wrong wrong', { origin: ORIGIN, ip })).toEqual({ ok: false, reason: 'invalid' });
		}
		const real = await checkPassword(user.email, TEST_PASSWORD, { origin: ORIGIN, ip });
		const fake = await checkPassword(ghost, TEST_PASSWORD, { origin: ORIGIN, ip });
		expect(real).toMatchObject({ ok: false, reason: 'limited' });
		expect(fake).toMatchObject({ ok: false, reason: 'limited' });
	});

	it('a successful sign-in clears the address count', async () => {
		const user = await makeUser();
		const ip = uniqueIp();
		for (let i = 0; i < LIMITS['sign-in'].address.max - 1; i++) await checkPassword(user.email, 'typo typo typo', { origin: ORIGIN, ip });
		expect((await checkPassword(user.email, TEST_PASSWORD, { origin: ORIGIN, ip })).ok).toBe(true);
		for (let i = 0; i < LIMITS['sign-in'].address.max - 1; i++) await checkPassword(user.email, 'typo typo typo', { origin: ORIGIN, ip });
		expect((await checkPassword(user.email, TEST_PASSWORD, { origin: ORIGIN, ip })).ok).toBe(true);
	});

	it('reset requests and sign-ups are limited per address', async () => {
		const email = uniqueEmail('flood');
		for (let i = 0; i < LIMITS.reset.address.max; i++) expect(await requestPasswordReset(email, { origin: ORIGIN, ip: uniqueIp() })).toEqual({ ok: true });
		expect(await requestPasswordReset(email, { origin: ORIGIN, ip: uniqueIp() })).toMatchObject({ ok: false, reason: 'limited' });

		const other = uniqueEmail('signups');
		for (let i = 0; i < LIMITS['sign-up'].address.max; i++) {
			expect(await signUp({ name: 'Flood', email: other, password: TEST_PASSWORD }, { origin: ORIGIN, ip: uniqueIp() })).toEqual({ ok: true });
		}
		expect(await signUp({ name: 'Flood', email: other, password: TEST_PASSWORD }, { origin: ORIGIN, ip: uniqueIp() })).toMatchObject({
			ok: false,
			reason: 'limited'
		});
	});

	it('the counters live in the database, so they survive a new connection pool (a restart)', async () => {
		const who = { address: uniqueEmail('restart'), ip: uniqueIp() };
		for (let i = 0; i < LIMITS['sign-in'].address.max; i++) await countAttempt('sign-in', who);
		await closeDb();
		expect((await countAttempt('sign-in', who)).allowed).toBe(false);
	});
});

describe('housekeeping', () => {
	it('sweepExpired removes ended windows, stale tokens and expired sessions, and keeps live ones', async () => {
		const { sweepExpired } = await import('$lib/server/auth/policy');
		const { createKnexAdapter } = await import('$lib/server/auth/knex-adapter');
		const user = await makeUser();
		const adapter = createKnexAdapter(db);
		const past = new Date(Date.now() - 2 * 86_400_000);
		const future = new Date(Date.now() + 3600_000);
		await adapter.createSession({ sessionToken: `sweep-old-${user.id}`, userId: String(user.id), expires: past });
		await adapter.createSession({ sessionToken: `sweep-new-${user.id}`, userId: String(user.id), expires: future });
		await adapter.createVerificationToken({ identifier: user.email, token: `sweep-old-${user.id}`, expires: past });
		await adapter.createVerificationToken({ identifier: user.email, token: `sweep-new-${user.id}`, expires: future });
		const oldBucket = rateLimits.bucketOf('sweep', uniqueEmail());
		await rateLimits.hit(oldBucket, 60, past);
		await sweepExpired();
		expect(await adapter.getSessionAndUser(`sweep-old-${user.id}`)).toBeNull();
		expect(await adapter.getSessionAndUser(`sweep-new-${user.id}`)).not.toBeNull();
		expect(await db('verification_tokens').where({ identifier: user.email }).pluck('token')).toEqual([`sweep-new-${user.id}`]);
		expect(await db('rate_limits').where({ bucket: oldBucket })).toHaveLength(0);
	});
});
