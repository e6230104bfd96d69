/**
 * Connection settings for MariaDB, read from the environment.
 *
 * Shared by `knexfile.ts` (the migration CLI) and the app's single Knex instance, so both talk to
 * the same database. `scripts/start.sh` and `scripts/test.sh` export these variables; the
 * defaults match `npm start`'s private instance.
 */
import type { Knex } from 'knex';

export function databaseConfig(env: NodeJS.ProcessEnv = process.env): Knex.Config {
	return {
		client: 'mysql2',
		connection: {
			host: env.DB_HOST ?? '127.0.0.1',
			port: Number(env.DB_PORT ?? 3307),
			user: env.DB_USER ?? 'chromaslate',
			password: env.DB_PASSWORD ?? '',
			database: env.DB_NAME ?? 'chromaslate',
			charset: 'utf8mb4',
			// Keep DATETIME values in UTC both ways.
			timezone: 'Z',
			// BIGINT and DECIMAL come back as numbers where they fit; LONGBLOB as Buffer.
			supportBigNumbers: true,
			decimalNumbers: true
		},
		pool: { min: 0, max: Number(env.DB_POOL_MAX ?? 10) },
		migrations: {
			directory: './migrations',
			extension: 'ts',
			loadExtensions: ['.ts'],
			tableName: 'knex_migrations'
		}
	};
}
