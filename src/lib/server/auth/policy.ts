/**
 * How long links and sessions last, and how often each sign-in step may be tried. One place, so the
 * numbers shown in mail and messages are the numbers enforced.
 */
import { db } from '../db';
import * as rateLimits from '../db/rate-limits';
import * as tokens from '../db/tokens';

/** Lifetimes in seconds. */
export const LIFETIMES = {
	confirmEmail: 24 * 3600,
	resetPassword: 3600,
	magicLink: 30 * 60,
	invitation: 7 * 86_400,
	/** A session ends after this long without a visit. */
	session: 14 * 86_400,
	/** A session's end moves forward at most this often (one write per day per session). */
	sessionRefresh: 86_400
} as const;

export type LimitedStep = 'sign-in' | 'magic-link' | 'sign-up' | 'reset' | 'confirm-resend' | 'password-change';

interface Limit {
	max: number;
	windowSeconds: number;
}

/**
 * Per address and per client IP. The IP limits are loose because a crew behind one set router or
 * office NAT shares an address; the per-address limits are what stop guessing one account.
 */
export const LIMITS: Readonly<Record<LimitedStep, { address: Limit; ip: Limit }>> = {
	'sign-in': { address: { max: 5, windowSeconds: 900 }, ip: { max: 200, windowSeconds: 900 } },
	'magic-link': { address: { max: 3, windowSeconds: 900 }, ip: { max: 50, windowSeconds: 900 } },
	'sign-up': { address: { max: 3, windowSeconds: 3600 }, ip: { max: 30, windowSeconds: 3600 } },
	reset: { address: { max: 3, windowSeconds: 900 }, ip: { max: 50, windowSeconds: 900 } },
	'confirm-resend': { address: { max: 3, windowSeconds: 3600 }, ip: { max: 50, windowSeconds: 3600 } },
	// Someone holding a signed-in browser must not get unlimited guesses at the current password.
	'password-change': { address: { max: 5, windowSeconds: 900 }, ip: { max: 50, windowSeconds: 900 } }
};

export type LimitCheck = { allowed: true } | { allowed: false; retryAfterSeconds: number };

/** Counts one attempt of `step` for the address and the IP; refused if either is over its limit. */
export async function countAttempt(step: LimitedStep, who: { address: string; ip: string }, now = new Date()): Promise<LimitCheck> {
	const { address, ip } = LIMITS[step];
	if (Math.random() < HOUSEKEEPING_CHANCE) void sweepExpired(now).catch((e) => console.error('[auth] housekeeping failed:', e));
	const checks = await Promise.all([
		rateLimits.hit(rateLimits.bucketOf(`${step}:address`, who.address), address.windowSeconds, now).then((c) => ({ c, max: address.max })),
		rateLimits.hit(rateLimits.bucketOf(`${step}:ip`, who.ip), ip.windowSeconds, now).then((c) => ({ c, max: ip.max }))
	]);
	const over = checks.filter(({ c, max }) => c.hits > max);
	if (over.length === 0) return { allowed: true };
	const resetsAt = Math.max(...over.map(({ c }) => c.resetsAt.getTime()));
	return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil((resetsAt - now.getTime()) / 1000)) };
}

/** Forgets an address's attempts at `step` (after it succeeded). */
export async function forgetAttempts(step: LimitedStep, address: string): Promise<void> {
	await rateLimits.destroy(rateLimits.bucketOf(`${step}:address`, address));
}

/** "about 12 minutes": for "try again in …" messages. */
export function describeWait(seconds: number): string {
	if (seconds < 90) return 'a minute';
	const minutes = Math.ceil(seconds / 60);
	return minutes < 90 ? `about ${minutes} minutes` : `about ${Math.round(minutes / 60)} hours`;
}

/** About one attempt in 200 also sweeps out what has expired, so no scheduler is needed. */
const HOUSEKEEPING_CHANCE = 1 / 200;

/** Deletes ended rate-limit windows, expired sign-in links and tokens, and expired sessions. */
export async function sweepExpired(now = new Date()): Promise<void> {
	await rateLimits.destroyExpired(now);
	await tokens.destroyExpired(new Date(now.getTime() - 86_400_000));
	await db('verification_tokens').where('expires', '<', now).delete();
	await db('sessions').where('expires', '<', now).delete();
}
