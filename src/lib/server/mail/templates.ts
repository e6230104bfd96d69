/**
 * Chromaslate's messages. Each returns a subject, a plain-text part and an HTML part that say the
 * same thing, so the message reads well in any mail program. Pure: no sending, no environment.
 */

export interface MailContent {
	subject: string;
	text: string;
	html: string;
}

export function escapeHtml(s: string): string {
	return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** "24 hours", "30 minutes", "7 days": how long a link works, from its lifetime in seconds. */
export function describeLifetime(seconds: number): string {
	const plural = (n: number, unit: string) => `${n} ${unit}${n === 1 ? '' : 's'}`;
	if (seconds >= 2 * 86_400 && seconds % 86_400 === 0) return plural(seconds / 86_400, 'day');
	if (seconds >= 3_600 && seconds % 3_600 === 0) return plural(seconds / 3_600, 'hour');
	return plural(Math.max(1, Math.round(seconds / 60)), 'minute');
}

interface Layout {
	subject: string;
	greeting: string;
	paragraphs: string[];
	action: { label: string; url: string };
	after?: string[];
}

const SIGN_OFF = 'Chromaslate · colour for lighting crews';
const NOT_YOU = 'If you did not expect this message, you can ignore it; nothing changes until the link is used.';

function compose({ subject, greeting, paragraphs, action, after = [] }: Layout): MailContent {
	const text = [
		greeting,
		'',
		...paragraphs.flatMap((p) => [p, '']),
		`${action.label}:`,
		action.url,
		'',
		...after.flatMap((p) => [p, '']),
		'--',
		SIGN_OFF,
		''
	].join('\n');

	const p = (s: string) => `<p style="margin:0 0 16px;line-height:1.5">${escapeHtml(s)}</p>`;
	const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="color-scheme" content="light dark"><title>${escapeHtml(subject)}</title></head>
<body style="margin:0;padding:24px;background:#f6f4ef;color:#1d1c1a;font-family:system-ui,-apple-system,'Segoe UI',sans-serif;font-size:16px">
<div style="max-width:560px;margin:0 auto;background:#ffffff;border:1px solid #d3cfc5;border-radius:14px;padding:24px">
<p style="margin:0 0 20px;font-weight:600;letter-spacing:-0.01em">Chromaslate</p>
${p(greeting)}
${paragraphs.map(p).join('\n')}
<p style="margin:24px 0"><a href="${escapeHtml(action.url)}" style="display:inline-block;background:#9c6112;color:#ffffff;text-decoration:none;font-weight:600;padding:14px 22px;border-radius:10px">${escapeHtml(action.label)}</a></p>
<p style="margin:0 0 16px;line-height:1.5;font-size:14px;color:#55524b">If the button does not work, copy this address into your browser:<br><a href="${escapeHtml(action.url)}" style="color:#1f7380;word-break:break-all">${escapeHtml(action.url)}</a></p>
${after.map(p).join('\n')}
<p style="margin:24px 0 0;font-size:13px;color:#85817a">${escapeHtml(SIGN_OFF)}</p>
</div></body></html>
`;
	return { subject, text, html };
}

const hello = (name?: string | null) => (name?.trim() ? `Hello ${name.trim()},` : 'Hello,');

export function confirmEmailMail(p: { name?: string | null; url: string; lifetimeSeconds: number }): MailContent {
	return compose({
		subject: 'Confirm your address for Chromaslate',
		greeting: hello(p.name),
		paragraphs: [
			'Thanks for making a Chromaslate account. Confirm that this address is yours and you can sign in.',
			`The link works once, within ${describeLifetime(p.lifetimeSeconds)}.`
		],
		action: { label: 'Confirm my address', url: p.url },
		after: [NOT_YOU]
	});
}

export function magicLinkMail(p: { url: string; lifetimeSeconds: number }): MailContent {
	return compose({
		subject: 'Your Chromaslate sign-in link',
		greeting: hello(),
		paragraphs: [
			'Someone (we hope you) asked to sign in to Chromaslate with this address. Open the link on the device you want to use.',
			`It works once, within ${describeLifetime(p.lifetimeSeconds)}. If this address has no account yet, signing in makes one.`
		],
		action: { label: 'Sign in to Chromaslate', url: p.url },
		after: [NOT_YOU]
	});
}

export function passwordResetMail(p: { name?: string | null; url: string; lifetimeSeconds: number }): MailContent {
	return compose({
		subject: 'Choose a new Chromaslate password',
		greeting: hello(p.name),
		paragraphs: [
			'We were asked to reset the password of the Chromaslate account for this address.',
			`The link works once, within ${describeLifetime(p.lifetimeSeconds)}. Setting a new password signs you out everywhere else.`
		],
		action: { label: 'Choose a new password', url: p.url },
		after: ['If you did not ask for this, ignore this message: your password stays as it is.']
	});
}

export function accountExistsMail(p: { name?: string | null; signInUrl: string; resetUrl: string }): MailContent {
	return compose({
		subject: 'You already have a Chromaslate account',
		greeting: hello(p.name),
		paragraphs: [
			'Someone tried to make a new Chromaslate account with this address, but it already has one, so nothing was changed.',
			`To get in, sign in as usual. Forgotten the password? Choose a new one here: ${p.resetUrl}`
		],
		action: { label: 'Sign in to Chromaslate', url: p.signInUrl },
		after: ['If it was not you, you can ignore this message.']
	});
}

export function invitationMail(p: {
	inviterName: string;
	projectName: string;
	roleLabel: string;
	url: string;
	lifetimeSeconds: number;
}): MailContent {
	const inviter = p.inviterName.trim() || 'A Chromaslate user';
	return compose({
		subject: `${inviter} invited you to “${p.projectName}” on Chromaslate`,
		greeting: hello(),
		paragraphs: [
			`${inviter} invited you to join the project “${p.projectName}” as ${p.roleLabel.toLowerCase()}.`,
			'Chromaslate keeps the project’s lighting log: every setup, its target white, each light’s readings and the fixes the crew took.',
			`The invitation works once, within ${describeLifetime(p.lifetimeSeconds)}. You can make an account on the way if you have none.`
		],
		action: { label: 'Open the invitation', url: p.url },
		after: [NOT_YOU]
	});
}

export function logSharedMail(p: { sharerName: string; projectName: string; url: string; note?: string | null }): MailContent {
	const sharer = p.sharerName.trim() || 'A Chromaslate user';
	const paragraphs = [`${sharer} shared the lighting log of “${p.projectName}” with you.`];
	if (p.note?.trim()) paragraphs.push(`Their note: “${p.note.trim()}”`);
	paragraphs.push('The log lists each setup with its target white, every light’s readings and the fixes that were accepted, with who accepted them and when.');
	return compose({
		subject: `${sharer} shared a lighting log with you: “${p.projectName}”`,
		greeting: hello(),
		paragraphs,
		action: { label: 'Open the lighting log', url: p.url }
	});
}
