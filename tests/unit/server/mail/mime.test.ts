import MailComposer from 'nodemailer/lib/mail-composer';
import { describe, expect, it } from 'vitest';
import { decodeEncodedWords, decodeQuotedPrintable, extractLinks, parseMail } from '$lib/server/mail/mime';

const utf8 = (b: Uint8Array) => new TextDecoder().decode(b);

function compose(opts: { subject: string; text: string; html: string }): Promise<Buffer> {
	return new MailComposer({ from: 'a@example.test', to: 'b@example.test', ...opts }).compile().build();
}

describe('decodeQuotedPrintable', () => {
	it('RFC 2045 §6.7 rule 5: soft line breaks join the lines', () => {
		const encoded = "Now's the time =\r\nfor all folk to come=\r\n to the aid of their country.";
		expect(utf8(decodeQuotedPrintable(encoded))).toBe("Now's the time for all folk to come to the aid of their country.");
	});
	it('RFC 2045 §6.7 rule 1: =XX is one octet (UTF-8 of é is C3 A9; "=" itself is =3D)', () => {
		expect(utf8(decodeQuotedPrintable('caf=C3=A9 token=3Dabc'))).toBe('café token=abc');
		expect(utf8(decodeQuotedPrintable('lower =c3=a9 too'))).toBe('lower é too');
	});
	it('leaves a stray "=" that is not followed by two hex digits alone', () => {
		expect(utf8(decodeQuotedPrintable('a=ZZ b=4'))).toBe('a=ZZ b=4');
	});
	it('empty input is empty output', () => {
		expect(decodeQuotedPrintable('')).toEqual(new Uint8Array());
	});
});

describe('decodeEncodedWords', () => {
	it('RFC 2047 §8 examples: adjacent encoded words join, a plain word keeps its space', () => {
		expect(decodeEncodedWords('(=?ISO-8859-1?Q?a?=)')).toBe('(a)');
		expect(decodeEncodedWords('(=?ISO-8859-1?Q?a?= b)')).toBe('(a b)');
		expect(decodeEncodedWords('(=?ISO-8859-1?Q?a?= =?ISO-8859-1?Q?b?=)')).toBe('(ab)');
		expect(decodeEncodedWords('(=?ISO-8859-1?Q?a?=\r\n    =?ISO-8859-1?Q?b?=)')).toBe('(ab)');
		expect(decodeEncodedWords('(=?ISO-8859-1?Q?a_b?=)')).toBe('(a b)');
	});
	it('B encoding in UTF-8, and a Latin-1 octet in Q', () => {
		expect(decodeEncodedWords(`=?UTF-8?B?${Buffer.from('Lumière “test”').toString('base64')}?=`)).toBe('Lumière “test”');
		expect(decodeEncodedWords('=?ISO-8859-1?Q?caf=E9?=')).toBe('café');
	});
	it('plain headers pass through', () => {
		expect(decodeEncodedWords('Plain subject')).toBe('Plain subject');
	});
});

describe('parseMail on messages built by nodemailer', () => {
	it('reads back the text and HTML parts, long lines and non-ASCII included (quoted-printable)', async () => {
		const url = `http://127.0.0.1:3000/auth/callback/nodemailer?callbackUrl=${encodeURIComponent('http://127.0.0.1:3000/projects')}&token=${'a1B2'.repeat(16)}&email=gaffer%40example.test`;
		const text = `Hello Gaffer,\n\nThe link — once, within 30 minutes:\n${url}\n\nMired shift ±20, “quoted”, 照明.\n`;
		const html = `<p>Réglage</p><a href="${url}">Sign in</a>`;
		const parsed = parseMail(await compose({ subject: 'Your sign-in link — “Night Wash”', text, html }));
		expect(parsed.subject).toBe('Your sign-in link — “Night Wash”');
		expect(parsed.text).toBe(text);
		expect(parsed.html).toBe(html);
		expect(extractLinks(parsed.text!)).toEqual([url]);
		expect(parsed.to).toBe('b@example.test');
	});

	it('a text-only message has no HTML part', async () => {
		const raw = await new MailComposer({ from: 'a@example.test', to: 'b@example.test', subject: 'x', text: 'only text' }).compile().build();
		const parsed = parseMail(raw);
		expect(parsed.text?.trim()).toBe('only text');
		expect(parsed.html).toBeNull();
	});

	it('reads base64 parts', async () => {
		const raw = await new MailComposer({
			from: 'a@example.test',
			to: 'b@example.test',
			subject: 'b64',
			text: { content: 'encoded as base64 ✓' },
			textEncoding: 'base64'
		}).compile().build();
		expect(parseMail(raw).text).toBe('encoded as base64 ✓');
	});

	it('a message with no body parts gives nulls rather than throwing', () => {
		const parsed = parseMail('Subject: empty\r\nContent-Type: multipart/alternative; boundary="x"\r\n\r\n--x--\r\n');
		expect(parsed.subject).toBe('empty');
		expect(parsed.text).toBeNull();
		expect(parsed.html).toBeNull();
	});
});

describe('extractLinks', () => {
	it('drops trailing punctuation and keeps query strings', () => {
		expect(extractLinks('Go to https://a.example/x?y=1&z=2. Or (http://b.example/p).')).toEqual(['https://a.example/x?y=1&z=2', 'http://b.example/p']);
		expect(extractLinks('no links here')).toEqual([]);
	});
});
