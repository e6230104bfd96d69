/**
 * `npm run bench`: runs every benchmark module in scripts/bench/ and prints its figures.
 * `npm run --silent bench -- --json` prints one JSON object of all figures instead.
 * `npm run bench -- colour` runs only the modules whose file name contains "colour".
 *
 * A module exports `title` (a sentence) and `run()`, which resolves to
 * `{ key: { value, unit, label } }`. Keys are stable so figures can be tracked over time.
 */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

export interface Figure {
	value: number;
	unit: string;
	label: string;
}
export interface BenchModule {
	title: string;
	run(): Promise<Record<string, Figure>>;
}

const args = process.argv.slice(2);
const asJson = args.includes('--json');
const filters = args.filter((a) => !a.startsWith('--'));
const here = join(dirname(fileURLToPath(import.meta.url)), 'bench');
const files = readdirSync(here)
	.filter((f) => f.endsWith('.ts') && !f.startsWith('_'))
	.filter((f) => filters.length === 0 || filters.some((q) => f.includes(q)))
	.sort();

const all: Record<string, number> = {};
for (const file of files) {
	const mod = (await import(pathToFileURL(join(here, file)).href)) as BenchModule;
	if (!asJson) console.log(`\n${mod.title}`);
	const figures = await mod.run();
	for (const [key, f] of Object.entries(figures)) {
		all[key] = f.value;
		if (!asJson) console.log(`  ${f.label.padEnd(58)} ${formatNumber(f.value).padStart(14)} ${f.unit.padEnd(6)} ${key}`);
	}
}
if (asJson) console.log(JSON.stringify(all));

function formatNumber(v: number): string {
	if (!Number.isFinite(v)) return String(v);
	return Math.abs(v) >= 1000 ? Math.round(v).toLocaleString('en-GB') : v.toPrecision(4);
}
process.exit(0);
