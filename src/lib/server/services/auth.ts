/**
 * Accounts: sign-up with address confirmation, the password check behind sign-in, password reset,
 * and accounts made from an invitation. No Auth.js here (that lives in `$lib/server/auth`); these
 * functions take plain input and return plain results, and answers never tell a stranger whether an
 * address has an account.
 */
import { z } from 'zod';
import { db } from '$lib/server/db';
import * as invitations from '$lib/server/db/invitations';
import * as members from '$lib/server/db/members';
import * as tokens from '$lib/server/db/tokens';
import * as users from '$lib/server/db/users';
import type { User } from '$lib/server/db/users';
import { createKnexAdapter } from '$lib/server/auth/knex-adapter';
import { hashPassword, PASSWORD_MAX, PASSWORD_MIN, verifyPassword } from '$lib/server/auth/password';
import { countAttempt, forgetAttempts, LIFETIMES } from '$lib/server/auth/policy';
import { sendAccountExists, sendConfirmEmail, sendPasswordReset } from '$lib/server/mail';

export const emailField = z
	.string({ error: 'Enter your e-mail address.' })
	.trim()
	.min(1, 'Enter your e-mail address.')
	.max(255, 'That address is too long.')
	.transform((s) => users.normalizeEmail(s))
	.pipe(z.email({ error: 'That does not look like an e-mail address.' }));

