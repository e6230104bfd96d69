import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { startPolling } from '../../../src/lib/components/bench/poll';

/** A document whose visibility the test sets. */
function fakeDoc(state: 'visible' | 'hidden' = 'visible') {
	const listeners = new Set<() => void>();
	return {
		visibilityState: state as string,
		addEventListener: (_: string, f: () => void) => void listeners.add(f),
		removeEventListener: (_: string, f: () => void) => void listeners.delete(f),
		set(s: 'visible' | 'hidden') {
			this.visibilityState = s;
			for (const f of listeners) f();
		},
		listeners
	};
}

/** A server that answers 304 to the version it holds, else the snapshot. */
function fakeServer() {
	const server = { version: 'v1', calls: 0, status: 200 };
	const fetchFn = vi.fn(async (_url: string, init?: RequestInit) => {
		server.calls++;
		if (server.status !== 200) return new Response(null, { status: server.status });
		const tag = (init?.headers as Record<string, string>)['if-none-match'];
		if (tag === `"${server.version}"`) return new Response(null, { status: 304 });
		return new Response(JSON.stringify({ version: server.version }), { status: 200 });
	});
	return { server, fetchFn };
}

beforeEach(() => vi.useFakeTimers());
afterEach(() => vi.useRealTimers());

describe('startPolling', () => {
	it('asks every 5 s while visible and hands over a snapshot only when its version changed', async () => {
		const doc = fakeDoc();
		const { server, fetchFn } = fakeServer();
		let current = 'v1';
		const changes: string[] = [];
		const stop = startPolling<{ version: string }>({ url: '/x', current: () => current, onchange: (s) => changes.push((current = s.version)), fetch: fetchFn as unknown as typeof fetch, doc });
		await vi.advanceTimersByTimeAsync(4999);
		expect(server.calls).toBe(0);
		await vi.advanceTimersByTimeAsync(1);
		expect(server.calls).toBe(1);
		expect(changes).toEqual([]);
		server.version = 'v2';
		await vi.advanceTimersByTimeAsync(5000);
		expect(changes).toEqual(['v2']);
		await vi.advanceTimersByTimeAsync(5000);
		expect(changes).toEqual(['v2']);
		stop();
		await vi.advanceTimersByTimeAsync(20_000);
		expect(server.calls).toBe(3);
		expect(doc.listeners.size).toBe(0);
	});

	it('pauses while hidden and asks at once on coming back', async () => {
		const doc = fakeDoc();
		const { server, fetchFn } = fakeServer();
		const stop = startPolling<{ version: string }>({ url: '/x', current: () => 'v1', onchange: () => {}, fetch: fetchFn as unknown as typeof fetch, doc });
		doc.set('hidden');
		await vi.advanceTimersByTimeAsync(60_000);
		expect(server.calls).toBe(0);
		doc.set('visible');
		await vi.advanceTimersByTimeAsync(0);
		expect(server.calls).toBe(1);
		await vi.advanceTimersByTimeAsync(5000);
		expect(server.calls).toBe(2);
		stop();
	});

	it('says so when the server fails or is unreachable, and keeps trying', async () => {
		const doc = fakeDoc();
		const { server, fetchFn } = fakeServer();
		const errors: string[] = [];
		server.status = 500;
		const stop = startPolling<{ version: string }>({ url: '/x', current: () => 'v1', onchange: () => {}, onerror: (m) => errors.push(m), fetch: fetchFn as unknown as typeof fetch, doc });
		await vi.advanceTimersByTimeAsync(5000);
		expect(errors[0]).toMatch(/500/);
		fetchFn.mockRejectedValueOnce(new TypeError('network'));
		await vi.advanceTimersByTimeAsync(5000);
		expect(errors[1]).toMatch(/no connection/);
		await vi.advanceTimersByTimeAsync(5000);
		expect(fetchFn).toHaveBeenCalledTimes(3);
		expect(errors).toHaveLength(3);
		stop();
	});
});
