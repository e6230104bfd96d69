import { describe, expect, it } from 'vitest';
import {
	accountExistsMail,
	confirmEmailMail,
	describeLifetime,
	escapeHtml,
	invitationMail,
	logSharedMail,
	magicLinkMail,
	passwordResetMail,
	type MailContent
} from '$lib/server/mail/templates';

const URL_ = 'http://127.0.0.1:3000/verify/abc_DEF-123?x=1&y=2';

const all: Record<string, MailContent> = {
	confirm: confirmEmailMail({ name: 'Demo Gaffer', url: URL_, lifetimeSeconds: 86_400 }),
	magic: magicLinkMail({ url: URL_, lifetimeSeconds: 1800 }),
	reset: passwordResetMail({ name: null, url: URL_, lifetimeSeconds: 3600 }),
	exists: accountExistsMail({ name: 'Demo DP', signInUrl: URL_, resetUrl: 'http://127.0.0.1:3000/reset' }),
	invitation: invitationMail({ inviterName: 'Demo Owner', projectName: 'Night Wash (demo)', roleLabel: 'Gaffer', url: URL_, lifetimeSeconds: 7 * 86_400 }),
	shared: logSharedMail({ sharerName: 'Demo DP', projectName: 'Night Wash (demo)', url: URL_, note: 'Night 2, as graded' })
};

describe('mail templates', () => {
	for (const [name, m] of Object.entries(all)) {
		it(`${name}: a subject, a text part and an HTML part, both carrying the link`, () => {
			expect(m.subject.length).toBeGreaterThan(5);
			expect(m.text).toContain(URL_);
			expect(m.html).toContain(escapeHtml(URL_));
			expect(m.html).toMatch(/^<!doctype html>/);
			expect(m.text).not.toMatch(/<[a-z]/i);
		});
	}

	it('say how long the link works', () => {
		expect(all.confirm.text).toContain('within 24 hours');
		expect(all.magic.text).toContain('within 30 minutes');
		expect(all.reset.text).toContain('within 1 hour');
		expect(all.invitation.text).toContain('within 7 days');
	});

	it('greet by name when there is one', () => {
		expect(all.confirm.text.startsWith('Hello Demo Gaffer,')).toBe(true);
		expect(all.reset.text.startsWith('Hello,')).toBe(true);
	});

	it('the invitation names inviter, project and role', () => {
		expect(all.invitation.subject).toBe('Demo Owner invited you to “Night Wash (demo)” on Chromaslate');
		expect(all.invitation.text).toContain('as gaffer');
	});

	it('escape what people typed in the HTML part', () => {
		const m = invitationMail({ inviterName: '<script>x</script>', projectName: 'A & B "quoted"', roleLabel: 'Viewer', url: URL_, lifetimeSeconds: 60 });
		expect(m.html).not.toContain('<script>');
		expect(m.html).toContain('&lt;script&gt;');
		expect(m.html).toContain('A &amp; B &quot;quoted&quot;');
		const shared = logSharedMail({ sharerName: 'Demo DP', projectName: 'P', url: URL_, note: 'Night 2 <final>' });
		expect(shared.html).toContain('Night 2 &lt;final&gt;');
		expect(shared.text).toContain('Night 2 <final>');
	});

	it('fall back to a neutral name when the inviter has none', () => {
		expect(logSharedMail({ sharerName: '  ', projectName: 'P', url: URL_ }).subject).toMatch(/^A Chromaslate user shared/);
	});
});

describe('describeLifetime', () => {
	it('days, hours, minutes, singular and plural', () => {
		expect(describeLifetime(7 * 86_400)).toBe('7 days');
		expect(describeLifetime(86_400)).toBe('24 hours');
		expect(describeLifetime(3600)).toBe('1 hour');
		expect(describeLifetime(1800)).toBe('30 minutes');
		expect(describeLifetime(60)).toBe('1 minute');
		expect(describeLifetime(5)).toBe('1 minute');
		expect(describeLifetime(5400)).toBe('90 minutes');
	});
});