export const passwordField = z
	.string({ error: 'Choose a password.' })
	.min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`)
	.max(PASSWORD_MAX, `Use at most ${PASSWORD_MAX} characters.`);

export const nameField = z
	.string({ error: 'Enter your name.' })
	.trim()
	.min(1, 'Enter your name, as the crew knows you.')
	.max(120, 'Keep the name under 120 characters.');

export const signInSchema = z.object({
	email: emailField,
	password: z.string({ error: 'Enter your password.' }).min(1, 'Enter your password.').max(PASSWORD_MAX, 'That password is too long.')
});

export const signUpSchema = z.object({ name: nameField, email: emailField, password: passwordField });
export const emailOnlySchema = z.object({ email: emailField });
export const newPasswordSchema = z.object({ password: passwordField });

/** The account page's forms. */
export const displayNameSchema = z.object({ name: nameField });
export const changePasswordSchema = z
	.object({
		currentPassword: z.string({ error: 'Enter your current password.' }).min(1, 'Enter your current password.').max(PASSWORD_MAX, 'That password is too long.'),
		newPassword: passwordField,
		repeatPassword: z.string({ error: 'Type the new password again.' })
	})
	.refine((v) => v.newPassword === v.repeatPassword, { message: 'The two new passwords differ. Type them again.', path: ['repeatPassword'] })
	.refine((v) => v.newPassword !== v.currentPassword, { message: 'Choose a password different from the current one.', path: ['newPassword'] });

export interface Context {
	/** Site origin for links in mail, e.g. "https://chromaslate.example". */
	origin: string;
	/** Client address, for rate limits. */
	ip: string;
}

export type Limited = { ok: false; reason: 'limited'; retryAfterSeconds: number };

const adapter = createKnexAdapter(db);

/** Sends mail without making the caller wait, so the answer takes as long whichever way it went. */
function deliverLater(sending: Promise<unknown>): void {
	sending.catch((e) => console.error('[mail] could not send:', e instanceof Error ? e.message : e));
}

async function mailConfirmation(user: User, origin: string): Promise<void> {
	const { token } = await tokens.create(user.id, 'confirm-email', LIFETIMES.confirmEmail);
	await sendConfirmEmail(user.email, {
		name: user.name,
		url: `${origin}/verify/${token}`,
		lifetimeSeconds: LIFETIMES.confirmEmail
	});
}

/**
 * Makes an unconfirmed account and mails a confirmation link. If the address already has an account,
 * nothing changes and its owner is told by mail instead. Either way the caller learns only "sent".
 */
export async function signUp(input: z.infer<typeof signUpSchema>, ctx: Context): Promise<{ ok: true } | Limited> {
	const limit = await countAttempt('sign-up', { address: input.email, ip: ctx.ip });
	if (!limit.allowed) return { ok: false, reason: 'limited', retryAfterSeconds: limit.retryAfterSeconds };

	const existing = await users.readByEmail(input.email);
	if (existing) {
		await sendAccountExists(existing.email, {
			name: existing.name,
			signInUrl: `${ctx.origin}/sign-in`,
			resetUrl: `${ctx.origin}/reset`
		});
		return { ok: true };
	}
	const passwordHash = await hashPassword(input.password);
	let user: User;
	try {
		user = await users.create({ email: input.email, name: input.name, passwordHash });
	} catch (e) {
		// Two sign-ups for one address at once: the other one won; answer the same.
		if ((e as { code?: string }).code === 'ER_DUP_ENTRY') return { ok: true };
		throw e;
	}
	await mailConfirmation(user, ctx.origin);
	return { ok: true };
}

/** Whether a confirmation link can still be used (for the page before the button). */
export async function confirmationIsUsable(token: string): Promise<boolean> {
	return tokens.isUsable(await tokens.read(token, 'confirm-email'));
}

/** Uses a confirmation link: the address counts as confirmed from now on. */
export async function confirmEmail(token: string): Promise<{ ok: true; email: string } | { ok: false }> {
	const userId = await tokens.consume(token, 'confirm-email');
	if (userId === null) return { ok: false };
	const user = await users.read(userId);
	if (!user) return { ok: false };
	if (!user.emailVerified) await users.update(user.id, { emailVerified: new Date() });
	return { ok: true, email: user.email };
}

export type PasswordCheck =
	| { ok: true; user: User }
	| { ok: false; reason: 'invalid' | 'unconfirmed' }
	| Limited;

/**
 * The sign-in check: counts the attempt (per address and per IP), then compares the password. An
 * account whose address is not confirmed yet gets a fresh confirmation link; saying so is safe,
 * because only someone who knows the password hears it.
 */
export async function checkPassword(email: string, password: string, ctx: Context): Promise<PasswordCheck> {
	const address = users.normalizeEmail(email);
	const limit = await countAttempt('sign-in', { address, ip: ctx.ip });
	if (!limit.allowed) return { ok: false, reason: 'limited', retryAfterSeconds: limit.retryAfterSeconds };

	const found = await users.readWithPassword(address);
	const matches = await verifyPassword(found?.passwordHash, password);
	if (!found || !matches) return { ok: false, reason: 'invalid' };
	const { passwordHash: _hash, ...user } = found;
	if (!user.emailVerified) {
		const resend = await countAttempt('confirm-resend', { address, ip: ctx.ip });
		if (resend.allowed) deliverLater(mailConfirmation(user, ctx.origin));
		return { ok: false, reason: 'unconfirmed' };
	}
	await forgetAttempts('sign-in', address);
	return { ok: true, user };
}

/** The same comparison without counting, for Auth.js's Credentials provider (the action counted already). */
export async function passwordUser(email: string, password: string): Promise<User | null> {
	const found = await users.readWithPassword(email);
	if (!(await verifyPassword(found?.passwordHash, password)) || !found?.emailVerified) return null;
	const { passwordHash: _hash, ...user } = found;
	return user;
}

/** Mails a reset link if the address has an account. The caller learns only "sent". */
export async function requestPasswordReset(email: string, ctx: Context): Promise<{ ok: true } | Limited> {
	const address = users.normalizeEmail(email);
	const limit = await countAttempt('reset', { address, ip: ctx.ip });
	if (!limit.allowed) return { ok: false, reason: 'limited', retryAfterSeconds: limit.retryAfterSeconds };
	const user = await users.readByEmail(address);
	if (user) {
		deliverLater(
			tokens.create(user.id, 'reset-password', LIFETIMES.resetPassword).then(({ token }) =>
				sendPasswordReset(user.email, { name: user.name, url: `${ctx.origin}/reset/${token}`, lifetimeSeconds: LIFETIMES.resetPassword })
			)
		);
	}
	return { ok: true };
}

export async function resetIsUsable(token: string): Promise<boolean> {
	return tokens.isUsable(await tokens.read(token, 'reset-password'));
}

/**
 * Uses a reset link: sets the new password, counts the address as confirmed (the link proved it),
 * drops the other reset links and ends every session of the account.
 */
export async function resetPassword(token: string, password: string): Promise<{ ok: true; email: string } | { ok: false }> {
	const passwordHash = await hashPassword(password);
	return db.transaction(async (trx) => {
		const userId = await tokens.consume(token, 'reset-password', trx);
		if (userId === null) return { ok: false as const };
		const user = await users.read(userId, trx);
		if (!user) return { ok: false as const };
		await users.update(user.id, { passwordHash, emailVerified: user.emailVerified ?? new Date() }, trx);
		await tokens.destroyUnused(user.id, 'reset-password', trx);
		await createKnexAdapter(trx).deleteUserSessions(String(user.id));
		return { ok: true as const, email: user.email };
	});
}

/** Changes the name the crew sees (headers, member lists, comments, the activity log). */
export async function changeDisplayName(userId: number, name: string): Promise<User> {
	const user = await users.update(userId, { name });
	if (!user) throw new Error(`changeDisplayName: user ${userId} is gone`);
	return user;
}

export type PasswordChange = { ok: true } | { ok: false; reason: 'invalid' | 'no-password' } | Limited;

/**
 * Sets a new password once the current one is given (counted per address and IP, like sign-in), and
 * ends every session of the account: a browser someone else kept signed in stops working. The
 * caller signs this browser in again with the new password. An account that signs in only by
 * e-mail link has no current password: it sets one through a reset link instead.
 */
export async function changePassword(user: { id: number; email: string }, current: string, next: string, ctx: Pick<Context, 'ip'>): Promise<PasswordChange> {
	const address = users.normalizeEmail(user.email);
	const limit = await countAttempt('password-change', { address, ip: ctx.ip });
	if (!limit.allowed) return { ok: false, reason: 'limited', retryAfterSeconds: limit.retryAfterSeconds };
	const found = await users.readWithPassword(address);
	if (!found || found.id !== user.id) return { ok: false, reason: 'invalid' };
	if (!found.passwordHash) return { ok: false, reason: 'no-password' };
	if (!(await verifyPassword(found.passwordHash, current))) return { ok: false, reason: 'invalid' };
	const passwordHash = await hashPassword(next);
	await db.transaction(async (trx) => {
		await users.update(user.id, { passwordHash }, trx);
		await tokens.destroyUnused(user.id, 'reset-password', trx);
		await createKnexAdapter(trx).deleteUserSessions(String(user.id));
	});
	await forgetAttempts('password-change', address);
	return { ok: true };
}

/** Whether the account has a password (some sign in only by e-mail link). */
export async function hasPassword(email: string): Promise<boolean> {
	return Boolean((await users.readWithPassword(email))?.passwordHash);
}

/** Ends every session of a user (all devices). */
export async function endAllSessions(userId: number): Promise<number> {
	return adapter.deleteUserSessions(String(userId));
}

export type InvitedSignUp =
	| { ok: true; email: string; projectId: number }
	| { ok: false; reason: 'invitation' | 'exists' };

/**
 * Makes an account for the address an invitation was sent to and joins the project, in one
 * transaction. The invitation link proved the address, so no confirmation mail is needed. If the
 * address has an account already, the person should sign in instead (the invitation says which
 * address it is for, so this tells them nothing new).
 */
export async function signUpWithInvitation(
	token: string,
	input: { name: string; password: string }
): Promise<InvitedSignUp> {
	const passwordHash = await hashPassword(input.password);
	return db.transaction(async (trx) => {
		const invitation = await invitations.readByToken(token, trx);
		if (!invitations.isUsable(invitation)) return { ok: false as const, reason: 'invitation' as const };
		if (await users.readByEmail(invitation.email, trx)) return { ok: false as const, reason: 'exists' as const };
		const user = await users.create(
			{ email: invitation.email, name: input.name, passwordHash, emailVerified: new Date() },
			trx
		);
		if (!(await invitations.markUsed(invitation.id, user.id, trx))) {
			throw new Error('The invitation was used at the same moment; try again.');
		}
		await members.create(invitation.projectId, user.id, invitation.role, trx);
		return { ok: true as const, email: user.email, projectId: invitation.projectId };
	});
}
