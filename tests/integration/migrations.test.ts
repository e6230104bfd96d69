import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testKnex } from './helpers/db';

let db: Knex;
beforeAll(() => {
	db = testKnex();
});
afterAll(async () => {
	// Leave the schema migrated for the suites that follow.
	await db.migrate.latest();
	await db.destroy();
});

async function appTables(): Promise<{ name: string; engine: string; collation: string }[]> {
	const [rows] = await db.raw(
		`SELECT TABLE_NAME AS name, ENGINE AS engine, TABLE_COLLATION AS collation
		   FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND TABLE_TYPE = 'BASE TABLE'`
	);
	return rows;
}

describe('migrations', () => {
	it('run all the way down and back up', async () => {
		await db.migrate.latest();
		const [, pendingBefore] = (await db.migrate.list()) as [unknown[], unknown[]];
		expect(pendingBefore).toHaveLength(0);

		await db.migrate.rollback(undefined, true);
		const left = (await appTables()).map((t) => t.name).filter((n) => !n.startsWith('knex_migrations'));
		expect(left).toEqual([]);

		await db.migrate.latest();
		const [done, pending] = (await db.migrate.list()) as [unknown[], unknown[]];
		expect(pending).toHaveLength(0);
		expect(done.length).toBeGreaterThan(0);
	});

	it('create only InnoDB, utf8mb4 tables, each with a primary key (ready for a Galera cluster)', async () => {
		await db.migrate.latest();
		const tables = await appTables();
		expect(tables.length).toBeGreaterThan(2);
		const [withPk] = await db.raw(
			`SELECT DISTINCT TABLE_NAME AS name FROM information_schema.TABLE_CONSTRAINTS
			  WHERE TABLE_SCHEMA = DATABASE() AND CONSTRAINT_TYPE = 'PRIMARY KEY'`
		);
		const pk = new Set((withPk as { name: string }[]).map((r) => r.name));
		for (const t of tables) {
			expect(t.engine, t.name).toBe('InnoDB');
			expect(t.collation, t.name).toMatch(/^utf8mb4_/);
			expect(pk.has(t.name), `${t.name} has a primary key`).toBe(true);
		}
	});

	it('store and return text outside the Basic Multilingual Plane (utf8mb4, not utf8mb3)', async () => {
		await db('app_settings').insert({ key: 'probe', value: 'Façade 🎬 ① 照明' }).onConflict('key').merge();
		const row = await db('app_settings').where({ key: 'probe' }).first();
		expect(row.value).toBe('Façade 🎬 ① 照明');
		await db('app_settings').where({ key: 'probe' }).delete();
	});
});
