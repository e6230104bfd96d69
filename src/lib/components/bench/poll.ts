/**
 * Live updates for the bench: fetch the snapshot every few seconds while the page is visible, pause
 * when it is hidden (and fetch at once on coming back), hand over a snapshot only when its version
 * changed. The document and timers are passed in so this runs the same in tests.
 */
/** The part of `document` the poller uses. */
export interface VisibilitySource {
	readonly visibilityState: string;
	addEventListener(type: 'visibilitychange', listener: () => void): void;
	removeEventListener(type: 'visibilitychange', listener: () => void): void;
}

export interface PollOptions<T extends { version: string }> {
	url: string;
	intervalMs?: number;
	current: () => string;
	onchange: (snapshot: T) => void;
	onchecked?: (at: number) => void;
	onerror?: (message: string) => void;
	fetch?: typeof fetch;
	doc?: VisibilitySource;
}

export function startPolling<T extends { version: string }>(o: PollOptions<T>): () => void {
	const doFetch = o.fetch ?? fetch;
	const doc = o.doc ?? document;
	const interval = o.intervalMs ?? 5000;
	let timer: ReturnType<typeof setTimeout> | null = null;
	let stopped = false;
	let busy = false;

	async function tick() {
		timer = null;
		if (stopped || busy || doc.visibilityState !== 'visible') return;
		busy = true;
		try {
			const res = await doFetch(o.url, { headers: { 'if-none-match': `"${o.current()}"`, accept: 'application/json' } });
			if (res.status === 200) {
				const snap = (await res.json()) as T;
				if (snap.version !== o.current()) o.onchange(snap);
			} else if (res.status !== 304) {
				o.onerror?.(`Live updates paused: the server answered ${res.status}.`);
			}
			o.onchecked?.(Date.now());
		} catch {
			o.onerror?.('Live updates paused: no connection. Retrying.');
		} finally {
			busy = false;
			schedule();
		}
	}

	function schedule() {
		if (stopped || timer || doc.visibilityState !== 'visible') return;
		timer = setTimeout(tick, interval);
	}

	function onVisibility() {
		if (doc.visibilityState === 'visible') {
			if (timer) clearTimeout(timer);
			timer = null;
			void tick();
		} else if (timer) {
			clearTimeout(timer);
			timer = null;
		}
	}

	doc.addEventListener('visibilitychange', onVisibility);
	schedule();
	return () => {
		stopped = true;
		if (timer) clearTimeout(timer);
		doc.removeEventListener('visibilitychange', onVisibility);
	};
}
