/**
 * What the seed steps share. Each step in `scripts/seed/` takes the context, adds what it made, and
 * returns. Steps must be idempotent: `npm start` runs the seed on every start.
 */
import type { Project } from '../../src/lib/server/db/projects';
import type { User } from '../../src/lib/server/db/users';
import type { DemoKey } from './accounts';

export interface SeedContext {
	/** The demo people by key: owner, dp, gaffer, colorist, viewer, admin. */
	users: Partial<Record<DemoKey, User>>;
	/** The demo project, once `seedDemoProject` ran. */
	project?: Project;
}

export function need<T>(value: T | undefined, what: string): T {
	if (value === undefined) throw new Error(`seed: ${what} is missing; run its step first`);
	return value;
}
