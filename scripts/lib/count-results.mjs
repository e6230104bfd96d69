// Sums the suites' JSON results and prints `N passed, N failed` as the last line; exits 1 on any
// failure. A suite whose result file is missing (it crashed before reporting) counts as one failure.
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';

const [dir, ...expected] = process.argv.slice(2);
let passed = 0;
let failed = 0;
const lines = [];
const files = new Set([...expected, ...readdirSync(dir).filter((f) => f.endsWith('.json'))]);
for (const file of files) {
	const path = join(dir, file);
	if (!existsSync(path)) {
		failed += 1;
		lines.push(`${file}: no result (the suite did not run to the end)`);
		continue;
	}
	const r = JSON.parse(readFileSync(path, 'utf8'));
	let p = 0;
	let f = 0;
	if ('numPassedTests' in r) {
		// Vitest: a file that fails to load has no tests but a failed suite.
		p = r.numPassedTests;
		f = r.numFailedTests + (r.numFailedTestSuites && !r.numFailedTests ? r.numFailedTestSuites : 0);
		if (r.numTotalTests === 0 && r.success === false) f += 1;
	} else if (r.stats && 'expected' in r.stats) {
		// Playwright: flaky tests passed on retry, which still counts as passed.
		p = r.stats.expected + r.stats.flaky;
		f = r.stats.unexpected + (r.errors?.length && !r.stats.unexpected ? r.errors.length : 0);
	} else {
		p = r.passed ?? 0;
		f = r.failed ?? 0;
	}
	passed += p;
	failed += f;
	lines.push(`${file}: ${p} passed, ${f} failed`);
}
console.log('\n' + lines.join('\n'));
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
