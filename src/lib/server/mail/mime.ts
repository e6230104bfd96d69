/**
 * A small reader for the MIME messages our own mail code sends (RFC 2045–2047): headers with
 * encoded words, multipart bodies, quoted-printable and base64 parts. It is enough to show captured
 * mail on `/dev/mail` and to let tests read links out of it; it is not a general mail parser.
 * Relative imports only, so tests and scripts can load it without the `$lib` alias.
 */

export interface MailPart {
	contentType: string;
	/** Decoded text of a text/* part. */
	body: string;
}

export interface ParsedMail {
	headers: Record<string, string>;
	subject: string;
	from: string;
	to: string;
	date: string;
	/** The text/plain part, decoded; null when the message has none. */
	text: string | null;
	/** The text/html part, decoded; null when the message has none. */
	html: string | null;
	parts: MailPart[];
}

/** RFC 2045 §6.7: "=XX" is one byte, "=" at the end of a line is a soft line break. */
export function decodeQuotedPrintable(input: string): Uint8Array {
	const s = input.replace(/=\r?\n/g, '');
	const out: number[] = [];
	for (let i = 0; i < s.length; i++) {
		const c = s[i];
		if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(s.slice(i + 1, i + 3))) {
			out.push(parseInt(s.slice(i + 1, i + 3), 16));
			i += 2;
		} else {
			out.push(s.charCodeAt(i) & 0xff);
		}
	}
	return Uint8Array.from(out);
}

function decodeBytes(bytes: Uint8Array, charset: string): string {
	try {
		return new TextDecoder(charset || 'utf-8').decode(bytes);
	} catch {
		return new TextDecoder('utf-8').decode(bytes);
	}
}

/** Bytes kept one-to-one in a "binary" string (each char code 0–255). */
function binaryToBytes(s: string): Uint8Array {
	const out = new Uint8Array(s.length);
	for (let i = 0; i < s.length; i++) out[i] = s.charCodeAt(i) & 0xff;
	return out;
}

/** RFC 2047 encoded words in a header ("=?UTF-8?Q?...?=", "=?UTF-8?B?...?="). */
export function decodeEncodedWords(value: string): string {
	return value
		.replace(/(=\?[^?]+\?[QqBb]\?[^?]*\?=)\s+(?==\?)/g, '$1')
		.replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_m, charset: string, enc: string, data: string) => {
			const bytes =
				enc.toUpperCase() === 'B'
					? Uint8Array.from(atob(data), (ch) => ch.charCodeAt(0))
					: decodeQuotedPrintable(data.replace(/_/g, ' '));
			return decodeBytes(bytes, charset);
		});
}

function splitHead(raw: string): { head: string; body: string } {
	const m = /\r?\n\r?\n/.exec(raw);
	return m ? { head: raw.slice(0, m.index), body: raw.slice(m.index + m[0].length) } : { head: raw, body: '' };
}

function parseHeaders(head: string): Record<string, string> {
	const headers: Record<string, string> = {};
	const unfolded = head.replace(/\r?\n[ \t]+/g, ' ');
	for (const line of unfolded.split(/\r?\n/)) {
		const i = line.indexOf(':');
		if (i <= 0) continue;
		const name = line.slice(0, i).trim().toLowerCase();
		if (!(name in headers)) headers[name] = line.slice(i + 1).trim();
	}
	return headers;
}

function headerParam(value: string, param: string): string | null {
	const m = new RegExp(`;\\s*${param}\\s*=\\s*(?:"([^"]*)"|([^;\\s]+))`, 'i').exec(value);
	return m ? (m[1] ?? m[2]) : null;
}

function collectParts(raw: string, parts: MailPart[], depth = 0): void {
	const { head, body } = splitHead(raw);
	const headers = parseHeaders(head);
	const type = headers['content-type'] ?? 'text/plain; charset=us-ascii';
	const mediaType = type.split(';')[0].trim().toLowerCase();
	if (mediaType.startsWith('multipart/')) {
		const boundary = headerParam(type, 'boundary');
		if (!boundary || depth > 8) return;
		const chunks = body.split(new RegExp(`\\r?\\n?--${boundary.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`));
		// chunks[0] is the preamble; the chunk after the closing "--boundary--" starts with "--".
		for (const chunk of chunks.slice(1)) {
			if (chunk.startsWith('--')) break;
			collectParts(chunk.replace(/^[ \t]*\r?\n/, ''), parts, depth + 1);
		}
		return;
	}
	if (!mediaType.startsWith('text/')) return;
	const encoding = (headers['content-transfer-encoding'] ?? '7bit').toLowerCase();
	const charset = headerParam(type, 'charset') ?? 'utf-8';
	let bytes: Uint8Array;
	if (encoding === 'quoted-printable') bytes = decodeQuotedPrintable(body);
	else if (encoding === 'base64') bytes = Uint8Array.from(atob(body.replace(/\s+/g, '')), (ch) => ch.charCodeAt(0));
	else bytes = binaryToBytes(body);
	parts.push({ contentType: mediaType, body: decodeBytes(bytes, charset) });
}

/** Parses a raw message. Pass the file's bytes (or a string holding one byte per character). */
export function parseMail(raw: Uint8Array | string): ParsedMail {
	const binary = typeof raw === 'string' ? raw : Array.from(raw, (b) => String.fromCharCode(b)).join('');
	const headers = parseHeaders(splitHead(binary).head);
	for (const k of Object.keys(headers)) headers[k] = decodeEncodedWords(headers[k]);
	const parts: MailPart[] = [];
	collectParts(binary, parts);
	return {
		headers,
		subject: headers.subject ?? '',
		from: headers.from ?? '',
		to: headers.to ?? '',
		date: headers.date ?? '',
		text: parts.find((p) => p.contentType === 'text/plain')?.body ?? null,
		html: parts.find((p) => p.contentType === 'text/html')?.body ?? null,
		parts
	};
}

/** The http(s) links in a text, in order, without trailing punctuation. */
export function extractLinks(text: string): string[] {
	return [...text.matchAll(/https?:\/\/[^\s<>"']+/g)].map((m) => m[0].replace(/[).,;:!?]+$/, ''));
}
