/**
 * How the lighting log prints numbers and times, the same on the server and in the browser. Times
 * are shown in UTC (labelled), so a log reads the same in every time zone and page.
 */
export const NBSP = '\u00a0';

export function fmtCCT(k: number | null | undefined): string {
	return k == null || !Number.isFinite(k) ? '—' : `${Math.round(k).toLocaleString('en-GB')}${NBSP}K`;
}

/** Duv to four decimals with its sign: "+0.0021", "−0.0034". */
export function fmtDuv(d: number | null | undefined): string {
	if (d == null || !Number.isFinite(d)) return '—';
	const s = Math.abs(d).toFixed(4);
	return d > 0 ? `+${s}` : d < 0 && s !== '0.0000' ? `−${s}` : s;
}

export function fmtXy(x: number | null | undefined, y: number | null | undefined): string {
	return x == null || y == null ? '—' : `${x.toFixed(4)}, ${y.toFixed(4)}`;
}

export function fmtDuvPrime(d: number | null | undefined): string {
	return d == null || !Number.isFinite(d) ? '—' : d.toFixed(4);
}

/** A mired shift with sign: "+42 mired" (warmer), "−30 mired" (cooler). */
export function fmtMired(m: number | null | undefined): string {
	if (m == null || !Number.isFinite(m)) return '—';
	const r = Math.round(m);
	return `${r > 0 ? '+' : r < 0 ? '−' : ''}${Math.abs(r)}${NBSP}mired`;
}

export function fmtWatts(w: number | null | undefined): string {
	return w == null || !Number.isFinite(w) ? '—' : `${Math.round(w).toLocaleString('en-GB')}${NBSP}W`;
}

const dateFmt = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });
const timeFmt = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', timeZone: 'UTC' });

/** "Tue 1 Dec 2026" from YYYY-MM-DD. */
export function fmtDay(date: string): string {
	const d = new Date(`${date}T00:00:00Z`);
	return Number.isNaN(d.getTime()) ? date : dateFmt.format(d);
}

/** "1 Dec, 21:30 UTC". */
export function fmtTime(t: Date | string | null | undefined): string {
	if (!t) return '—';
	const d = t instanceof Date ? t : new Date(t);
	return Number.isNaN(d.getTime()) ? '—' : `${timeFmt.format(d)}${NBSP}UTC`;
}

export const ROLE_LABEL: Record<string, string> = {
	key: 'Key',
	fill: 'Fill',
	back: 'Back',
	practical: 'Practical',
	ambient: 'Ambient',
	background: 'Background',
	effect: 'Effect'
};

/** A query string from the current one with some keys changed (null removes a key; page resets unless given). */
export function withQuery(url: URL, changes: Record<string, string | number | null>): string {
	const p = new URLSearchParams(url.searchParams);
	if (!('page' in changes)) p.delete('page');
	for (const [k, v] of Object.entries(changes)) {
		if (v === null || v === '') p.delete(k);
		else p.set(k, String(v));
	}
	const s = p.toString();
	return s ? `?${s}` : url.pathname;
}
