/**
 * Form handling shared by the sign-in and project pages: parse FormData with a zod schema into either
 * data or `{ issues, values }` for `fail(400, …)`, and keep redirects on our own site.
 */
import type { z } from 'zod';

export type Issues = Record<string, string[]>;

export type Parsed<T> = { ok: true; data: T; values: Record<string, string> } | { ok: false; issues: Issues; values: Record<string, string> };

/** The submitted strings, minus anything secret, to refill the form. */
export function formValues(form: FormData): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [k, v] of form) {
		if (typeof v === 'string' && !/password|token/i.test(k)) values[k] = v;
	}
	return values;
}

export function issuesOf(error: z.ZodError): Issues {
	const issues: Issues = {};
	for (const issue of error.issues) {
		const key = issue.path.length > 0 ? String(issue.path[0]) : 'form';
		(issues[key] ??= []).push(issue.message);
	}
	return issues;
}

export function parseForm<S extends z.ZodType>(schema: S, form: FormData): Parsed<z.infer<S>> {
	const raw: Record<string, string> = {};
	for (const [k, v] of form) if (typeof v === 'string') raw[k] = v;
	const result = schema.safeParse(raw);
	if (result.success) return { ok: true, data: result.data, values: formValues(form) };
	return { ok: false, issues: issuesOf(result.error), values: formValues(form) };
}

/** A path on this site to go to after signing in; anything else (other hosts, "//x", odd schemes) falls back. */
export function safeRedirect(target: string | null | undefined, fallback = '/projects'): string {
	if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) return fallback;
	try {
		const u = new URL(target, 'http://placeholder.invalid');
		if (u.origin !== 'http://placeholder.invalid') return fallback;
		if (u.pathname.startsWith('/auth/') || u.pathname === '/sign-out') return fallback;
		return u.pathname + u.search + u.hash;
	} catch {
		return fallback;
	}
}

/** The site's public origin (for links in mail) and the client's address (for rate limits). */
export function requestContext(event: { url: URL; getClientAddress(): string }): { origin: string; ip: string } {
	let ip = 'unknown';
	try {
		ip = event.getClientAddress();
	} catch {
		// No address (e.g. behind a proxy without ADDRESS_HEADER): everyone shares one IP bucket.
	}
	return { origin: (process.env.ORIGIN || event.url.origin).replace(/\/$/, ''), ip };
}
