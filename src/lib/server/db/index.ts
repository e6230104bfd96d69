/**
 * The app's one Knex instance. Import it as `import { db } from '$lib/server/db'`; table modules
 * sit beside this file, one per table or aggregate.
 */
import knex, { type Knex } from 'knex';
import { databaseConfig } from './config';

let instance: Knex | undefined;

export function getDb(): Knex {
	instance ??= knex(databaseConfig());
	return instance;
}

/** Lazily created so that importing a module never opens a connection by itself. */
export const db: Knex = new Proxy(function () {} as unknown as Knex, {
	get(_target, prop) {
		const real = getDb() as unknown as Record<PropertyKey, unknown>;
		const value = real[prop];
		return typeof value === 'function' ? (value as (...a: unknown[]) => unknown).bind(real) : value;
	},
	apply(_target, _this, args) {
		return (getDb() as unknown as (...a: unknown[]) => unknown)(...args);
	}
});

export async function closeDb(): Promise<void> {
	if (instance) {
		const old = instance;
		instance = undefined;
		await old.destroy();
	}
}
