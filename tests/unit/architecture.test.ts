import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

// The pure folders must stay free of framework, database and server imports, and use relative
// imports only (command-line scripts run them through tsx, which has no `$lib` alias).
const PURE = ['src/lib/colour', 'src/lib/matching', 'src/lib/import', 'src/lib/settools', 'src/lib/charts'];
const FORBIDDEN = [/^svelte(\/|$)/, /^\$app\//, /^\$env\//, /^\$lib/, /^@sveltejs\/kit/, /^knex$/, /^mysql2/, /server\//];
const D3 = /^d3(-|$)/;

function files(dir: string): string[] {
	let out: string[] = [];
	let entries: string[];
	try {
		entries = readdirSync(dir);
	} catch {
		return out;
	}
	for (const e of entries) {
		const p = join(dir, e);
		if (statSync(p).isDirectory()) out = out.concat(files(p));
		else if (/\.(ts|js)$/.test(e)) out.push(p);
	}
	return out;
}

function imports(source: string): string[] {
	const found: string[] = [];
	const re = /(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|^\s*import\s+['"]([^'"]+)['"]/gm;
	for (const m of source.matchAll(re)) found.push(m[1] ?? m[2] ?? m[3]);
	return found;
}

describe('architecture', () => {
	it('keeps the pure folders free of framework, database, server and $lib imports', () => {
		const offences: string[] = [];
		for (const folder of PURE) {
			for (const file of files(folder)) {
				const typeOnly = readFileSync(file, 'utf8').replace(/^\s*import\s+type\s[^;]+;/gm, '');
				for (const spec of imports(typeOnly)) {
					const bad = FORBIDDEN.some((re) => re.test(spec)) || (D3.test(spec) && !folder.endsWith('charts'));
					if (bad) offences.push(`${relative('.', file)} imports ${spec}`);
				}
			}
		}
		expect(offences).toEqual([]);
	});

	it('finds the import statements it checks (the checker itself works)', () => {
		expect(imports("import { a } from 'svelte';\nimport x from './y';\nconst z = await import('knex');")).toEqual([
			'svelte',
			'./y',
			'knex'
		]);
	});
});
