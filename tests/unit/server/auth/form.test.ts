import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { formValues, parseForm, requestContext, safeRedirect } from '$lib/server/auth/form';
import { describeWait } from '$lib/server/auth/policy';

const fd = (o: Record<string, string>) => {
	const f = new FormData();
	for (const [k, v] of Object.entries(o)) f.set(k, v);
	return f;
};

describe('safeRedirect', () => {
	it('keeps paths on this site, with query and hash', () => {
		expect(safeRedirect('/projects/3?tab=log#top')).toBe('/projects/3?tab=log#top');
		expect(safeRedirect('/invite/abc')).toBe('/invite/abc');
	});
	it('falls back for other hosts, protocol-relative and odd forms', () => {
		for (const bad of ['https://elsewhere.example/x', '//elsewhere.example', '/\\elsewhere.example', 'javascript:alert(1)', 'projects', '', null, undefined]) {
			expect(safeRedirect(bad)).toBe('/projects');
		}
	});
	it('never goes back into Auth.js or sign-out', () => {
		expect(safeRedirect('/auth/signout')).toBe('/projects');
		expect(safeRedirect('/sign-out', '/x')).toBe('/x');
	});
});

describe('parseForm', () => {
	const schema = z.object({ email: z.email('bad address'), password: z.string().min(3, 'too short') });
	it('returns the data when valid', () => {
		expect(parseForm(schema, fd({ email: 'a@example.test', password: 'abcd' }))).toMatchObject({ ok: true, data: { email: 'a@example.test', password: 'abcd' } });
	});
	it('returns issues per field and the values without the password', () => {
		const r = parseForm(schema, fd({ email: 'nope', password: 'x' }));
		expect(r).toEqual({ ok: false, issues: { email: ['bad address'], password: ['too short'] }, values: { email: 'nope' } });
	});
	it('formValues drops passwords and tokens', () => {
		expect(formValues(fd({ a: '1', newPassword: 'x', invite_token: 'y' }))).toEqual({ a: '1' });
	});
});

describe('requestContext', () => {
	it('uses the client address, and a shared bucket when there is none', () => {
		const url = new URL('http://127.0.0.1:3000/sign-in');
		expect(requestContext({ url, getClientAddress: () => '198.51.100.4' }).ip).toBe('198.51.100.4');
		expect(
			requestContext({
				url,
				getClientAddress: () => {
					throw new Error('no address');
				}
			}).ip
		).toBe('unknown');
	});
});

describe('describeWait', () => {
	it('rounds up to whole minutes', () => {
		expect(describeWait(30)).toBe('a minute');
		expect(describeWait(601)).toBe('about 11 minutes');
		expect(describeWait(3 * 3600)).toBe('about 3 hours');
	});
});
