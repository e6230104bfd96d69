/**
 * Chart rendering time in Chromium: how long ChromaticityChart takes from receiving its readings to
 * the frame after first paint, for 5,000 readings (drawn on the canvas layer) and 500 (SVG marks,
 * each focusable). Starts `vite dev` on port 5199 (or uses CHART_BENCH_URL), opens the dev-only page
 * /dev/chart-bench in /usr/bin/chromium, and takes the median over fresh page loads ("first":
 * cold caches and code) and re-renders in the same page ("again").
 *
 * Figures are wall-clock on a shared machine: the load average is reported beside them. The
 * components run as `vite dev` compiles them (Svelte's development build, which adds checks), so a
 * production build is faster than these figures.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { loadavg } from 'node:os';
import { chromium, type Page } from 'playwright-core';

export const title = 'Chromaticity chart: render time in Chromium (vite dev, development build of the components)';

const PORT = 5199;
const RUNS = 7;

interface Bench {
	render(seed: number): Promise<number>;
	clear(): Promise<void>;
}

async function waitFor(url: string, ms: number): Promise<void> {
	const until = Date.now() + ms;
	for (;;) {
		try {
			const res = await fetch(url);
			if (res.ok) return;
		} catch {
			/* not up yet */
		}
		if (Date.now() > until) throw new Error(`${url} did not answer within ${ms / 1000} s`);
		await new Promise((r) => setTimeout(r, 500));
	}
}

const median = (v: number[]) => {
	const s = [...v].sort((a, b) => a - b);
	return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

async function measure(page: Page, base: string, n: number): Promise<{ first: number; again: number }> {
	const first: number[] = [];
	const again: number[] = [];
	// One warm-up load so the dev server has compiled every module.
	for (let run = -1, retries = 0; run < RUNS; run++) {
		let times: number[];
		try {
			await page.goto(`${base}/dev/chart-bench?n=${n}`, { waitUntil: 'load', timeout: 120_000 });
			await page.waitForFunction(() => '__chartBench' in window, null, { timeout: 60_000 });
			times = await page.evaluate(async () => {
				const b = (window as unknown as { __chartBench: Bench }).__chartBench;
				const cold = await b.render(1);
				await b.clear();
				await new Promise((r) => setTimeout(r, 50));
				const warm = await b.render(2);
				return [cold, warm];
			});
		} catch (err) {
			// The dev server reloads the page when it re-optimises dependencies: measure that run again.
			if (++retries > 5) throw err;
			run--;
			continue;
		}
		if (run >= 0) {
			first.push(times[0]);
			again.push(times[1]);
		}
	}
	return { first: median(first), again: median(again) };
}

export async function run() {
	let server: ChildProcess | null = null;
	let base = process.env.CHART_BENCH_URL;
	if (!base) {
		base = `http://127.0.0.1:${PORT}`;
		const busy = await fetch(base).then(
			() => true,
			() => false
		);
		if (busy) throw new Error(`port ${PORT} is in use: stop that server, or set CHART_BENCH_URL to measure against it`);
		server = spawn('npx', ['vite', 'dev', '--port', String(PORT), '--strictPort', '--host', '127.0.0.1'], { stdio: 'ignore', detached: true });
	}
	const browser = await chromium.launch({
		executablePath: '/usr/bin/chromium',
		args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync']
	});
	try {
		await waitFor(`${base}/dev/chart-bench?n=1`, 180_000);
		const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
		const load0 = loadavg()[0];
		const big = await measure(page, base, 5000);
		const small = await measure(page, base, 500);
		const load1 = loadavg()[0];
		return {
			chart_5000_points_render_ms: { value: big.first, unit: 'ms', label: '5,000 readings, first render on a fresh page (median)' },
			chart_5000_points_rerender_ms: { value: big.again, unit: 'ms', label: '5,000 readings, render again in the same page (median)' },
			chart_500_points_render_ms: { value: small.first, unit: 'ms', label: '500 readings as SVG marks, first render (median)' },
			chart_500_points_rerender_ms: { value: small.again, unit: 'ms', label: '500 readings as SVG marks, render again (median)' },
			chart_bench_load_average: { value: (load0 + load1) / 2, unit: '', label: 'machine load average (1 min) during the run' }
		};
	} finally {
		await browser.close();
		if (server?.pid) {
			try {
				process.kill(-server.pid, 'SIGTERM');
			} catch {
				/* already gone */
			}
		}
	}
}
