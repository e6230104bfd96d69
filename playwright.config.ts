import { defineConfig } from '@playwright/test';

const port = Number(process.env.TEST_APP_PORT ?? 3100);

// Debian's Chromium, never a downloaded browser; flags keep it off the (closed) network.
export default defineConfig({
	testDir: 'tests/e2e',
	outputDir: `${process.env.TEST_RESULTS_DIR ?? '.data/test-results'}/playwright-artifacts`,
	fullyParallel: false,
	workers: 1,
	retries: 0,
	timeout: 30_000,
	use: {
		baseURL: `http://127.0.0.1:${port}`,
		browserName: 'chromium',
		launchOptions: {
			executablePath: '/usr/bin/chromium',
			args: [
				'--headless',
				'--no-sandbox',
				'--disable-gpu',
				'--disable-quic',
				'--no-first-run',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync'
			]
		}
	},
	webServer: {
		command: 'node build',
		url: `http://127.0.0.1:${port}/api/health`,
		reuseExistingServer: false,
		timeout: 60_000,
		env: { ...(process.env as Record<string, string>), HOST: '127.0.0.1', PORT: String(port), BODY_SIZE_LIMIT: '25M' }
	}
});
