/**
 * Seeds the invented demo: accounts for every role and the demo project. Idempotent (`npm start` runs
 * it on every start). Prints the demo sign-ins on stdout, which start.sh shows to the user.
 *
 *   node --import tsx scripts/seed.ts        (DB_* from the environment, as for the app)
 *
 * To seed more (shoot days, setups, lights, readings), add a step in scripts/seed/ taking the
 * SeedContext and list it in STEPS after the project.
 */
import { closeDb } from '../src/lib/server/db';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedAccounts } from './seed/accounts';
import type { SeedContext } from './seed/context';
import { seedDemoProject } from './seed/project';
import { seedLightingLog } from './seed/log';

const STEPS: ReadonlyArray<readonly [string, (ctx: SeedContext) => Promise<void>]> = [
	['demo accounts', seedAccounts],
	['demo project', seedDemoProject],
	['demo lighting log', seedLightingLog]
];

function signInLines(): string[] {
	const width = Math.max(...DEMO_ACCOUNTS.map((a) => a.label.length));
	const emailWidth = Math.max(...DEMO_ACCOUNTS.map((a) => a.email.length));
	return [
		'Demo sign-ins (invented, demo only):',
		...DEMO_ACCOUNTS.map((a) => `  ${a.label.padEnd(width)}  ${a.email.padEnd(emailWidth)}  ${DEMO_PASSWORD}`)
	];
}

async function main(): Promise<void> {
	const ctx: SeedContext = { users: {} };
	for (const [name, step] of STEPS) {
		try {
			await step(ctx);
		} catch (e) {
			throw new Error(`seed step "${name}" failed: ${e instanceof Error ? e.message : String(e)}`, { cause: e });
		}
	}
	console.log(signInLines().join('\n'));
}

main()
	.catch((e) => {
		console.error(e instanceof Error ? e.message : e);
		process.exitCode = 1;
	})
	.finally(() => closeDb());
